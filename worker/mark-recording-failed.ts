// A recording whose processing cannot succeed ends in the state "failed" with a reason people can
// read; the original stays untouched and a retry (re-processing) is one click away. A recording that
// became ready in the meantime (a later run succeeded) is left alone.
import { and, eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { notifyProcessingFinished } from "@/lib/mail/notifications";

const MAX_REASON = 400; // characters

export async function markRecordingFailed(recordingId: string, reason: string): Promise<void> {
  await db()
    .update(recordings)
    .set({ state: "failed", progress: 0, failureReason: reason.split("\n")[0].slice(0, MAX_REASON), updatedAt: new Date() })
    .where(and(eq(recordings.id, recordingId), inArray(recordings.state, ["waiting", "processing"])));
  await notifyProcessingFinished(recordingId);
}

/** Between attempts: back to "waiting" so the pages do not show a stuck percentage. */
export async function markRecordingRetrying(recordingId: string): Promise<void> {
  await db()
    .update(recordings)
    .set({ state: "waiting", progress: 0, updatedAt: new Date() })
    .where(and(eq(recordings.id, recordingId), eq(recordings.state, "processing")));
}

/**
 * The reason kept when a job ends failed. A refusal (UnrecoverableError carrying a RecordingRefused
 * message) is already written for people; anything else says how many attempts it took.
 */
export function finalFailureReason(err: Error, attempts: number): string {
  const message = err.message.split("\n")[0].trim() || err.name;
  // BullMQ's words (as an UnrecoverableError) when a job's worker died more often than allowed.
  if (/stalled more than allowable limit/i.test(message)) {
    return "Processing failed: the worker stopped while processing this recording, more than once (it may be too large for this machine)";
  }
  if (err.name === "UnrecoverableError") return message;
  return attempts > 1 ? `Processing failed after ${attempts} attempts: ${message}` : `Processing failed: ${message}`;
}
