import type { TraceInterval } from "@/db/schema/media";
import type { LinkEvent } from "./link-events";

/**
 * Which link event the start of a signal-trace interval marks:
 * - a damaged interval starts a degradation -> first_degradation
 * - a lost interval starts a loss -> total_loss
 * - an intact interval that follows a damaged or lost one -> reacquired
 * - an intact interval at the start, or after another intact one, marks nothing -> null
 *
 * Each damaged start counts as the first degradation of its own episode: a flight that fades,
 * recovers and fades again has two, and the pilot may want both on the chart.
 */
export function linkEventForInterval(intervals: readonly Pick<TraceInterval, "state">[], index: number): LinkEvent | null {
  if (!Number.isInteger(index) || index < 0 || index >= intervals.length) return null;
  const state = intervals[index].state;
  if (state === "damaged") return "first_degradation";
  if (state === "lost") return "total_loss";
  const before = index > 0 ? intervals[index - 1].state : null;
  return before === "damaged" || before === "lost" ? "reacquired" : null;
}

export type TraceLinkEvent = {
  readonly intervalIndex: number;
  readonly event: LinkEvent;
  /** Seconds into the recording where the interval starts. */
  readonly atSec: number;
  readonly atFrame: number;
  readonly state: TraceInterval["state"];
  /** How long the interval lasts, seconds: a blink of damage reads differently from a long fade. */
  readonly durationSec: number;
};

/** Every interval start of a trace that marks a link event, in time order. */
export function traceLinkEvents(intervals: readonly TraceInterval[]): TraceLinkEvent[] {
  const out: TraceLinkEvent[] = [];
  intervals.forEach((interval, i) => {
    const event = linkEventForInterval(intervals, i);
    if (!event) return;
    out.push({
      intervalIndex: i,
      event,
      atSec: interval.startSec,
      atFrame: interval.startFrame,
      state: interval.state,
      durationSec: Math.max(0, interval.endSec - interval.startSec),
    });
  });
  return out.sort((a, b) => a.atSec - b.atSec || a.intervalIndex - b.intervalIndex);
}
