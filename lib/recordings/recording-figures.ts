// The one set of figures of a recording: duration, frame count, intact share, first degradation,
// longest loss, lost and damaged counts. The worker computes them once, when it processes the
// recording, and stores them in `recordings.figures` (jsonb); every page, API answer, mail and report
// reads them from there (readRecordingFigures) instead of computing its own.
//
// Frame numbers count recorder frame slots, lost ones included. Slot k is the k-th frame the
// recorder's encoder produced since the start of the file (0-based, decoding order; controller
// streams carry no B-frames, so decoding order is display order). Its time is exactly
// k * frameRate.den / frameRate.num seconds, on the recorder's clock and in the playable rendition
// alike: the rendition holds the frame before a loss for the loss's length, so the two clocks agree.
// durationSeconds = frameSlots * den / num.
//
// Lost counts come from the H.264 stream's own structure (frame_num, picture order count, the IDR
// period; see lib/h264/infer-lost-frames.ts). When the structure cannot tell how many frames went
// missing (a loss whose length no counter bounds), framesLostIsLowerBound is true and every page says
// "at least N".
//
// Recordings without a signal trace (camera files in a container, still images) have figures too:
// frames from the rendition, signalKnown false, and no loss or damage counted (null shares).
import { z } from "zod";

export const RECORDING_FIGURES_VERSION = 1;

export interface FrameRateRatio {
  num: number;
  den: number;
}

export interface RecordingFigures {
  version: typeof RECORDING_FIGURES_VERSION;
  frameRate: FrameRateRatio;
  /** Recorder frame slots, lost ones included: slots 0 .. frameSlots - 1. */
  frameSlots: number;
  /** Frames present in the file (intact + damaged). */
  framesPresent: number;
  framesIntact: number;
  /** Present but not decodable exactly (scrambled slices, or predicted from a lost/damaged reference). */
  framesDamaged: number;
  /** Slots whose frame never reached the recorder. */
  framesLost: number;
  /** True when framesLost is "at least N": some loss's length could not be bounded from the stream. */
  framesLostIsLowerBound: boolean;
  /** Separate losses (runs of lost slots). */
  lossEvents: number;
  /** frameSlots * den / num. */
  durationSeconds: number;
  /** framesIntact / frameSlots; null when the recording has no signal trace. */
  intactShare: number | null;
  /** Time of the first slot that is not intact; null when none is (or no trace). */
  firstDegradationSeconds: number | null;
  /** Slot of the first degradation; null like firstDegradationSeconds. */
  firstDegradationSlot: number | null;
  /** Longest run of lost slots, seconds; 0 when nothing was lost. */
  longestLossSeconds: number;
  /** Longest run of slots that are not intact, seconds. */
  longestDegradationSeconds: number;
  /** False for files the signal trace does not apply to (containers, stills). */
  signalKnown: boolean;
  /** How the playable rendition was made: copied as it is (clean stream) or decoded and re-encoded. */
  rendition: "copy" | "reencode" | "transcode";
  /** Every sequence parameter set's picture size, in stream order, changes only (a mid-stream resolution change shows as two). */
  pictureSizes: Array<{ width: number; height: number; fromSlot: number }>;
}

const ratio = z.object({ num: z.number().int().positive(), den: z.number().int().positive() });

export const recordingFiguresSchema = z.object({
  version: z.literal(RECORDING_FIGURES_VERSION),
  frameRate: ratio,
  frameSlots: z.number().int().nonnegative(),
  framesPresent: z.number().int().nonnegative(),
  framesIntact: z.number().int().nonnegative(),
  framesDamaged: z.number().int().nonnegative(),
  framesLost: z.number().int().nonnegative(),
  framesLostIsLowerBound: z.boolean(),
  lossEvents: z.number().int().nonnegative(),
  durationSeconds: z.number().nonnegative(),
  intactShare: z.number().min(0).max(1).nullable(),
  firstDegradationSeconds: z.number().nonnegative().nullable(),
  firstDegradationSlot: z.number().int().nonnegative().nullable(),
  longestLossSeconds: z.number().nonnegative(),
  longestDegradationSeconds: z.number().nonnegative(),
  signalKnown: z.boolean(),
  rendition: z.enum(["copy", "reencode", "transcode"]),
  pictureSizes: z.array(z.object({ width: z.number().int(), height: z.number().int(), fromSlot: z.number().int() })),
}) satisfies z.ZodType<RecordingFigures>;

