// Validation of invitations, role changes and accepting an invitation.
import { z } from "zod";
import { name } from "./common";

export const ROLES = ["owner", "pilot", "reviewer", "client"] as const;
export const INVITATION_TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/; // 32 random bytes in base64url

/** bcrypt reads only the first 72 bytes of a password; a longer one would be silently cut. */
export const PASSWORD_MAX_BYTES = 72;
export const password = z
  .string()
  .min(12, "At least 12 characters")
  .refine((p) => new TextEncoder().encode(p).length <= PASSWORD_MAX_BYTES, `At most ${PASSWORD_MAX_BYTES} bytes (about 72 plain letters)`);

const email = z.string().trim().toLowerCase().email("Not an e-mail address").max(320, "At most 320 characters");
/** A client account's clients: the organisation's clients whose work it may see. */
export const clientIdList = z.array(z.string().uuid("Unknown client")).max(100, "At most 100 clients");
export const inviteInput = z.object({ email, role: z.enum(ROLES, { message: "Choose a role" }), clientIds: clientIdList.optional() });
export const memberClientsInput = z.object({ clientIds: clientIdList }).strict();
export const roleChangeInput = z.object({ role: z.enum(ROLES, { message: "Choose a role" }) }).strict();

export const invitationToken = z.string().regex(INVITATION_TOKEN_PATTERN, "This invitation link is not valid");
const personName = name(120);

/** A new person sends a name and password; someone who already has an account sends only the token. */
export const acceptInviteInput = z.object({
  token: invitationToken,
  name: personName.optional(),
  password: password.optional(),
});

/** The new-account form in the browser: the password typed twice. */
export const newAccountForm = z
  .object({ name: personName, password, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ" });

export type InviteInput = z.infer<typeof inviteInput>;
export type AcceptInviteInput = z.infer<typeof acceptInviteInput>;
