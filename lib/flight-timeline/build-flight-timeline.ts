// One flight as one timeline across its files: each file's length on the recorder's clock (frame
// slots of its signal trace, lost frames included; else its playable duration), the gaps between
// files, and a summary for the whole flight.
//
// A gap is estimated from the recorders' file times: a file's modification time is when the recorder
// closed it, so the next file started at (its close time - its length), and the gap is that start
// minus the previous close time. Without both times, or when they contradict each other by more than
// the tolerance (recorder clocks are often unset), the gap is shown with its length unknown.
import { flightOrder, type FlightFile } from "./order-flight-files";

export interface TimelineFileInput extends FlightFile {
  state: "waiting" | "processing" | "ready" | "failed";
  durationSec: number | null;
  trace: {
    durationSec: number;
    frameCount: number;
    intactFrames: number;
    intactShare: number;
    firstDegradationSec: number | null;
    longestLossSec: number;
  } | null;
}

export interface TimelineSegment {
  recordingId: string;
  index: number;
  originalName: string;
  state: TimelineFileInput["state"];
  recorderModifiedAt: string | null;
  /** Length on the recorder's clock, seconds; null until processed. */
  lengthSec: number | null;
  /** Start on the flight timeline (known gaps included), null when an earlier length or gap is unknown. */
  flightStartSec: number | null;
  trace: TimelineFileInput["trace"];
}

export interface TimelineGap {
  afterRecordingId: string;
  beforeRecordingId: string;
  /** Estimated seconds between the files; null when it cannot be estimated. */
  seconds: number | null;
  reason: string | null;
}

export interface FlightTimelineSummary {
  files: number;
  processedFiles: number;
  tracedFiles: number;
  /** Sum of the files' lengths, seconds (files still processing count as 0). */
  recordedSec: number;
  /** First file start to last file end, when every length and gap is known. */
  spanSec: number | null;
  /** Intact frame slots / all frame slots over the traced files; null without any trace. */
  intactShare: number | null;
  firstDegradation: { recordingId: string; index: number; atSec: number; flightSec: number | null } | null;
  longestLossSec: number;
  longestGapSec: number | null;
  unknownGaps: number;
}

export interface FlightTimeline {
  segments: TimelineSegment[];
  gaps: TimelineGap[];
  summary: FlightTimelineSummary;
}

// Recorder clocks and our frame-rate assumption disagree by a little: overlaps this small are 0 s.
export const GAP_TOLERANCE_SEC = 2;

function lengthOf(f: TimelineFileInput): number | null {
  if (f.trace && f.trace.durationSec > 0) return f.trace.durationSec;
  return f.durationSec !== null && f.durationSec > 0 ? f.durationSec : null;
}

export function estimateGap(prev: TimelineFileInput, next: TimelineFileInput): { seconds: number | null; reason: string | null } {
  const nextLength = lengthOf(next);
  if (!prev.recorderModifiedAt || !next.recorderModifiedAt) return { seconds: null, reason: "file times unknown" };
  if (nextLength === null) return { seconds: null, reason: "file not processed yet" };
  const gap = (next.recorderModifiedAt.getTime() - prev.recorderModifiedAt.getTime()) / 1000 - nextLength;
  if (gap < -GAP_TOLERANCE_SEC) return { seconds: null, reason: "file times contradict the order" };
  return { seconds: Math.max(0, gap), reason: null };
}

export function buildFlightTimeline(files: readonly TimelineFileInput[]): FlightTimeline {
  const ordered = flightOrder(files);
  const segments: TimelineSegment[] = [];
  const gaps: TimelineGap[] = [];
  let cursor: number | null = 0;
  let slots = 0;
  let intact = 0;
  let firstDegradation: FlightTimelineSummary["firstDegradation"] = null;
  let longestLossSec = 0;
  let longestGapSec: number | null = null;
  let unknownGaps = 0;
  let recordedSec = 0;

  ordered.forEach((f, index) => {
    if (index > 0) {
      const g = estimateGap(ordered[index - 1], f);
      gaps.push({ afterRecordingId: ordered[index - 1].id, beforeRecordingId: f.id, ...g });
      if (g.seconds === null) {
        unknownGaps++;
        cursor = null;
      } else {
        longestGapSec = Math.max(longestGapSec ?? 0, g.seconds);
        if (cursor !== null) cursor += g.seconds;
      }
    }
    const length = lengthOf(f);
    segments.push({
      recordingId: f.id,
      index,
      originalName: f.originalName,
      state: f.state,
      recorderModifiedAt: f.recorderModifiedAt?.toISOString() ?? null,
      lengthSec: length,
      flightStartSec: cursor,
      trace: f.trace,
    });
    if (f.trace) {
      slots += f.trace.frameCount;
      intact += f.trace.intactFrames;
      longestLossSec = Math.max(longestLossSec, f.trace.longestLossSec);
      if (!firstDegradation && f.trace.firstDegradationSec !== null) {
        firstDegradation = {
          recordingId: f.id,
          index,
          atSec: f.trace.firstDegradationSec,
          flightSec: cursor === null ? null : cursor + f.trace.firstDegradationSec,
        };
      }
    }
    recordedSec += length ?? 0;
    cursor = cursor !== null && length !== null ? cursor + length : null;
  });

  return {
    segments,
    gaps,
    summary: {
      files: ordered.length,
      processedFiles: ordered.filter((f) => f.state === "ready").length,
      tracedFiles: ordered.filter((f) => f.trace).length,
      recordedSec,
      spanSec: ordered.length > 0 ? cursor : 0,
      intactShare: slots > 0 ? intact / slots : null,
      firstDegradation,
      longestLossSec,
      longestGapSec,
      unknownGaps,
    },
  };
}
