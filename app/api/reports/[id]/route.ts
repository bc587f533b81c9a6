// GET /api/reports/:id: one report version with its build state and progress
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { notFound } from "@/lib/api/errors";
import { loadReportView } from "@/lib/reports/report-view";

type P = { id: string };

export const GET = withOrg<P>({ permission: "findings.read" }, async ({ params, member }) => {
  const view = await loadReportView(member.organisationId, idParam(params.id, "Report not found"));
  if (!view) throw notFound("Report not found");
  return ok(view);
});
