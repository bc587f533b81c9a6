// Job "process-recording": derive the playable MP4, poster, thumbnail sprite + WebVTT track, facts and
// signal trace of one recording, and commit them in one transaction (lib/processing/commit-recording-outputs.ts). Idempotent: outputs are built in
// a folder of this worker's own scratch space (lib/storage/scratch.ts), put into the recording's derived
// folder as a whole, and the rows are upserted per (recording, kind), so a second run leaves one
// identical set. The original is only read, from a local copy the store hands out (the file itself on disk).
import { rm } from "node:fs/promises";
import { UnrecoverableError } from "bullmq";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { organisations, recordings } from "@/db/schema";
import type { JobPayloads } from "@/lib/queue/jobs";
import { statKey, withLocalCopy } from "@/lib/storage/store";
import { scratchFolder } from "@/lib/storage/scratch";
import { commitRecordingOutputs } from "@/lib/processing/commit-recording-outputs";
import { deriveRecordingOutputs } from "@/lib/processing/derive-recording-outputs";
import { RecordingRefused } from "@/lib/recordings/recording-refused";
import { markRecordingFailed } from "../mark-recording-failed";
import { notifyProcessingFinished } from "@/lib/mail/notifications";
import { recordingProgressReporter } from "../report-progress";
import type { JobContext } from "./job-context";

type Payload = JobPayloads["process-recording"];

export async function processRecording(data: Payload, ctx: JobContext = {}): Promise<void> {
  const recordingId = data.recordingId;
  const signal = ctx.signal ?? new AbortController().signal;
  const rec = await loadRecording(recordingId);
  // Gone or deleted since the job was queued: nothing to do, and nothing to retry.
  if (!rec || rec.deletedAt) return;
  // Already processed: this is a second run of the same job (queued again by the reconciler after
  // Redis lost the first one while it ran). Reprocessing sets the state back to "waiting" first.
  if (rec.state === "ready") return;

  const workDir = await scratchFolder(`process-${recordingId}`);
  try {
    const originalKey = rec.storageKey ?? (rec.duplicateOfId ? await storageKeyOf(rec.duplicateOfId) : null);
    if (!originalKey) throw new RecordingRefused("The original is not in the store (the upload never finished)");
    if (!(await statKey(originalKey))) throw new RecordingRefused("The original file is missing from the store");

    await db()
      .update(recordings)
      .set({ state: "processing", progress: 0, failureReason: null, updatedAt: new Date() })
      .where(eq(recordings.id, recordingId));
    const progress = recordingProgressReporter({ updateProgress: async (p: number) => ctx.progress?.(p) }, recordingId);
    const result = await withLocalCopy(originalKey, (originalPath) =>
      deriveRecordingOutputs({
        declaredKind: rec.kind,
        originalPath,
        fpsOverride: rec.fpsOverride,
        organisationDefaultFps: rec.defaultControllerFps,
        workDir,
        signal,
        onProgress: (p) => progress.report(p),
      }),
    );
    await progress.flush();
    if (signal.aborted) throw signal.reason instanceof Error ? signal.reason : new Error("cancelled");

    const committed = await commitRecordingOutputs(rec, result, workDir, { queueJobId: ctx.queueJobId ?? null, attempt: ctx.attempt ?? 1 });
    // the crew hears once per outcome; a mail problem never fails the job (notify never throws)
    if (committed) await notifyProcessingFinished(recordingId);
  } catch (err) {
    if (err instanceof RecordingRefused) {
      await markRecordingFailed(recordingId, err.message);
      // No retry: the file itself is the problem.
      throw new UnrecoverableError(err.message);
    }
    throw err;
  } finally {
    await rm(workDir, { recursive: true, force: true }).catch(() => {});
  }
}

async function loadRecording(id: string) {
  const [row] = await db()
    .select({
      id: recordings.id,
      organisationId: recordings.organisationId,
      jobId: recordings.jobId,
      kind: recordings.kind,
      sha256: recordings.sha256,
      sizeBytes: recordings.sizeBytes,
      storageKey: recordings.storageKey,
      duplicateOfId: recordings.duplicateOfId,
      fpsOverride: recordings.fpsOverride,
      deletedAt: recordings.deletedAt,
      state: recordings.state,
      defaultControllerFps: organisations.defaultControllerFps,
    })
    .from(recordings)
    .innerJoin(organisations, eq(organisations.id, recordings.organisationId))
    .where(eq(recordings.id, id));
  return row ?? null;
}

async function storageKeyOf(recordingId: string): Promise<string | null> {
  const [row] = await db().select({ storageKey: recordings.storageKey }).from(recordings).where(eq(recordings.id, recordingId));
  return row?.storageKey ?? null;
}

