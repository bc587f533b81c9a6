// GET /api/members: the organisation's members (?role=pilot,owner ?q=); e-mail addresses only for those who manage members
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { can } from "@/lib/auth/permissions";
import { memberListQuery } from "@/lib/validation/list-filters";
import { listMembers } from "@/lib/members/members";
import { isClientScoped } from "@/lib/auth/client-scope";
import type { Role } from "@/db/schema/types";

const CREW: Role[] = ["owner", "pilot", "reviewer"];

export const GET = withOrg({ permission: "workspace.read" }, async ({ req, member }) => {
  const { role, ...params } = parseQuery(req, memberListQuery);
  // a client account sees the crew, never other client accounts (other customers' people)
  const roles = isClientScoped(member) ? (role?.length ? role : CREW).filter((r) => CREW.includes(r)) : role;
  if (roles?.length === 0) return ok({ items: [], total: 0 });
  return ok(await listMembers(member.organisationId, { ...params, roles }, { withEmail: can(member.role, "members.manage") }));
});
