import { assertFrameRate, type FrameRate } from "./frame-rate";

// A time computed as timeOfFrame(n) can come back from floating point as n - 4e-16 frames;
// plain floor would then name frame n - 1. One millionth of a frame (17 ns at 60 fps) absorbs
// that error for any recording shorter than years, yet is far below anything a player can seek to.
const BOUNDARY_EPSILON_FRAMES = 1e-6;

/** The frame on screen at `seconds`: the last frame whose start time is <= seconds. */
export function frameAtTime(seconds: number, rate: FrameRate): number {
  assertFrameRate(rate);
  if (!Number.isFinite(seconds) || seconds < 0) throw new RangeError(`time must be a finite, non-negative number of seconds, got ${seconds}`);
  return Math.floor((seconds * rate.num) / rate.den + BOUNDARY_EPSILON_FRAMES);
}
