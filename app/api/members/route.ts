// GET /api/members: the organisation's members (?role=pilot,owner ?q=); e-mail addresses only for those who manage members
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { can } from "@/lib/auth/permissions";
import { memberListQuery } from "@/lib/validation/list-filters";
import { listMembers } from "@/lib/work/members";

export const GET = withOrg({ permission: "workspace.read" }, async ({ req, member }) => {
  const { role, ...params } = parseQuery(req, memberListQuery);
  return ok(await listMembers(member.organisationId, { ...params, roles: role }, { withEmail: can(member.role, "members.manage") }));
});
