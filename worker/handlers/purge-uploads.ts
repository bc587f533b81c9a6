// Job "purge-uploads" (repeatable, scheduled by the worker): the clean-up of the upload path. The
// purge itself belongs to ingest (lib/uploads/purge-abandoned-uploads.ts); this handler runs it.
import type { JobPayloads } from "@/lib/queue/jobs";
import type { JobContext } from "./job-context";
import { purgeAbandonedUploads } from "@/lib/uploads/purge-abandoned-uploads";

export async function purgeUploads(_data: JobPayloads["purge-uploads"], ctx: JobContext = {}): Promise<void> {
  if (ctx.signal?.aborted) return;
  const report = await purgeAbandonedUploads();
  const touched = Object.values(report).reduce((a, b) => a + b, 0);
  if (touched > 0) console.log(`[worker] purge-uploads ${ctx.queueJobId}: ${JSON.stringify(report)}`);
}
