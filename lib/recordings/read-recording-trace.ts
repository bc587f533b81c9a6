// The signal trace of one recording as the pages need it: intervals on both clocks, the summary, and
// why there is none when there is none.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings, signalTraces } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { RecordingFacts } from "../processing/derive-recording-outputs";
import { mapTraceToPlayable, type PlayableInterval } from "../processing/map-trace-to-playable";
import type { TraceSummaryRecord } from "../processing/build-trace-record";
import { RECORDING_NOT_FOUND } from "./request-reprocess";
import { readRecordingFigures, type RecordingFigures } from "./recording-figures";

export type RecordingTraceView =
  | {
      recordingId: string;
      applicable: true;
      fps: number;
      playableFirstFrame: number;
      intervals: PlayableInterval[];
      summary: TraceSummaryRecord;
      decoderErrorFrameCount: number;
      /** The stored figures (recordings.figures); null for recordings processed before they existed. */
      figures: RecordingFigures | null;
    }
  | { recordingId: string; applicable: false; reason: string; state: string };

export async function readRecordingTrace(organisationId: string, recordingId: string): Promise<RecordingTraceView> {
  const [row] = await db()
    .select({ id: recordings.id, state: recordings.state, facts: recordings.facts, figures: recordings.figures })
    .from(recordings)
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId), isNull(recordings.deletedAt)));
  if (!row) throw new ApiError("not_found", RECORDING_NOT_FOUND);
  const [trace] = await db()
    .select()
    .from(signalTraces)
    .where(and(eq(signalTraces.recordingId, recordingId), eq(signalTraces.organisationId, organisationId)));
  const facts = (row.facts ?? null) as RecordingFacts | null;
  if (!trace) {
    const reason =
      row.state === "ready"
        ? (facts?.traceNotApplicable ?? "No signal trace for this recording")
        : row.state === "failed"
          ? "Processing failed, so there is no signal trace"
          : "The signal trace is made while the recording is processed";
    return { recordingId, applicable: false, reason, state: row.state };
  }
  const playableFirstFrame = facts?.playableFirstFrame ?? 0;
  const figures = readRecordingFigures(row);
  const summary = trace.summary as TraceSummaryRecord;
  const sameClock = facts?.playableMode === "reencode" || (summary.lostFrames === 0 && playableFirstFrame === 0);
  return {
    recordingId,
    applicable: true,
    fps: trace.fps,
    playableFirstFrame,
    intervals: mapTraceToPlayable(trace.intervals, trace.fps, playableFirstFrame, sameClock),
    summary,
    decoderErrorFrameCount: trace.decoderErrorFrames?.length ?? 0,
    figures,
  };
}
