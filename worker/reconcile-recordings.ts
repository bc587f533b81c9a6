// PostgreSQL is the record of truth, Redis a queue of work. When Redis loses its data (restart without
// persistence, failover, FLUSHDB) the jobs go with it, but the recordings still say "waiting" or
// "processing". The reconciler compares the two and queues again every recording whose job is gone.
// Safe to run from several workers at once: jobs have deterministic ids, so a job is only added once.
import { and, inArray, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { queue, jobIdFor } from "@/lib/queue/jobs";
import { ensureQueued } from "@/lib/queue/ensure-queued";

// A job that failed or completed this recently may still be on its way to Postgres (the worker's
// 'failed' event writes the state after BullMQ moved the job): leave it alone.
const SETTLING_MS = 60_000; // 1 min

export async function reconcileRecordings(now = Date.now()): Promise<{ checked: number; requeued: string[] }> {
  const rows = await db()
    .select({ id: recordings.id, state: recordings.state })
    .from(recordings)
    .where(and(inArray(recordings.state, ["waiting", "processing"]), isNull(recordings.deletedAt)));
  const q = queue("process-recording");
  const requeued: string[] = [];
  for (const row of rows) {
    const data = { recordingId: row.id };
    const job = await q.getJob(jobIdFor("process-recording", data));
    if (job) {
      const state = await job.getState();
      if (state !== "completed" && state !== "failed" && state !== "unknown") continue;
      if (job.finishedOn && now - job.finishedOn < SETTLING_MS) continue;
    }
    await ensureQueued("process-recording", data);
    requeued.push(row.id);
  }
  return { checked: rows.length, requeued };
}
