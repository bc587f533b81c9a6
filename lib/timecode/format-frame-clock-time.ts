import { formatClockTimeMs } from "./format-clock-time";
import { assertFrameRate, type FrameRate } from "./frame-rate";

/**
 * Clock time of a frame, rounded UP to the millisecond.
 *
 * Why not nearest: frame 1 at 30000/1001 starts at 33.366... ms. Rounded to nearest it reads
 * "00:00:00.033", and seeking a player there shows frame 0, because a player shows the last frame
 * starting at or before the seek time. The first whole millisecond at or after the frame start
 * always lies inside the frame (every frame lasts longer than 1 ms), so the label leads back to it.
 */
export function formatFrameClockTime(frame: number, rate: FrameRate): string {
  assertFrameRate(rate);
  if (!Number.isSafeInteger(frame) || frame < 0) throw new RangeError(`frame must be a non-negative integer, got ${frame}`);
  // Exact integer ceiling of frame * den * 1000 / num; exact while the product stays below 2^53
  // (about 2.5 years of 60000/1001 video).
  const numerator = frame * rate.den * 1000;
  if (!Number.isSafeInteger(numerator)) throw new RangeError(`frame ${frame} is too large to place exactly`);
  const whole = Math.floor(numerator / rate.num);
  const ms = whole * rate.num === numerator ? whole : whole + 1;
  return formatClockTimeMs(ms);
}
