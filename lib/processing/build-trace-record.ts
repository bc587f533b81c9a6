// The signal trace as stored: intervals of equal state with their times, the summary, and the frames
// ffmpeg's decoder reported. The trace from our own stream parser is merged with the decoder's errors
// (frames the header parser cannot see as damaged: corrupt bytes inside slice data).
import type { TraceInterval as StoredInterval, TraceSummary as StoredSummary } from "@/db/schema/media";
import {
  groupTraceIntervals,
  mergeDecoderErrors,
  summarizeTrace,
  type DecoderAgreement,
  type SignalTrace,
} from "@/lib/h264/signal-trace";
import type { LocatedDecoderEvents } from "@/lib/h264/ffmpeg-decode-errors";

/** Intervals are half-open: endFrame is one past the interval's last frame slot. */
export type TraceSummaryRecord = StoredSummary & {
  presentFrames: number;
  lossEvents: number;
  /** lostFrames is "at least N" (lib/h264/infer-lost-frames.ts); absent on traces made before it existed. */
  lostIsLowerBound?: boolean;
  durationSec: number;
  longestDegradationSec: number;
  /** How far the stream parser and ffmpeg's decoder agreed; null when the decoder pass did not run. */
  decoderAgreement: (DecoderAgreement & { decoderGaps: number }) | null;
};

export interface TraceRecord {
  fps: number;
  intervals: StoredInterval[];
  summary: TraceSummaryRecord;
  decoderErrorFrames: number[];
  /** Per-slot states after the decoder merge (FrameState values); not stored, the figures come from it. */
  states: Uint8Array;
}

export function buildTraceRecord(trace: SignalTrace, fps: number, decoder: LocatedDecoderEvents | null): TraceRecord {
  let merged = trace;
  let agreement: TraceSummaryRecord["decoderAgreement"] = null;
  if (decoder) {
    const m = mergeDecoderErrors(trace, decoder.damagedFrames);
    merged = m.trace;
    agreement = { ...m.agreement, decoderGaps: decoder.gapFrames.length };
  }
  const s = summarizeTrace(merged, fps);
  return {
    fps,
    intervals: groupTraceIntervals(merged, fps),
    summary: {
      frameCount: s.totalFrames,
      intactFrames: s.intactFrames,
      damagedFrames: s.damagedFrames,
      lostFrames: s.lostFrames,
      intactShare: s.intactShare,
      firstDegradationSec: s.firstDegradationSec,
      longestLossSec: s.longestLossSec,
      presentFrames: s.presentFrames,
      lossEvents: s.lossEvents,
      lostIsLowerBound: s.lostIsLowerBound,
      durationSec: s.durationSec,
      longestDegradationSec: s.longestDegradationSec,
      decoderAgreement: agreement,
    },
    decoderErrorFrames: decoder?.damagedFrames ?? [],
    states: merged.states,
  };
}
