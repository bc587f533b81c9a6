// Starts a new report version for a job: the next version number (job row locked, so two requests
// cannot take the same number), a queued row, then the build job once the row is committed.
// One build at a time per job: a second request while one is queued or building is refused, unless
// that build has shown no sign of life for longer than the queue would ever keep trying it (its worker
// died for good): then it is marked failed and the new version goes ahead.
import "server-only";
import { and, eq, inArray, max } from "drizzle-orm";
import { db } from "@/db/client";
import { jobs, reports } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { enqueue, JOB_SETTINGS } from "@/lib/queue/jobs";
import { loadReportView, type ReportView } from "./report-view";

const { attempts, timeoutMs, backoffMs } = JOB_SETTINGS["build-report"];
// every attempt at its time limit, the backoff between them, and a margin for a queue that was busy
const ABANDONED_AFTER_MS = attempts * timeoutMs + attempts * backoffMs * 4 + 15 * 60_000;

export async function requestReportBuild(organisationId: string, jobId: string, userId: string): Promise<ReportView> {
  const reportId = await db().transaction(async (tx) => {
    const [job] = await tx.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.id, jobId), eq(jobs.organisationId, organisationId))).for("update");
    if (!job) throw notFound("Job not found");
    const busy = await tx
      .select({ id: reports.id, version: reports.version, updatedAt: reports.updatedAt })
      .from(reports)
      .where(and(eq(reports.jobId, jobId), eq(reports.organisationId, organisationId), inArray(reports.state, ["queued", "building"])));
    const abandonedBefore = Date.now() - ABANDONED_AFTER_MS;
    for (const b of busy) {
      if (b.updatedAt.getTime() > abandonedBefore) throw new ApiError("conflict", `Version ${b.version} of this report is still being built; wait for it to finish`);
      await tx
        .update(reports)
        .set({ state: "failed", failureReason: "The build stopped without finishing (no progress for too long); a newer version was requested", updatedAt: new Date() })
        .where(eq(reports.id, b.id));
    }
    const [{ last }] = await tx.select({ last: max(reports.version) }).from(reports).where(eq(reports.jobId, jobId));
    const [row] = await tx
      .insert(reports)
      .values({ organisationId, jobId, version: (last ?? 0) + 1, state: "queued", progress: 0, createdBy: userId })
      .returning({ id: reports.id });
    return row.id;
  });
  try {
    await enqueue("build-report", { reportId });
  } catch (err) {
    await db()
      .update(reports)
      .set({ state: "failed", failureReason: "The build could not be queued (the job queue is unavailable); build again in a moment", updatedAt: new Date() })
      .where(eq(reports.id, reportId));
    console.warn(`[cairn] could not queue report ${reportId}:`, (err as Error).message);
  }
  return (await loadReportView(organisationId, reportId))!;
}
