// GET /api/invitations: pending invitations; POST /api/invitations: invite a person by e-mail with a role
import { withOrg, readJson, created, ok } from "@/lib/api/with-org";
import { inviteInput } from "@/lib/validation/members";
import { createInvitation } from "@/lib/members/create-invitation";
import { listInvitations } from "@/lib/members/invitations";

export const GET = withOrg({ permission: "members.manage" }, async ({ member }) => ok(await listInvitations(member.organisationId)));

export const POST = withOrg({ permission: "members.manage" }, async ({ req, member }) =>
  created(await createInvitation(member, await readJson(req, inviteInput))),
);
