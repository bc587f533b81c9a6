// One flight as one timeline across its files: each file's length on the recorder's clock (frame
// slots of its signal trace, lost frames included; else its playable duration), the gaps between
// files, and a summary for the whole flight.
//
// A gap is estimated from the recorders' file times: a file's modification time is when the recorder
// closed it, so the next file started at (its close time - its length), and the gap is that start
// minus the previous close time. Without both times, or when they contradict each other by more than
// the tolerance (recorder clocks are often unset), the gap is shown with its length unknown. Times in
// order but closer together than the files last are copy times (the card was copied to a computer):
// the gap is unknown then too, and said so, rather than called a contradiction.
//
// A gap longer than the tolerance is an outage: the recorder stopped (typically the link was lost and
// the controller closed the file) and started a new file. The flight's summary counts it as loss,
// with its length marked as estimated. The files' own figures are the stored ones
// (lib/recordings/recording-figures.ts), never recomputed here.
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
    /** Lost frame slots in the file, and whether that count is "at least". */
    lostFrames?: number;
    lostIsLowerBound?: boolean;
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
  /** Intact time / all time over the traced files and the outages between them; null without any trace. */
  intactShare: number | null;
  /** The earliest trouble: inside a file, or an outage between files (at the end of the file before it). */
  firstDegradation: { recordingId: string; index: number; atSec: number; flightSec: number | null; between: boolean } | null;
  /** Longest loss, inside a file or between files. */
  longestLossSec: number;
  /** The longest loss is an outage between files: its length is estimated from file times. */
  longestLossEstimated: boolean;
  /** Lost frame slots inside the files. */
  lostFrames: number;
  /** Some file's lost count is "at least", so the flight's is too. */
  lostIsLowerBound: boolean;
  /** Seconds lost between files (outages), estimated from the recorder's file times. */
  outageSec: number;
  outages: number;
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

export const COPY_TIMES = "file times are when the files were copied, not when they were recorded";

export function estimateGap(prev: TimelineFileInput, next: TimelineFileInput): { seconds: number | null; reason: string | null } {
  const nextLength = lengthOf(next);
  if (!prev.recorderModifiedAt || !next.recorderModifiedAt) return { seconds: null, reason: "file times unknown" };
  if (nextLength === null) return { seconds: null, reason: "file not processed yet" };
  const between = (next.recorderModifiedAt.getTime() - prev.recorderModifiedAt.getTime()) / 1000;
  // the next file closed before the previous one did: the times really disagree with the order
  if (between < -GAP_TOLERANCE_SEC) return { seconds: null, reason: "file times contradict the order" };
  const gap = between - nextLength;
  // In order, but closer together than the next file lasts: these are not close times at all. A file
  // copied off the card (or saved by a browser) gets the time it was written, so every file of a card
  // carries nearly the same time. Nothing contradicts the order; the gap just cannot be told.
  if (gap < -GAP_TOLERANCE_SEC) return { seconds: null, reason: COPY_TIMES };
  return { seconds: Math.max(0, gap), reason: null };
}

export function buildFlightTimeline(files: readonly TimelineFileInput[]): FlightTimeline {
  const ordered = flightOrder(files);
  const segments: TimelineSegment[] = [];
  const gaps: TimelineGap[] = [];
  let cursor: number | null = 0;
  let slots = 0;
  let firstDegradation: FlightTimelineSummary["firstDegradation"] = null;
  let longestLossSec = 0;
  let longestLossEstimated = false;
  let lostFrames = 0;
  let lostIsLowerBound = false;
  let outageSec = 0;
  let outages = 0;
  let tracedSec = 0;
  let intactSec = 0;
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
        if (g.seconds > GAP_TOLERANCE_SEC) {
          // an outage: the video was lost between the two files
          outages++;
          outageSec += g.seconds;
          if (ordered[index - 1].trace && f.trace) tracedSec += g.seconds;
          if (g.seconds > longestLossSec) {
            longestLossSec = g.seconds;
            longestLossEstimated = true;
          }
          if (!firstDegradation) {
            const prev = ordered[index - 1];
            firstDegradation = { recordingId: prev.id, index: index - 1, atSec: lengthOf(prev) ?? 0, flightSec: cursor, between: true };
          }
        }
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
      tracedSec += f.trace.durationSec;
      intactSec += f.trace.frameCount > 0 ? (f.trace.intactFrames / f.trace.frameCount) * f.trace.durationSec : 0;
      lostFrames += f.trace.lostFrames ?? 0;
      if (f.trace.lostIsLowerBound) lostIsLowerBound = true;
      if (f.trace.longestLossSec > longestLossSec) {
        longestLossSec = f.trace.longestLossSec;
        longestLossEstimated = false;
      }
      if (!firstDegradation && f.trace.firstDegradationSec !== null) {
        firstDegradation = {
          recordingId: f.id,
          index,
          atSec: f.trace.firstDegradationSec,
          flightSec: cursor === null ? null : cursor + f.trace.firstDegradationSec,
          between: false,
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
      intactShare: slots > 0 && tracedSec > 0 ? intactSec / tracedSec : null,
      firstDegradation,
      longestLossSec,
      longestLossEstimated,
      lostFrames,
      lostIsLowerBound,
      outageSec,
      outages,
      longestGapSec,
      unknownGaps,
    },
  };
}
