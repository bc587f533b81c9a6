// Job "process-recording": derive the playable MP4, poster, thumbnail sprite + WebVTT track, facts and
// signal trace of one recording, and commit them in one transaction. Idempotent: outputs are built in
// a temp folder, moved into the recording's derived folder as a whole, and the rows are upserted per
// (recording, kind), so a second run leaves one identical set. The original is only read.
import { readdir, rm, mkdir, stat } from "node:fs/promises";
import path from "node:path";
import { createHash } from "node:crypto";
import { UnrecoverableError, type Job } from "bullmq";
import { and, eq, notInArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { organisations, recordings, renditions, signalTraces } from "@/db/schema";
import type { JobPayloads } from "@/lib/queue/jobs";
import { replaceDerivedFolder, storePath } from "@/lib/storage/local-store";
import { derivedKey } from "@/lib/storage/storage-keys";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { canonicalSerialize } from "@/lib/custody/canonical-serialize";
import { deriveRecordingOutputs, type DeriveResult } from "@/lib/media/derive-recording-outputs";
import { RecordingRefused } from "@/lib/media/recording-refused";
import { markRecordingFailed } from "../mark-recording-failed";
import { notifyProcessingFinished } from "@/lib/notify";
import { recordingProgressReporter } from "../report-progress";

const WORKER_TOOL = "cairn worker";

type Payload = JobPayloads["process-recording"];

export async function processRecordingJob(job: Job<Payload>, signal: AbortSignal): Promise<void> {
  const recordingId = job.data.recordingId;
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

    const progress = recordingProgressReporter(job, recordingId);
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

    const committed = await commitResult(job, rec, result, workDir);
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

type LoadedRecording = NonNullable<Awaited<ReturnType<typeof loadRecording>>>;

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

/**
 * One transaction: facts, renditions, trace, state, custody. The recording's row lock also serialises
 * the move of the outputs into place, should two workers ever finish the same recording together
 * (a job taken over after a lost lock). False when the recording was deleted meanwhile: a deletion
 * wins, and no derived folder may reappear for it.
 */
async function commitResult(job: Job<Payload>, rec: LoadedRecording, result: DeriveResult, workDir: string): Promise<boolean> {
  return db().transaction(async (tx) => {
    const [locked] = await tx.execute<{ id: string; state: string }>(
      sql`select id, state from recordings where id = ${rec.id} and deleted_at is null for update`,
    );
    // gone, or another run of the same job committed while this one worked: commit once only
    if (!locked || locked.state === "ready") return false;
    // Should the commit below fail, the files in place are newer than the rows until the retry
    // commits; the retry writes the same files again (the outputs are deterministic).
    await replaceDerivedFolder(rec.organisationId, rec.id, workDir);
    const now = new Date();

    const kinds = result.outputs.map((o) => o.kind);
    await tx
      .delete(renditions)
      .where(and(eq(renditions.recordingId, rec.id), kinds.length ? notInArray(renditions.kind, kinds) : undefined));
    const written: Array<{ id: string; kind: string; key: string; sha256: string; sizeBytes: number; tool: string; toolArgs: string[] }> = [];
    for (const o of result.outputs) {
      const key = derivedKey(rec.organisationId, rec.id, o.file);
      const values = {
        organisationId: rec.organisationId,
        recordingId: rec.id,
        kind: o.kind,
        storageKey: key,
        mimeType: o.mimeType,
        sizeBytes: o.sizeBytes,
        sha256: o.sha256,
        width: o.width,
        height: o.height,
        tool: o.tool,
        toolArgs: o.toolArgs,
      };
      const [row] = await tx
        .insert(renditions)
        .values(values)
        .onConflictDoUpdate({ target: [renditions.recordingId, renditions.kind], set: { ...values, updatedAt: now } })
        .returning({ id: renditions.id });
      written.push({ id: row.id, kind: o.kind, key, sha256: o.sha256, sizeBytes: o.sizeBytes, tool: o.tool, toolArgs: o.toolArgs });
    }

    let traceHash: string | null = null;
    if (result.trace) {
      const t = result.trace;
      const values = {
        recordingId: rec.id,
        organisationId: rec.organisationId,
        fps: t.fps,
        intervals: t.intervals,
        summary: t.summary,
        decoderErrorFrames: t.decoderErrorFrames,
      };
      await tx.insert(signalTraces).values(values).onConflictDoUpdate({ target: signalTraces.recordingId, set: { ...values, updatedAt: now } });
      traceHash = createHash("sha256").update(canonicalSerialize({ fps: t.fps, intervals: t.intervals, decoderErrorFrames: t.decoderErrorFrames })).digest("hex");
    } else {
      await tx.delete(signalTraces).where(eq(signalTraces.recordingId, rec.id));
    }

    await tx
      .update(recordings)
      .set({
        state: "ready",
        progress: 100,
        failureReason: null,
        facts: result.facts,
        // one set of figures, computed once here; durationSec is figures.durationSeconds (kept for sorting)
        figures: result.figures,
        durationSec: result.durationSec,
        processedAt: now,
        updatedAt: now,
      })
      .where(eq(recordings.id, rec.id));

    const base = {
      organisationId: rec.organisationId,
      jobId: rec.jobId,
      originalSha256: rec.sha256,
      originalSize: rec.sizeBytes,
    };
    await recordCustodyEvent(
      {
        ...base,
        eventType: "processing",
        evidenceType: "recording",
        evidenceId: rec.id,
        purpose: "derive playable video, stills, thumbnails and signal trace",
        tool: WORKER_TOOL,
        details: {
          queueJobId: job.id ?? null,
          attempt: job.attemptsMade + 1,
          fps: result.facts.fps ?? null,
          fpsSource: result.facts.fpsSource ?? null,
          playableMode: result.facts.playableMode ?? null,
          frameSlots: result.figures?.frameSlots ?? null,
          framesLost: result.figures?.framesLost ?? null,
          framesLostIsLowerBound: result.figures?.framesLostIsLowerBound ?? null,
          outputs: written.length,
        },
      },
      tx,
    );
    for (const w of written) {
      await recordCustodyEvent(
        {
          ...base,
          eventType: "derived",
          evidenceType: "rendition",
          evidenceId: w.id,
          storageLocation: w.key,
          purpose: w.kind,
          tool: w.tool,
          toolArgs: w.toolArgs,
          outputSha256: w.sha256,
          details: { recordingId: rec.id, kind: w.kind, sizeBytes: w.sizeBytes },
        },
        tx,
      );
    }
    if (traceHash && result.trace) {
      await recordCustodyEvent(
        {
          ...base,
          eventType: "derived",
          evidenceType: "recording",
          evidenceId: rec.id,
          purpose: "signal trace",
          tool: "cairn signal trace",
          toolArgs: ["lib/h264 stream parser", "ffprobe -show_log decoder cross-check"],
          outputSha256: traceHash,
          details: { intervals: result.trace.intervals.length, intactShare: result.trace.summary.intactShare },
        },
        tx,
      );
    }
    return true;
  });
}
