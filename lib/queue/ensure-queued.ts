// Puts a job in the queue unless the same job (same deterministic id) is already waiting, delayed or
// running. enqueue() alone is not enough to run a job again: BullMQ ignores an add whose jobId still
// exists, and finished jobs are kept for a day. So a finished (completed or failed) job of that id is
// removed first. Used by re-processing and by the reconciler that rebuilds the queue from Postgres.
import type { JobsOptions } from "bullmq";
import { enqueue, jobIdFor, queue, type JobName, type JobPayloads } from "./jobs";

export type EnsureQueuedOutcome = "added" | "already-queued" | "replaced-finished";

export async function ensureQueued<N extends JobName>(name: N, data: JobPayloads[N], extra: JobsOptions = {}): Promise<EnsureQueuedOutcome> {
  const q = queue(name);
  const jobId = extra.jobId ?? jobIdFor(name, data);
  const existing = await q.getJob(jobId);
  let outcome: EnsureQueuedOutcome = "added";
  if (existing) {
    const state = await existing.getState();
    if (state !== "completed" && state !== "failed" && state !== "unknown") return "already-queued";
    // A job that is finished holds no lock, so removing it cannot race a worker.
    await existing.remove().catch(() => {});
    outcome = "replaced-finished";
  }
  await enqueue(name, data, { ...extra, jobId });
  return outcome;
}