/**
 * The stored figures of a recording row, or null when it has none yet (not processed, failed, or
 * processed before figures existed: reprocess it). A stored value that does not match the type is
 * treated as absent rather than shown wrong.
 */
export function readRecordingFigures(row: { figures?: unknown } | null | undefined): RecordingFigures | null {
  if (!row || row.figures === null || row.figures === undefined) return null;
  const parsed = recordingFiguresSchema.safeParse(row.figures);
  return parsed.success ? (parsed.data as RecordingFigures) : null;
}

/** Seconds of recorder frame slot `slot` (exact on the recorder's clock and in the rendition). */
export function slotSeconds(figures: Pick<RecordingFigures, "frameRate">, slot: number): number {
  return (slot * figures.frameRate.den) / figures.frameRate.num;
}

/** The slot shown at `seconds` (floor, clamped to the recording's slots). */
export function slotAtSeconds(figures: Pick<RecordingFigures, "frameRate" | "frameSlots">, seconds: number): number {
  const slot = Math.floor((seconds * figures.frameRate.num) / figures.frameRate.den + 1e-9);
  return Math.min(Math.max(0, slot), Math.max(0, figures.frameSlots - 1));
}

/** "45" or "at least 45": how a lost count reads wherever it is shown. */
export function describeLostFrames(figures: Pick<RecordingFigures, "framesLost" | "framesLostIsLowerBound">): string {
  return figures.framesLostIsLowerBound ? `at least ${figures.framesLost}` : String(figures.framesLost);
}

export interface FiguresInput {
  frameRate: FrameRateRatio;
  /** Per-slot state: 0 intact, 1 damaged, 2 lost (lib/h264/signal-trace FrameState). */
  states: ArrayLike<number> | null;
  /** For files without a trace: frames in the rendition. */
  frameCount?: number;
  /** For files without a trace: the rendition's duration when it is not frames / rate (variable rate). */
  durationSeconds?: number;
  lossEvents?: number;
  framesLostIsLowerBound?: boolean;
  rendition: RecordingFigures["rendition"];
  pictureSizes?: RecordingFigures["pictureSizes"];
}

/** The figures from a trace's slot states (or, without a trace, from a frame count). */
export function computeRecordingFigures(input: FiguresInput): RecordingFigures {
  const { frameRate } = input;
  const sec = (slots: number) => (slots * frameRate.den) / frameRate.num;
  const base = {
    version: RECORDING_FIGURES_VERSION,
    frameRate: { num: frameRate.num, den: frameRate.den },
    rendition: input.rendition,
    pictureSizes: input.pictureSizes ?? [],
  } as const;
  if (!input.states) {
    const n = input.frameCount ?? 0;
    return {
      ...base,
      frameSlots: n,
      framesPresent: n,
      framesIntact: n,
      framesDamaged: 0,
      framesLost: 0,
      framesLostIsLowerBound: false,
      lossEvents: 0,
      durationSeconds: input.durationSeconds ?? sec(n),
      intactShare: null,
      firstDegradationSeconds: null,
      firstDegradationSlot: null,
      longestLossSeconds: 0,
      longestDegradationSeconds: 0,
      signalKnown: false,
    };
  }
  const states = input.states;
  const counts = [0, 0, 0];
  let first = -1;
  let lossRun = 0;
  let longestLoss = 0;
  let degradedRun = 0;
  let longestDegraded = 0;
  let lossEvents = 0;
  for (let i = 0; i < states.length; i++) {
    const s = states[i];
    counts[s]++;
    if (s !== 0 && first < 0) first = i;
    if (s === 2 && lossRun === 0) lossEvents++;
    lossRun = s === 2 ? lossRun + 1 : 0;
    longestLoss = Math.max(longestLoss, lossRun);
    degradedRun = s !== 0 ? degradedRun + 1 : 0;
    longestDegraded = Math.max(longestDegraded, degradedRun);
  }
  const n = states.length;
  return {
    ...base,
    frameSlots: n,
    framesPresent: counts[0] + counts[1],
    framesIntact: counts[0],
    framesDamaged: counts[1],
    framesLost: counts[2],
    framesLostIsLowerBound: input.framesLostIsLowerBound ?? false,
    lossEvents: input.lossEvents ?? lossEvents,
    durationSeconds: sec(n),
    intactShare: n === 0 ? 1 : counts[0] / n,
    firstDegradationSeconds: first < 0 ? null : sec(first),
    firstDegradationSlot: first < 0 ? null : first,
    longestLossSeconds: sec(longestLoss),
    longestDegradationSeconds: sec(longestDegraded),
    signalKnown: true,
  };
}
