import { z } from "zod";

export const ROLES = ["owner", "pilot", "reviewer", "client"] as const;
export const inviteInput = z.object({ email: z.string().trim().toLowerCase().email("Not an e-mail address").max(320), role: z.enum(ROLES) });
export const roleChangeInput = z.object({ role: z.enum(ROLES) });
export const acceptInviteInput = z.object({
  token: z.string().min(20).max(200),
  name: z.string().trim().min(1, "Required").max(120),
  password: z.string().min(12, "At least 12 characters").max(200),
});
