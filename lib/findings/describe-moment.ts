// The three ways Cairn names a moment of footage, everywhere the same: clock time "HH:MM:SS.mmm"
// (the first millisecond inside the frame, so seeking to the label lands on that frame), the 0-based
// frame number, and the SMPTE ST 12-1 label (drop-frame ";" at 29.97 and 59.94). Rates with no SMPTE
// counting (e.g. 12.5 fps) have no label rather than a wrong one.
import { formatFrameClockTime } from "@/lib/timecode/format-frame-clock-time";
import { formatTimecode } from "@/lib/timecode/format-timecode";
import type { FrameRate } from "@/lib/timecode/frame-rate";

export type Moment = { clock: string; frame: number; smpte: string | null };

export function describeMoment(frame: number, rate: FrameRate): Moment {
  let smpte: string | null = null;
  try {
    smpte = formatTimecode(frame, rate);
  } catch {
    smpte = null;
  }
  return { clock: formatFrameClockTime(frame, rate), frame, smpte };
}

/** "00:00:01.234 · frame 37 · 00:00:01:07" */
export function formatMoment(m: Moment): string {
  return [m.clock, `frame ${m.frame}`, m.smpte].filter(Boolean).join(" · ");
}
