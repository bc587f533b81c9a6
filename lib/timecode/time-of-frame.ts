import { assertFrameRate, type FrameRate } from "./frame-rate";

/** Presentation time (seconds) at which frame `frame` (0-based) starts: frame * den / num. */
export function timeOfFrame(frame: number, rate: FrameRate): number {
  assertFrameRate(rate);
  if (!Number.isSafeInteger(frame) || frame < 0) throw new RangeError(`frame must be a non-negative integer, got ${frame}`);
  // Multiply before dividing: frame * den is an exact integer, so the only rounding is the final division.
  return (frame * rate.den) / rate.num;
}
