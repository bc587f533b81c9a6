// ffmpeg reports how far it got as a clock time (`time=00:01:02.50` on stderr, fluent-ffmpeg's
// "timemark"). Turned into a percentage of the expected duration, clamped to 0..100: ffmpeg may
// report a little past the end (the last frame's duration) or a negative start time.

/** Seconds of an ffmpeg time string ("HH:MM:SS.ss", optionally negative), or null if unreadable. */
export function parseTimemark(timemark: string | undefined | null): number | null {
  if (!timemark) return null;
  const m = /^(-)?(\d+):([0-5]?\d):([0-5]?\d(?:\.\d+)?)$/.exec(timemark.trim());
  if (!m) return null;
  const seconds = Number(m[2]) * 3600 + Number(m[3]) * 60 + Number(m[4]);
  return m[1] ? -seconds : seconds;
}

export function clampPercent(value: number): number {
  if (!Number.isFinite(value)) return 0;
  return Math.min(100, Math.max(0, value));
}

/** Percentage done (0..100, one decimal), or null when the time or the duration is unusable. */
export function progressFromTimemark(timemark: string | undefined | null, expectedDurationSec: number): number | null {
  const seconds = parseTimemark(timemark);
  if (seconds === null || !(expectedDurationSec > 0)) return null;
  return Math.round(clampPercent((seconds / expectedDurationSec) * 100) * 10) / 10;
}
