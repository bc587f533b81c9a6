// What every job handler receives besides its payload: handlers have one signature,
// (data: JobPayloads[name], ctx: JobContext). The worker fills the context from the BullMQ job
// (worker/handlers/index.ts); a direct call (a test, a script) may leave any of it out.
import type { Job } from "bullmq";

export type JobContext = {
  /** Fires on the job's timeout or the worker's shutdown. */
  signal?: AbortSignal;
  /** 0..100, shown in queue tools; never fails the job. */
  progress?: (percent: number) => Promise<void> | void;
  /** The queue's id of this job, for logs and custody details. */
  queueJobId?: string | null;
  /** Which attempt this run is, from 1. */
  attempt?: number;
};

// Progress lives in Redis and is only shown: a Redis that is away for a moment must not fail the work
// (the handler would mark its row failed, and a Redis that lost its data has lost the retry too).
export function jobContext(job: Job, signal: AbortSignal): JobContext {
  return {
    signal,
    progress: (percent) => job.updateProgress(Math.min(100, Math.max(0, Math.round(percent)))).catch(() => {}),
    queueJobId: job.id ?? null,
    attempt: job.attemptsMade + 1,
  };
}
