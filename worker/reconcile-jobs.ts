// PostgreSQL is the record of truth, Redis a queue of work. When Redis loses its data (restart without
// persistence, failover, FLUSHDB) the jobs go with it, but the rows still say the work is to be done:
// a recording "waiting" or "processing", a still "pending", a report version or an evidence package
// "queued" or "building".
// The reconciler compares the two and queues again every such row whose job is gone, for every job
// type that works on a row (purge-uploads, custody-checkpoints and retention-sweep are schedules, set
// again at start). It reads PostgreSQL only, never the store, so any worker on any machine can run it.
// Safe to run from several workers at once: jobs have deterministic ids, so a job is only added once.
import { and, inArray, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { evidencePackages, recordings, reports, stills } from "@/db/schema";
import { queue, jobIdFor, type JobName, type JobPayloads } from "@/lib/queue/jobs";
import { ensureQueued } from "@/lib/queue/ensure-queued";

// A job that failed or completed this recently may still be on its way to Postgres (the worker's
// 'failed' event writes the state after BullMQ moved the job): leave it alone.
const SETTLING_MS = 60_000; // 1 min

type RowJob = "process-recording" | "extract-still" | "build-report" | "build-evidence-package";

async function requeueMissing<N extends RowJob>(name: N, payloads: JobPayloads[N][], now: number): Promise<string[]> {
  const q = queue(name as JobName);
  const requeued: string[] = [];
  for (const data of payloads) {
    const job = await q.getJob(jobIdFor(name, data));
    if (job) {
      const state = await job.getState();
      if (state !== "completed" && state !== "failed" && state !== "unknown") continue;
      if (job.finishedOn && now - job.finishedOn < SETTLING_MS) continue;
    }
    await ensureQueued(name, data);
    requeued.push(Object.values(data as Record<string, string>)[0]);
  }
  return requeued;
}

export type ReconcileResult = { checked: number; requeued: { recordings: string[]; stills: string[]; reports: string[]; evidencePackages: string[] } };

/** `only`: the job types this worker serves (default all of them). */
export async function reconcileJobs(options: { now?: number; only?: readonly JobName[] } = {}): Promise<ReconcileResult> {
  const now = options.now ?? Date.now();
  const serves = (n: RowJob) => !options.only || options.only.includes(n);
  const recs = serves("process-recording")
    ? await db()
        .select({ id: recordings.id })
        .from(recordings)
        .where(and(inArray(recordings.state, ["waiting", "processing"]), isNull(recordings.deletedAt)))
    : [];
  const pendingStills = serves("extract-still") ? await db().select({ id: stills.id }).from(stills).where(inArray(stills.state, ["pending"])) : [];
  const openReports = serves("build-report") ? await db().select({ id: reports.id }).from(reports).where(inArray(reports.state, ["queued", "building"])) : [];
  const openPackages = serves("build-evidence-package")
    ? await db().select({ id: evidencePackages.id }).from(evidencePackages).where(inArray(evidencePackages.state, ["queued", "building"]))
    : [];
  return {
    checked: recs.length + pendingStills.length + openReports.length + openPackages.length,
    requeued: {
      recordings: await requeueMissing("process-recording", recs.map((r) => ({ recordingId: r.id })), now),
      stills: await requeueMissing("extract-still", pendingStills.map((r) => ({ stillId: r.id })), now),
      reports: await requeueMissing("build-report", openReports.map((r) => ({ reportId: r.id })), now),
      evidencePackages: await requeueMissing("build-evidence-package", openPackages.map((r) => ({ packageId: r.id })), now),
    },
  };
}
