// GET /api/findings/:id/history: every version of a finding, deletions included
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { listFindingHistory } from "@/lib/findings/list-finding-history";

type P = { id: string };

export const GET = withOrg<P>({ permission: "findings.read" }, async ({ params, member }) => {
  const id = idParam(params.id, "Finding not found");
  await requireInScope(member, "finding", id, "Finding not found");
  return ok(await listFindingHistory(member.organisationId, id));
}
);
