// Validation of a signed-in person's password change.
import { z } from "zod";
import { password } from "./members";

export const passwordChangeInput = z
  .object({ currentPassword: z.string().min(1, "Required").max(200), newPassword: password })
  .strict();
