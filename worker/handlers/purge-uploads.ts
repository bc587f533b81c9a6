// Job "purge-uploads" (repeatable, scheduled by the worker): the clean-up of the upload path. The
// purge itself belongs to ingest (lib/ingest/purge-abandoned-uploads.ts); this handler runs it.
import type { Job } from "bullmq";
import type { JobPayloads } from "@/lib/queue/jobs";
import { purgeAbandonedUploads } from "@/lib/ingest/purge-abandoned-uploads";

export async function purgeUploadsJob(job: Job<JobPayloads["purge-uploads"]>, signal: AbortSignal): Promise<void> {
  if (signal.aborted) return;
  const report = await purgeAbandonedUploads();
  const touched = Object.values(report).reduce((a, b) => a + b, 0);
  if (touched > 0) console.log(`[worker] purge-uploads ${job.id}: ${JSON.stringify(report)}`);
}
