// PATCH /api/members/:userId: change a member's role; DELETE: remove them from the organisation.
// The last owner can be neither demoted nor removed (409).
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { roleChangeInput } from "@/lib/validation/members";
import { changeMemberRole, removeMember } from "@/lib/members/members";

type P = { userId: string };
const NOT_FOUND = "Member not found";

export const PATCH = withOrg<P>({ permission: "members.manage" }, async ({ req, params, member }) => {
  const userId = idParam(params.userId, NOT_FOUND);
  const { role } = await readJson(req, roleChangeInput);
  return ok(await changeMemberRole(member.organisationId, userId, role));
});

export const DELETE = withOrg<P>({ permission: "members.manage" }, async ({ params, member }) =>
  ok(await removeMember(member.organisationId, idParam(params.userId, NOT_FOUND))),
);
