// GET /api/reports?jobId=: the job's report versions, newest first; POST /api/reports {jobId}: build a new version
import { reportScopeCondition } from "@/lib/auth/client-scope";
import { reportBuildInput, reportsQuery } from "@/lib/reports/report-input";
import { and, eq } from "drizzle-orm";
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { reports } from "@/db/schema";
import { loadReportViews } from "@/lib/reports/report-view";
import { requestReportBuild } from "@/lib/reports/request-report-build";


export const GET = withOrg({ permission: "findings.read" }, async ({ req, member }) => {
  const { jobId } = parseQuery(req, reportsQuery);
  // a client account sees only approved versions of its own jobs
  const items = await loadReportViews(member.organisationId, and(eq(reports.jobId, jobId), reportScopeCondition(member))!);
  return ok({ items, total: items.length });
});

export const POST = withOrg({ permission: "reports.build" }, async ({ req, member }) => {
  const { jobId } = await readJson(req, reportBuildInput);
  return created(await requestReportBuild(member.organisationId, jobId, member.userId));
});
