import type { FrameRate } from "./frame-rate";
import { TimecodeError } from "./timecode-error";
import { resolveTimecodeScheme } from "./timecode-scheme";

const LABEL = /^(\d{2}):(\d{2}):(\d{2})([:;])(\d{2})$/;

/**
 * 0-based frame number of a SMPTE ST 12-1 label. The separator carries the counting mode, as the
 * notation intends: ";" drop-frame (only at 29.97 / 59.94), ":" non-drop.
 * Labels the drop-frame count skips (e.g. 00:02:00;00) throw "dropped-label" rather than being
 * nudged to a neighbour: a finding pinned to a label that never existed is an input error.
 */
export function parseTimecode(text: string, rate: FrameRate): number {
  const match = LABEL.exec(text.trim());
  if (!match) throw new TimecodeError("malformed", `expected HH:MM:SS:FF or HH:MM:SS;FF, got ${JSON.stringify(text)}`);
  const [, h, m, s, separator, f] = match;
  const scheme = resolveTimecodeScheme(rate, separator === ";");
  const hh = Number(h), mm = Number(m), ss = Number(s), ff = Number(f);

  if (hh > 23 || mm > 59 || ss > 59 || ff >= scheme.nominalFps) {
    throw new TimecodeError("out-of-range", `${text} has a field out of range at ${scheme.nominalFps} labels per second`);
  }
  const totalMinutes = hh * 60 + mm;
  if (scheme.dropFrame && ss === 0 && mm % 10 !== 0 && ff < scheme.droppedPerMinute) {
    throw new TimecodeError("dropped-label", `${text} does not exist: drop-frame counting skips it`);
  }

  const labelIndex = (totalMinutes * 60 + ss) * scheme.nominalFps + ff;
  const skippedBefore = scheme.droppedPerMinute * (totalMinutes - Math.floor(totalMinutes / 10));
  return labelIndex - skippedBefore;
}
