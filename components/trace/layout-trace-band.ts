// Geometry and words of the link-state band: each interval's left and width in percent of the band,
// on the chosen clock (the recorder's, which is also the player's once the rendition keeps recorder
// time; the playable's for recordings processed before that), the label read on hover and in the list,
// and the numbered link events in time order. Short intervals get a minimum drawn width in pixels, so
// a 13-frame loss in a 20-minute recording is still a visible, clickable mark.
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import { LINK_EVENT_META, type LinkEvent } from "@/lib/range-checks/link-events";
import { linkEventForInterval } from "@/lib/range-checks/trace-interval-event";

export type LinkState = "intact" | "damaged" | "lost";

export interface BandInterval {
  state: LinkState;
  startFrame: number;
  endFrame: number;
  startSec: number;
  endSec: number;
  playableStartSec?: number;
  playableEndSec?: number;
  /** a lost interval whose length the stream could not bound: its frame count is "at least" */
  lostIsLowerBound?: boolean;
}

export interface BandSegment {
  state: LinkState;
  leftPct: number;
  widthPct: number;
  /** Where a click seeks to, on the band's clock. */
  atSec: number;
  label: string;
}

/** The crew's words for the three states of the picture. */
export const STATE_WORDS: Record<LinkState, string> = { intact: "Picture clear", damaged: "Picture breaking up", lost: "Video lost" };
export const STATE_MEANINGS: Record<LinkState, string> = {
  intact: "every slice of the frame arrived and decodes",
  damaged: "frames arrived with slices missing or scrambled, or predicted from a lost frame: the picture breaks up",
  lost: "frames never reached the recorder; the player holds the last frame for their length",
};

/** Damaged and lost intervals are never drawn narrower than this, whatever the band's width. */
export const MIN_MARK_WIDTH_PX = 8;

const plural = (n: number, one: string) => `${n} ${one}${n === 1 ? "" : "s"}`;

function frameWords(iv: BandInterval, allLostAreLowerBounds: boolean): string {
  const frames = iv.endFrame - iv.startFrame;
  const atLeast = iv.state === "lost" && (iv.lostIsLowerBound || allLostAreLowerBounds) ? "at least " : "";
  return `${atLeast}${plural(frames, "frame")}`;
}

export function describeInterval(iv: BandInterval, allLostAreLowerBounds = false): string {
  const span = `${formatClockTime(iv.startSec)} to ${formatClockTime(iv.endSec)}`;
  const length = `${frameWords(iv, allLostAreLowerBounds)}, ${(iv.endSec - iv.startSec).toFixed(3)} s`;
  return `${STATE_WORDS[iv.state]}: ${span} (${length})`;
}

const startOn = (iv: BandInterval, clock: "playable" | "recorder") => (clock === "playable" ? (iv.playableStartSec ?? iv.startSec) : iv.startSec);
const endOn = (iv: BandInterval, clock: "playable" | "recorder") => (clock === "playable" ? (iv.playableEndSec ?? iv.endSec) : iv.endSec);

export function layoutTraceBand(intervals: readonly BandInterval[], clock: "playable" | "recorder", totalSec: number, allLostAreLowerBounds = false): BandSegment[] {
  if (!(totalSec > 0)) return [];
  return intervals.map((iv) => {
    const start = startOn(iv, clock);
    const end = endOn(iv, clock);
    const leftPct = Math.min(100, Math.max(0, (start / totalSec) * 100));
    const widthPct = Math.min(Math.max(0, ((end - start) / totalSec) * 100), 100 - leftPct);
    return { state: iv.state, leftPct, widthPct, atSec: start, label: describeInterval(iv, allLostAreLowerBounds) };
  });
}

export interface BandEvent {
  /** 1-based, in time order. */
  n: number;
  event: LinkEvent;
  /** The crew's words for it: "Picture breaking up", "Video lost", "Video back". */
  word: string;
  /** Where it happens on the band's clock (a click seeks there). */
  atSec: number;
  /** Recorder frame slot where it happens. */
  atFrame: number;
  /** How long the state it starts lasts, on the recorder's clock; null for "video back" at the end. */
  frames: number;
  seconds: number;
  lengthWords: string;
  state: LinkState;
}

/**
 * The link events of a recording, numbered in time order: a damaged interval starts "picture
 * breaking up", a lost one "video lost", an intact one after either "video back" (the same mapping
 * range checks log, lib/range-checks/trace-interval-event.ts).
 */
export function bandEvents(intervals: readonly BandInterval[], clock: "playable" | "recorder", allLostAreLowerBounds = false): BandEvent[] {
  const out: Omit<BandEvent, "n">[] = [];
  intervals.forEach((iv, i) => {
    const event = linkEventForInterval(intervals, i);
    if (!event) return;
    const frames = iv.endFrame - iv.startFrame;
    out.push({
      event,
      word: LINK_EVENT_META[event].label,
      atSec: startOn(iv, clock),
      atFrame: iv.startFrame,
      frames,
      seconds: Math.max(0, iv.endSec - iv.startSec),
      lengthWords: iv.state === "intact" ? "" : `${frameWords(iv, allLostAreLowerBounds)}, ${Math.max(0, iv.endSec - iv.startSec).toFixed(3)} s`,
      state: iv.state,
    });
  });
  return out
    .sort((a, b) => a.atFrame - b.atFrame)
    .map((e, i) => ({ ...e, n: i + 1 }));
}
