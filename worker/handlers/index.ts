// The handler of every job type. The mapped type makes the table exhaustive: a job name without a
// handler (or with a handler for the wrong payload) does not compile. Each handler receives the
// job and an AbortSignal that fires on timeout or shutdown; it reloads its rows and rethrows
// failures so BullMQ retries (UnrecoverableError when a retry cannot help).
import type { Job } from "bullmq";
import type { JobName, JobPayloads } from "@/lib/queue/jobs";
import { processRecordingJob } from "./process-recording";
import { extractStill } from "./extract-still";
import { buildReport } from "./build-report";
import { purgeUploadsJob } from "./purge-uploads";
import { custodyCheckpointsJob } from "./custody-checkpoints";

export type JobHandler<N extends JobName> = (job: Job<JobPayloads[N]>, signal: AbortSignal) => Promise<void>;
export type JobHandlers = { [N in JobName]: JobHandler<N> };

// Progress lives in Redis and is only shown: a Redis that is away for a moment must not fail the work
// (the handler would mark its row failed, and a Redis that lost its data has lost the retry too).
const progressOf = (job: Job) => (percent: number) =>
  job.updateProgress(Math.min(100, Math.max(0, Math.round(percent)))).catch(() => {});

export const handlers: JobHandlers = {
  "process-recording": processRecordingJob,
  "extract-still": async (job, signal) => {
    await extractStill(job.data, { signal, progress: progressOf(job) });
  },
  "build-report": async (job, signal) => {
    await buildReport(job.data, { signal, progress: progressOf(job) });
  },
  "purge-uploads": purgeUploadsJob,
  "custody-checkpoints": custodyCheckpointsJob,
};
