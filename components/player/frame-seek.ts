// Frame-exact seeking. A player shows the last frame that starts at or before currentTime, so seeking
// to a frame's exact start risks landing on its predecessor when the float rounds down; seeking to the
// middle of the frame lands inside it with half a frame of margin either way.
import { frameAtTime } from "@/lib/timecode/frame-at-time";
import type { FrameRate } from "@/lib/timecode/frame-rate";

export function seekTimeForFrame(frame: number, rate: FrameRate, frameCount: number): number {
  const f = Math.min(Math.max(0, Math.round(frame)), Math.max(0, frameCount - 1));
  return ((f + 0.5) * rate.den) / rate.num;
}

/** The frame on screen at the player's time, kept inside the recording. */
export function frameOnScreen(seconds: number, rate: FrameRate, frameCount: number): number {
  if (!Number.isFinite(seconds) || seconds < 0) return 0;
  return Math.min(frameAtTime(seconds, rate), Math.max(0, frameCount - 1));
}
