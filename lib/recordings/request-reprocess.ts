// Re-processing a recording (a retry after a failure, or a new frame rate): optionally set the
// per-recording fps override, put the recording back to "waiting", and queue its job again. Refused
// while it is being processed (the running job would not see the new rate), and for a ready recording
// whose job is under a legal hold.
import "server-only";
import { and, eq, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { ensureQueued } from "@/lib/queue/ensure-queued";

export const RECORDING_NOT_FOUND = "Recording not found";

/** fps: a number sets the override, null clears it (back to the stream's or the default), undefined keeps it. */
export async function requestReprocess(organisationId: string, recordingId: string, fps: number | null | undefined) {
  const row = await db().transaction(async (tx) => {
    const [rec] = await tx.execute<{ id: string; state: string; kind: string; legal_hold: boolean }>(
      sql`select r.id, r.state, r.kind, j.legal_hold from recordings r join jobs j on j.id = r.job_id
          where r.id = ${recordingId} and r.organisation_id = ${organisationId} and r.deleted_at is null for update of r`,
    );
    if (!rec) throw new ApiError("not_found", RECORDING_NOT_FOUND);
    // re-processing a ready recording replaces its derived files, which a legal hold protects
    if (rec.legal_hold && rec.state === "ready") {
      throw new ApiError("locked", "This job is under a legal hold: its derived files cannot be replaced until the hold is released");
    }
    if (rec.state === "processing") throw new ApiError("conflict", "This recording is being processed now; try again when it has finished");
    const [updated] = await tx
      .update(recordings)
      .set({
        state: "waiting",
        progress: 0,
        failureReason: null,
        ...(fps !== undefined ? { fpsOverride: fps } : {}),
        updatedAt: new Date(),
      })
      .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId), isNull(recordings.deletedAt)))
      .returning({ id: recordings.id, state: recordings.state, progress: recordings.progress, fpsOverride: recordings.fpsOverride });
    return updated;
  });
  // After the commit: the worker must find the row already "waiting" with its new rate. Should Redis
  // be away here, the row still says "waiting" and the worker's reconciler queues it.
  await ensureQueued("process-recording", { recordingId }).catch((err) => {
    console.error(`[reprocess] could not queue ${recordingId} now (the reconciler will): ${(err as Error).message}`);
  });
  return row;
}
