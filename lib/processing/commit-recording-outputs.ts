// The commit of a "process-recording" job's results, in one transaction: the derived folder moved into
// place, renditions upserted per (recording, kind), the signal trace, the recording's facts and state,
// and the custody events (processing, one "derived" per rendition and one for the trace). Idempotent:
// a second commit of a recording already "ready" does nothing, so a job run twice commits once.
import "server-only";
import { createHash } from "node:crypto";
import { and, eq, notInArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings, renditions, signalTraces } from "@/db/schema";
import { replaceStoredFolder } from "@/lib/storage/store";
import { derivedFolderKey, derivedKey } from "@/lib/storage/storage-keys";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { canonicalSerialize } from "@/lib/custody/canonical-serialize";
import type { DeriveResult } from "./derive-recording-outputs";

const WORKER_TOOL = "cairn worker";

/** The recording as the job loaded it (the original's hash and size go into every custody event). */
export interface CommitRecording {
  id: string;
  organisationId: string;
  jobId: string;
  sha256: string;
  sizeBytes: number;
}

/** Which run of the queue job commits (written into the processing custody event). */
export interface CommitRun {
  queueJobId: string | null;
  attempt: number;
}

/**
 * One transaction: facts, renditions, trace, state, custody. The recording's row lock also serialises
 * the move of the outputs into place, should two workers ever finish the same recording together
 * (a job taken over after a lost lock). False when the recording was deleted meanwhile: a deletion
 * wins, and no derived folder may reappear for it.
 */
export async function commitRecordingOutputs(rec: CommitRecording, result: DeriveResult, workDir: string, run: CommitRun): Promise<boolean> {
  return db().transaction(async (tx) => {
    const [locked] = await tx.execute<{ id: string; state: string }>(
      sql`select id, state from recordings where id = ${rec.id} and deleted_at is null for update`,
    );
    // gone, or another run of the same job committed while this one worked: commit once only
    if (!locked || locked.state === "ready") return false;
    // Should the commit below fail, the files in place are newer than the rows until the retry
    // commits; the retry writes the same files again (the outputs are deterministic).
    await replaceStoredFolder(derivedFolderKey(rec.organisationId, rec.id), workDir);
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
          queueJobId: run.queueJobId,
          attempt: run.attempt,
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
