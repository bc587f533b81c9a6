// POST /api/users/me/password: the signed-in person changes their password; their other sessions end.
import { withOrg, readJson, ok } from "@/lib/api/with-org";
import { changePassword } from "@/lib/auth/change-password";
import { passwordChangeInput } from "@/lib/validation/password-change";

// every member may change their own password, whatever their role
export const POST = withOrg({ permission: "workspace.read" }, async ({ req, member }) => {
  const { currentPassword, newPassword } = await readJson(req, passwordChangeInput);
  return ok(await changePassword(member.userId, member.sessionId, currentPassword, newPassword));
});
