// "HH:MM:SS.mmm": the clock notation shared by the UI, reports and WebVTT cue timings
// (lib/vtt/format-vtt-timestamp.ts delegates here). Hours grow past two digits rather than wrap,
// because a wrapped clock would put two moments of a long recording on the same label.

const pad = (value: number, width: number) => String(value).padStart(width, "0");

/** Formats a whole number of milliseconds. */
export function formatClockTimeMs(totalMs: number): string {
  if (!Number.isSafeInteger(totalMs) || totalMs < 0) throw new RangeError(`milliseconds must be a non-negative integer, got ${totalMs}`);
  const ms = totalMs % 1000;
  const totalSeconds = (totalMs - ms) / 1000;
  const s = totalSeconds % 60;
  const m = Math.floor(totalSeconds / 60) % 60;
  const h = Math.floor(totalSeconds / 3600);
  return `${pad(h, 2)}:${pad(m, 2)}:${pad(s, 2)}.${pad(ms, 3)}`;
}

/** Formats seconds rounded to the nearest millisecond (59.9996 s carries to 00:01:00.000). */
export function formatClockTime(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) throw new RangeError(`time must be a finite, non-negative number of seconds, got ${seconds}`);
  return formatClockTimeMs(Math.round(seconds * 1000));
}
