// Places a finding on the recording's frames: a moment (one frame) or a range (first..last frame,
// inclusive). Frames are the truth; seconds are derived from the exact frame rate, so a finding and
// its still always name the same picture. Anything outside the recording is refused, not clamped:
// a finding silently moved to another frame would describe a picture nobody marked.
import { frameAtTime } from "@/lib/timecode/frame-at-time";
import { timeOfFrame } from "@/lib/timecode/time-of-frame";
import type { RecordingTiming } from "../recordings/recording-frame-rate";

export class FindingSpanError extends Error {
  constructor(readonly fields: Record<string, string[]>) {
    super(Object.values(fields).flat().join(" "));
    this.name = "FindingSpanError";
  }
}

export type SpanInput = { startFrame?: number; startSec?: number; endFrame?: number | null; endSec?: number | null };
export type FindingSpan = { startFrame: number; endFrame: number | null; startSec: number; endSec: number | null };

export function resolveFindingSpan(input: SpanInput, timing: RecordingTiming): FindingSpan {
  const last = timing.frameCount - 1;
  const errors: Record<string, string[]> = {};
  const fail = (field: string, message: string) => (errors[field] ??= []).push(message);

  const toFrame = (frame: number | undefined | null, sec: number | undefined | null, frameField: string, secField: string): number | null => {
    if (frame !== undefined && frame !== null) {
      if (!Number.isSafeInteger(frame) || frame < 0) fail(frameField, "Frames are whole numbers from 0");
      else if (frame > last) fail(frameField, `Frame ${frame} is past the last frame (${last}) of this recording`);
      else return frame;
      return null;
    }
    if (sec !== undefined && sec !== null) {
      if (!Number.isFinite(sec) || sec < 0) fail(secField, "Time cannot be negative");
      else if (sec >= timing.durationSec) fail(secField, `${sec} s is past the end of this recording (${timing.durationSec.toFixed(3)} s)`);
      else return Math.min(frameAtTime(sec, timing.rate), last);
      return null;
    }
    return null;
  };

  const startFrame = toFrame(input.startFrame, input.startSec, "startFrame", "startSec");
  if (startFrame === null && !errors.startFrame && !errors.startSec) fail("startFrame", "Give the frame (or time) of the finding");
  const hasEnd = (input.endFrame !== undefined && input.endFrame !== null) || (input.endSec !== undefined && input.endSec !== null);
  const endFrame = hasEnd ? toFrame(input.endFrame, input.endSec, "endFrame", "endSec") : null;
  if (startFrame !== null && endFrame !== null && endFrame <= startFrame) {
    fail(input.endFrame != null ? "endFrame" : "endSec", "The end of a range must come after its start");
  }
  if (Object.keys(errors).length) throw new FindingSpanError(errors);

  return {
    startFrame: startFrame!,
    endFrame,
    startSec: timeOfFrame(startFrame!, timing.rate),
    endSec: endFrame === null ? null : timeOfFrame(endFrame, timing.rate),
  };
}
