// Geometry and words of the link-state band: each interval's left and width in percent of the band,
// on the chosen clock (the playable's, under the player; the recorder's, on the flight timeline), and
// the label read on hover and in the list. Lost intervals take no playable time, so under the player
// they get a minimum width to stay visible and clickable.
import { formatClockTime } from "@/lib/timecode/format-clock-time";

export type LinkState = "intact" | "damaged" | "lost";

export interface BandInterval {
  state: LinkState;
  startFrame: number;
  endFrame: number;
  startSec: number;
  endSec: number;
  playableStartSec?: number;
  playableEndSec?: number;
}

export interface BandSegment {
  state: LinkState;
  leftPct: number;
  widthPct: number;
  /** Where a click seeks to, on the band's clock. */
  atSec: number;
  label: string;
}

export const STATE_WORDS: Record<LinkState, string> = { intact: "Intact", damaged: "Damaged", lost: "Lost" };
export const STATE_MEANINGS: Record<LinkState, string> = {
  intact: "every slice of the frame arrived and decodes",
  damaged: "slices missing or undecodable, or predicted from a lost frame",
  lost: "frames missing from the stream (a gap in frame_num)",
};

const MIN_LOST_WIDTH_PCT = 0.6;

const plural = (n: number, one: string) => `${n} ${one}${n === 1 ? "" : "s"}`;

export function describeInterval(iv: BandInterval): string {
  const frames = iv.endFrame - iv.startFrame;
  const span = `${formatClockTime(iv.startSec)} to ${formatClockTime(iv.endSec)}`;
  const length = `${plural(frames, "frame")}, ${(iv.endSec - iv.startSec).toFixed(3)} s`;
  return `${STATE_WORDS[iv.state]}: ${span} (${length})`;
}

export function layoutTraceBand(intervals: readonly BandInterval[], clock: "playable" | "recorder", totalSec: number): BandSegment[] {
  if (!(totalSec > 0)) return [];
  return intervals.map((iv) => {
    const start = clock === "playable" ? (iv.playableStartSec ?? iv.startSec) : iv.startSec;
    const end = clock === "playable" ? (iv.playableEndSec ?? iv.endSec) : iv.endSec;
    const leftPct = Math.min(100, Math.max(0, (start / totalSec) * 100));
    let widthPct = Math.max(0, ((end - start) / totalSec) * 100);
    if (iv.state === "lost") widthPct = Math.max(widthPct, MIN_LOST_WIDTH_PCT);
    widthPct = Math.min(widthPct, 100 - leftPct);
    return { state: iv.state, leftPct, widthPct, atSec: start, label: describeInterval(iv) };
  });
}
