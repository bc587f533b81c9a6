// The signal trace counts time on the recorder's clock: frame slots, lost frames included. The
// playable video has only the frames present in the file, from the first IDR picture on. Under the
// player the band must use the playable's time, so each interval also gets its playable start and end:
// a lost interval occupies no playable time (it sits between two frames), and frames before the
// playable's first frame map to 0.
import type { TraceInterval } from "@/db/schema/media";

export interface PlayableInterval extends TraceInterval {
  frames: number;
  playableStartSec: number;
  playableEndSec: number;
}

export function mapTraceToPlayable(intervals: readonly TraceInterval[], fps: number, playableFirstFrame = 0, sameClock = false): PlayableInterval[] {
  // Renditions re-encoded on the recorder's clock (plan-timed-reencode.ts), and clean copies (no
  // loss, nothing cut), play slot k at k / fps: the two clocks are one.
  if (sameClock) return intervals.map((iv) => ({ ...iv, frames: iv.endFrame - iv.startFrame, playableStartSec: iv.startSec, playableEndSec: iv.endSec }));
  let present = 0;
  const at = (presentFrames: number) => Math.max(0, presentFrames - playableFirstFrame) / fps;
  return intervals.map((iv) => {
    const frames = iv.endFrame - iv.startFrame;
    const start = at(present);
    if (iv.state !== "lost") present += frames;
    return { ...iv, frames, playableStartSec: start, playableEndSec: at(present) };
  });
}
