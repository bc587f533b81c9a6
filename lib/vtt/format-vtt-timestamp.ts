// WebVTT timestamp (W3C WebVTT, "WebVTT timestamp"): hours ":" minutes ":" seconds "." exactly
// three fraction digits. The spec lets hours be omitted when zero; we always write them, which
// every conforming parser accepts and keeps one fixed shape for tools that diff tracks.
import { formatClockTime, formatClockTimeMs } from "@/lib/timecode/format-clock-time";

/** From whole milliseconds: exact, the form cue builders should use. */
export function formatVttTimestampMs(ms: number): string {
  return formatClockTimeMs(ms);
}

/** From seconds, rounded to the nearest millisecond. */
export function formatVttTimestamp(seconds: number): string {
  return formatClockTime(seconds);
}
