// GET /api/reports/:id: one report version with its build state and progress
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { notFound } from "@/lib/api/errors";
import { loadReportView } from "@/lib/reports/report-view";

type P = { id: string };

export const GET = withOrg<P>({ permission: "findings.read" }, async ({ params, member }) => {
  const id = idParam(params.id, "Report not found");
  // a client account: only approved versions of its own jobs
  await requireInScope(member, "report", id, "Report not found");
  const view = await loadReportView(member.organisationId, id);
  if (!view) throw notFound("Report not found");
  return ok(view);
});
