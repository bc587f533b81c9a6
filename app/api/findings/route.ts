// GET /api/findings?recordingId=|jobId=[&cursor=&pageSize=]: live findings of a recording or a job, paged; POST /api/findings: mark one
import { jobScopeCondition } from "@/lib/auth/client-scope";
import { and, eq } from "drizzle-orm";
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { ApiError } from "@/lib/api/errors";
import { findings, recordings } from "@/db/schema";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { createFindingInput, findingsQuery } from "@/lib/findings/finding-input";
import { createFinding } from "@/lib/findings/create-finding";
import { listFindingViews } from "@/lib/findings/finding-view";


export const GET = withOrg({ permission: "findings.read" }, async ({ req, member }) => {
  const q = parseQuery(req, findingsQuery);
  if (!q.recordingId && !q.jobId) throw new ApiError("bad_request", "Ask for the findings of a recording (recordingId) or a job (jobId)");
  // a job's findings by their recording's job: the same set, and the plan that stops after one page (lib/findings/finding-view.ts)
  const where = q.recordingId ? eq(findings.recordingId, q.recordingId) : eq(recordings.jobId, q.jobId!);
  return ok(await listFindingViews(member.organisationId, and(where, jobScopeCondition(member, findings.jobId))!, { cursor: q.cursor, pageSize: q.pageSize }));
});

export const POST = withOrg({ permission: "findings.write" }, async ({ req, member }) => {
  const input = await readJson(req, createFindingInput);
  return created(await createFinding(member.organisationId, input, { userId: member.userId, role: member.role, ...requestFacts(req) }));
});
