// POST /api/reports/:id/approve: an owner approves a built version; it becomes immutable and its PDF hash is logged
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { approveReport } from "@/lib/reports/approve-report";

type P = { id: string };

export const POST = withOrg<P>({ permission: "reports.approve" }, async ({ req, params, member }) =>
  ok(await approveReport(member.organisationId, idParam(params.id, "Report not found"), { userId: member.userId, role: member.role, ...requestFacts(req) })),
);
