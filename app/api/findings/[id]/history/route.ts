// GET /api/findings/:id/history: every version of a finding, deletions included
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { listFindingHistory } from "@/lib/findings/list-finding-history";

type P = { id: string };

export const GET = withOrg<P>({ permission: "findings.read" }, async ({ params, member }) =>
  ok(await listFindingHistory(member.organisationId, idParam(params.id, "Finding not found"))),
);
