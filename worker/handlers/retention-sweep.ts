// Job "retention-sweep" (repeatable, scheduled by the worker hourly): sends the disposal reminders that
// have come due and removes evidence packages past their keep date (lib/retention/run-retention-sweep.ts).
import type { JobPayloads } from "@/lib/queue/jobs";
import type { JobContext } from "./job-context";
import { runRetentionSweep } from "@/lib/retention/run-retention-sweep";

export async function retentionSweep(_data: JobPayloads["retention-sweep"], ctx: JobContext = {}): Promise<void> {
  if (ctx.signal?.aborted) return;
  const { reminders, expiredPackages } = await runRetentionSweep();
  if (reminders || expiredPackages) console.log(`[worker] retention-sweep ${ctx.queueJobId}: ${reminders} reminder(s) sent, ${expiredPackages} package(s) expired`);
}
