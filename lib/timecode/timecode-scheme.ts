// How SMPTE ST 12-1 counts labels at a given rate.
//
// Non-drop: labels advance at the nominal integer rate (24, 25, 30, 50, 60 fps; at N*1000/1001
// rates the label runs at N and slowly falls behind the wall clock).
// Drop-frame, defined only for 30000/1001 and 60000/1001: at the start of every minute except
// minutes 00, 10, 20, 30, 40, 50, the first 2 (29.97) or 4 (59.94) frame labels are skipped.
// No pictures are dropped; only labels, which keeps the label within ~2.6 frames of the
// wall clock per day.
import { reduceFrameRate, type FrameRate } from "./frame-rate";
import { TimecodeError } from "./timecode-error";

export interface TimecodeScheme {
  /** labels per second: FF runs 0..nominalFps-1 */
  readonly nominalFps: number;
  readonly dropFrame: boolean;
  /** labels skipped at each non-tenth minute (0 when non-drop) */
  readonly droppedPerMinute: number;
  /** frames from 00:00:00:00 up to (not including) the next 00:00:00:00 */
  readonly framesPerDay: number;
}

export function isDropFrameRate(rate: FrameRate): boolean {
  const r = reduceFrameRate(rate);
  return r.den === 1001 && (r.num === 30000 || r.num === 60000);
}

/** `dropFrame` defaults to drop-frame at 29.97 and 59.94, non-drop elsewhere. */
export function resolveTimecodeScheme(rate: FrameRate, dropFrame?: boolean): TimecodeScheme {
  const r = reduceFrameRate(rate);
  const dropCapable = isDropFrameRate(r);
  const useDrop = dropFrame ?? dropCapable;

  if (useDrop) {
    if (!dropCapable) {
      throw new TimecodeError("unsupported-rate", `drop-frame timecode exists only at 30000/1001 and 60000/1001, not ${r.num}/${r.den}`);
    }
    const nominalFps = r.num / 1000;
    const droppedPerMinute = nominalFps / 15; // 2 at 29.97, 4 at 59.94
    const framesPerTenMinutes = nominalFps * 600 - 9 * droppedPerMinute;
    return { nominalFps, dropFrame: true, droppedPerMinute, framesPerDay: 144 * framesPerTenMinutes };
  }

  let nominalFps: number;
  if (r.den === 1) nominalFps = r.num;
  else if (r.den === 1001 && r.num % 1000 === 0) nominalFps = r.num / 1000;
  else throw new TimecodeError("unsupported-rate", `no SMPTE timecode counting for ${r.num}/${r.den} fps`);
  if (nominalFps > 99) throw new TimecodeError("unsupported-rate", `frame field has two digits; ${nominalFps} fps does not fit`);
  return { nominalFps, dropFrame: false, droppedPerMinute: 0, framesPerDay: nominalFps * 86_400 };
}
