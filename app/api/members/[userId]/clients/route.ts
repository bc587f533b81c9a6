// GET /api/members/:userId/clients: the clients a client account is tied to; PUT { clientIds }: set
// them (owner only). A client account sees only those clients' jobs (lib/auth/client-scope.ts).
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { notFound } from "@/lib/api/errors";
import { memberClientsInput } from "@/lib/validation/members";
import { memberClientsOf, setMemberClients } from "@/lib/members/member-clients";

type P = { userId: string };
const NOT_FOUND = "Member not found";

export const GET = withOrg<P>({ permission: "members.manage" }, async ({ params, member }) => {
  const userId = idParam(params.userId, NOT_FOUND);
  const all = await memberClientsOf(member.organisationId);
  if (!all[userId]) {
    // a member with no ties, or no such member
    const { isMemberOf } = await import("@/lib/auth/organisations-of-user");
    if (!(await isMemberOf(userId, member.organisationId))) throw notFound(NOT_FOUND);
  }
  return ok({ userId, clientIds: all[userId] ?? [] });
});

export const PUT = withOrg<P>({ permission: "members.manage" }, async ({ req, params, member }) => {
  const userId = idParam(params.userId, NOT_FOUND);
  const { clientIds } = await readJson(req, memberClientsInput);
  return ok(await setMemberClients(member.organisationId, userId, clientIds));
});
