// The exact frame rate of a recording, from what processing learned about it. Facts store a decimal
// fps; frame-exact work needs the ratio, and the NTSC-family rates (N*1000/1001) have no finite
// decimal, so a decimal within half a thousandth of one of them is read as that ratio.
import { reduceFrameRate, type FrameRate } from "@/lib/timecode/frame-rate";
import { readRecordingFigures, type RecordingFigures } from "@/lib/recordings/recording-figures";

// 23.976, 29.97, 47.952, 59.94, 119.88: the N*1000/1001 family (SMPTE ST 12-1 names 29.97 and 59.94;
// the others are common practice, no published source here).
const NTSC_BASES = [24, 30, 48, 60, 120];
const TOLERANCE = 0.0005;

export function frameRateFromFps(fps: number): FrameRate {
  if (!Number.isFinite(fps) || fps <= 0 || fps > 1000) throw new RangeError(`not a usable frame rate: ${fps}`);
  for (const base of NTSC_BASES) {
    if (Math.abs(fps - (base * 1000) / 1001) < TOLERANCE) return { num: base * 1000, den: 1001 };
  }
  const whole = Math.round(fps);
  if (Math.abs(fps - whole) < TOLERANCE) return { num: whole, den: 1 };
  return reduceFrameRate({ num: Math.round(fps * 1000), den: 1000 });
}

export type RecordingTimingSource = {
  fpsOverride: number | null;
  durationSec: number | null;
  facts: { fps?: number | null; frameCount?: number; durationSec?: number } | null;
  /** The worker's stored figures (lib/recordings/recording-figures.ts); when present they decide. */
  figures?: unknown;
};

export type RecordingTiming = {
  rate: FrameRate;
  fps: number;
  /** recorder frame slots, lost ones included (0 .. frameCount - 1); the rendition keeps one per slot */
  frameCount: number;
  durationSec: number;
  /** frames that never reached the recorder, and whether that count is only a lower bound */
  lost?: { frames: number; isLowerBound: boolean } | null;
  /** the stored figures this timing was read from; null for a recording processed before they existed */
  figures?: RecordingFigures | null;
};

/**
 * Timing of a processed recording, or null when processing has not established it yet.
 * A pilot's override wins over the stream's own rate; the organisation default stands in when the
 * stream carries none (controller recordings often do not).
 */
export function recordingTiming(rec: RecordingTimingSource, organisationDefaultFps: number): RecordingTiming | null {
  // the stored figures are the one account of a processed recording: slots and their exact rate
  const figures = readRecordingFigures(rec);
  if (figures && figures.frameSlots > 0) {
    const rate = reduceFrameRate(figures.frameRate);
    return {
      rate,
      fps: rate.num / rate.den,
      frameCount: figures.frameSlots,
      durationSec: figures.durationSeconds,
      lost: figures.signalKnown ? { frames: figures.framesLost, isLowerBound: figures.framesLostIsLowerBound } : null,
      figures,
    };
  }
  const fps = rec.fpsOverride ?? rec.facts?.fps ?? organisationDefaultFps;
  if (!fps || !Number.isFinite(fps) || fps <= 0) return null;
  const rate = frameRateFromFps(fps);
  const exactFps = rate.num / rate.den;
  const duration = rec.durationSec ?? rec.facts?.durationSec ?? null;
  const frameCount = rec.facts?.frameCount ?? (duration ? Math.round(duration * exactFps) : null);
  if (!frameCount || frameCount < 1) return null;
  return { rate, fps: exactFps, frameCount, durationSec: duration ?? frameCount / exactFps, lost: null, figures: null };
}
