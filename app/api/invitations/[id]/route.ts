// DELETE /api/invitations/:id: withdraw a pending invitation (its link stops working)
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { revokeInvitation } from "@/lib/members/invitations";

type P = { id: string };

export const DELETE = withOrg<P>({ permission: "members.manage" }, async ({ params, member }) =>
  ok(await revokeInvitation(member.organisationId, idParam(params.id, "Invitation not found"))),
);
