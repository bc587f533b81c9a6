import type { FrameRate } from "./frame-rate";
import { TimecodeError } from "./timecode-error";
import { resolveTimecodeScheme } from "./timecode-scheme";

export interface TimecodeOptions {
  /** default: drop-frame at 29.97 / 59.94, non-drop elsewhere */
  readonly dropFrame?: boolean;
}

const pad2 = (n: number) => String(n).padStart(2, "0");

/**
 * SMPTE ST 12-1 label of a 0-based frame number: "HH:MM:SS:FF" non-drop, "HH:MM:SS;FF" drop-frame.
 * Frames at or past 24 h throw instead of wrapping to 00:00:00:00, so one label never names
 * two moments of the same recording.
 */
export function formatTimecode(frame: number, rate: FrameRate, options: TimecodeOptions = {}): string {
  const scheme = resolveTimecodeScheme(rate, options.dropFrame);
  if (!Number.isSafeInteger(frame) || frame < 0) throw new TimecodeError("out-of-range", `frame must be a non-negative integer, got ${frame}`);
  if (frame >= scheme.framesPerDay) throw new TimecodeError("out-of-range", `frame ${frame} is at or past 24 h of timecode`);

  const fps = scheme.nominalFps;
  let label = frame; // position counted in labels, skipped labels included
  if (scheme.dropFrame) {
    const drop = scheme.droppedPerMinute;
    const perTenMinutes = fps * 600 - 9 * drop;
    const perDroppedMinute = fps * 60 - drop;
    const tens = Math.floor(frame / perTenMinutes);
    const rest = frame % perTenMinutes;
    // The first minute of each ten-minute block keeps all its labels; each later minute lost `drop`.
    const minutesIntoBlock = rest < drop ? 0 : Math.floor((rest - drop) / perDroppedMinute);
    label += 9 * drop * tens + drop * minutesIntoBlock;
  }

  const ff = label % fps;
  const totalSeconds = Math.floor(label / fps);
  const ss = totalSeconds % 60;
  const mm = Math.floor(totalSeconds / 60) % 60;
  const hh = Math.floor(totalSeconds / 3600);
  return `${pad2(hh)}:${pad2(mm)}:${pad2(ss)}${scheme.dropFrame ? ";" : ":"}${pad2(ff)}`;
}
