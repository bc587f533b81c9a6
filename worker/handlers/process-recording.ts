// Job "process-recording": derive the playable MP4, poster, thumbnail sprite + WebVTT track, facts and
// signal trace of one recording, and commit them in one transaction (lib/processing/commit-recording-outputs.ts). Idempotent: outputs are built in
// a temp folder, moved into the recording's derived folder as a whole, and the rows are upserted per
// (recording, kind), so a second run leaves one identical set. The original is only read.
import { readdir, rm, mkdir, stat } from "node:fs/promises";
import path from "node:path";
import { UnrecoverableError } from "bullmq";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { organisations, recordings } from "@/db/schema";
import type { JobPayloads } from "@/lib/queue/jobs";
import { storePath } from "@/lib/storage/local-store";
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

  const workRoot = storePath("tmp");
  const workDir = path.join(workRoot, `process-${recordingId}-${process.pid}-${Date.now()}`);
  try {
    const originalKey = rec.storageKey ?? (rec.duplicateOfId ? await storageKeyOf(rec.duplicateOfId) : null);
    if (!originalKey) throw new RecordingRefused("The original is not in the store (the upload never finished)");
    const originalPath = storePath(originalKey);
    if (!(await stat(originalPath).then((s) => s.isFile(), () => false))) {
      throw new RecordingRefused("The original file is missing from the store");
    }

    await db()
      .update(recordings)
      .set({ state: "processing", progress: 0, failureReason: null, updatedAt: new Date() })
      .where(eq(recordings.id, recordingId));
    await removeStaleWorkFolders(workRoot, recordingId);
    await mkdir(workDir, { recursive: true });

    const progress = recordingProgressReporter({ updateProgress: async (p: number) => ctx.progress?.(p) }, recordingId);
    const result = await deriveRecordingOutputs({
      declaredKind: rec.kind,
      originalPath,
      fpsOverride: rec.fpsOverride,
      organisationDefaultFps: rec.defaultControllerFps,
      workDir,
      signal,
      onProgress: (p) => progress.report(p),
    });
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

/** Work folders left by a worker that died mid-job (SIGKILL, power loss) for this recording. */
async function removeStaleWorkFolders(workRoot: string, recordingId: string): Promise<void> {
  const names = await readdir(workRoot).catch(() => [] as string[]);
  await Promise.all(
    names.filter((n) => n.startsWith(`process-${recordingId}-`)).map((n) => rm(path.join(workRoot, n), { recursive: true, force: true })),
  );
}
