// A finding's still: a pending row written in the finding's transaction, and the extract-still job
// queued only after that transaction commits (a job must never look for a row that is not there yet).
import "server-only";
import type { DbOrTx } from "@/db/client";
import { stills } from "@/db/schema";
import { enqueue } from "@/lib/queue/jobs";

export async function insertPendingStill(
  tx: DbOrTx,
  v: { organisationId: string; recordingId: string; findingId: string; frameNumber: number; timeSec: number },
): Promise<string> {
  const [row] = await tx.insert(stills).values({ ...v, state: "pending" }).returning({ id: stills.id });
  return row.id;
}

/**
 * Queues extraction after commit. If Redis is away the still stays "pending" and the finding is kept:
 * the reviewer can ask again (POST /api/findings/:id/still), and nothing of the finding is lost.
 */
export async function enqueueStill(stillId: string): Promise<boolean> {
  try {
    await enqueue("extract-still", { stillId });
    return true;
  } catch (err) {
    console.warn(`[cairn] could not queue still ${stillId}; it stays pending:`, (err as Error).message);
    return false;
  }
}
