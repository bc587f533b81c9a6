// Job "custody-checkpoints" (repeatable, scheduled by the worker every CUSTODY_CHECKPOINT_EVERY_MS):
// signs and time-stamps the chain head of every organisation whose custody log grew since its last
// checkpoint (lib/custody/make-checkpoint.ts). An organisation that could not be stamped (the
// authority unreachable) fails the job, so BullMQ retries it; the others keep their new checkpoint.
import type { JobPayloads } from "@/lib/queue/jobs";
import type { JobContext } from "./job-context";
import { makeDueCheckpoints } from "@/lib/custody/make-checkpoint";

export async function custodyCheckpoints(_data: JobPayloads["custody-checkpoints"], ctx: JobContext = {}): Promise<void> {
  if (ctx.signal?.aborted) return;
  const { made, failed } = await makeDueCheckpoints();
  if (made > 0) console.log(`[worker] custody-checkpoints ${ctx.queueJobId}: ${made} checkpoint(s) made`);
  if (failed.length) throw new Error(`custody checkpoints failed for ${failed.length} organisation(s): ${failed[0].error}`);
}
