// The handler of every job type. The mapped type makes the table exhaustive: a job name without a
// handler (or with a handler for the wrong payload) does not compile. Every handler has one signature,
// (data, ctx: JobContext): the payload, and an AbortSignal that fires on timeout or shutdown, progress,
// the queue job's id and attempt (worker/handlers/job-context.ts); it reloads its rows and rethrows
// failures so BullMQ retries (UnrecoverableError when a retry cannot help).
import type { Job } from "bullmq";
import type { JobName, JobPayloads } from "@/lib/queue/jobs";
import { jobContext, type JobContext } from "./job-context";
import { processRecording } from "./process-recording";
import { extractStill } from "./extract-still";
import { buildReport } from "./build-report";
import { purgeUploads } from "./purge-uploads";
import { custodyCheckpoints } from "./custody-checkpoints";
import { buildEvidencePackage } from "./build-evidence-package";
import { retentionSweep } from "./retention-sweep";

export type JobHandler<N extends JobName> = (data: JobPayloads[N], ctx: JobContext) => Promise<unknown>;
export type JobRunner<N extends JobName> = (job: Job<JobPayloads[N]>, signal: AbortSignal) => Promise<void>;
export type JobHandlers = { [N in JobName]: JobRunner<N> };

/** What the worker runs for a BullMQ job: the handler, with its context filled from the job. */
function run<N extends JobName>(handler: JobHandler<N>): JobRunner<N> {
  return async (job, signal) => {
    await handler(job.data, jobContext(job, signal));
  };
}

export const handlers: JobHandlers = {
  "process-recording": run(processRecording),
  "extract-still": run(extractStill),
  "build-report": run(buildReport),
  "purge-uploads": run(purgeUploads),
  "custody-checkpoints": run(custodyCheckpoints),
  "build-evidence-package": run(buildEvidencePackage),
  "retention-sweep": run(retentionSweep),
};
