"use client";
// The link-state band under a timeline: clear picture solid, picture breaking up hatched, video lost
// as an empty dashed box, each at least MIN_MARK_WIDTH_PX wide; above it each link event's shape and
// number; beside it the same events as a numbered list in time order, each a button that seeks (the
// keyboard path: Tab to an event, Enter). Colour never carries the meaning alone: shape, pattern,
// number and words do.
import { LinkEventShape } from "@/components/range/link-event-mark";
import { formatFrameClockTime } from "@/lib/timecode/format-frame-clock-time";
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import type { FrameRate } from "@/lib/timecode/frame-rate";
import { bandEvents, layoutTraceBand, MIN_MARK_WIDTH_PX, STATE_MEANINGS, STATE_WORDS, type BandEvent, type BandInterval, type LinkState } from "./layout-trace-band";

export function TraceBand({
  intervals,
  totalSec,
  clock = "playable",
  currentSec,
  onSeek,
  label = "Signal trace",
  rate,
  lostIsLowerBound = false,
}: {
  intervals: BandInterval[];
  totalSec: number;
  clock?: "playable" | "recorder";
  currentSec?: number;
  onSeek?: (sec: number) => void;
  label?: string;
  /** the recording's exact frame rate: event times then read as frame times (the player's labels) */
  rate?: FrameRate;
  /** the recording's lost count is a lower bound: lost intervals read "at least N frames" */
  lostIsLowerBound?: boolean;
}) {
  const segments = layoutTraceBand(intervals, clock, totalSec, lostIsLowerBound);
  const events = bandEvents(intervals, clock, lostIsLowerBound);
  const timeOf = (e: { atFrame: number; atSec: number }) => (rate ? formatFrameClockTime(e.atFrame, rate) : formatClockTime(e.atSec));
  const pct = (sec: number) => (totalSec > 0 ? Math.min(100, Math.max(0, (sec / totalSec) * 100)) : 0);
  return (
    <div className="flex flex-col gap-1" data-testid="trace-band">
      {/* event marks: shape and number above the band, where each event happens; events closer than
          MARK_GROUP_PCT share one mark ("1–3") so their numbers stay readable */}
      <div className="relative h-4 w-full" aria-hidden>
        {groupMarks(events, pct).map((g) => (
          <span
            key={g.first.n}
            className="absolute top-0 flex -translate-x-1/2 items-center gap-px whitespace-nowrap text-[10px] leading-none text-ink"
            style={{ left: `${g.atPct}%` }}
            title={g.events.map((e) => `${e.n}. ${e.word} at ${timeOf(e)}`).join("\n")}
          >
            <LinkEventShape event={g.first.event} size={9} />
            {g.events.length === 1 ? g.first.n : `${g.first.n}–${g.events[g.events.length - 1].n}`}
          </span>
        ))}
      </div>
      <div className="relative h-6 w-full rounded-sm border border-line bg-paper" aria-hidden>
        {segments.map((s, i) => (
          <button
            key={i}
            type="button"
            tabIndex={-1}
            title={s.label}
            data-state={s.state}
            onClick={() => onSeek?.(s.atSec)}
            className={`band-${s.state} absolute ${s.state === "lost" ? "-top-1 -bottom-1 z-10 bg-bad-soft" : s.state === "damaged" ? "top-0.5 bottom-0.5 z-[5]" : "top-0.5 bottom-0.5"} ${onSeek ? "cursor-pointer" : "cursor-default"}`}
            style={{
              left: `${s.leftPct}%`,
              width: s.state === "intact" ? `${s.widthPct}%` : `max(${MIN_MARK_WIDTH_PX}px, ${s.widthPct}%)`,
              // a loss stands out of the band: taller than it, its dashed outline in the warning colour
              ...(s.state === "lost" ? { outlineColor: "var(--color-bad)" } : {}),
            }}
          />
        ))}
        {currentSec !== undefined && totalSec > 0 && <span className="absolute -top-0.5 -bottom-0.5 z-20 w-0.5 bg-lake" style={{ left: `${pct(currentSec)}%` }} />}
      </div>
      <BandLegend />
      <div className="text-xs">
        <p className="text-ink-2" data-testid="trace-event-count">
          {label}: {events.length === 0 ? (intervals.length > 0 ? "picture clear throughout" : "no frames") : `${events.length} link event${events.length === 1 ? "" : "s"}, in time order`}
        </p>
        {events.length > 0 && (
          <ol className="mt-1 flex max-h-56 flex-col gap-0.5 overflow-y-auto pr-1 font-mono tabular" aria-label={`${label}: link events in time order`} data-testid="trace-events-list">
            {events.map((e) => {
              const text = (
                <>
                  {/* spaces between the parts, so the text read out is the text shown */}
                  <span className="w-6 shrink-0 text-right text-ink-2">{e.n}.</span> <LinkEventShape event={e.event} size={11} />{" "}
                  <span className="font-sans font-medium">{e.word}</span> <span>at {timeOf(e)},</span> <span className="text-ink-2">frame {e.atFrame}</span>
                  {e.lengthWords && <span className="text-ink-2">, {e.lengthWords}</span>}
                </>
              );
              return (
                <li key={e.n} data-testid="trace-event" data-event={e.event}>
                  {onSeek ? (
                    <button
                      type="button"
                      className="flex min-h-7 w-full flex-wrap items-center gap-x-2 rounded px-1 text-left hover:bg-paper-2"
                      onClick={() => onSeek(e.atSec)}
                    >
                      {text}
                      {/* the name is the visible text, then what the button does (WCAG 2.5.3, label in name) */}
                      <span className="sr-only">: go there</span>
                    </button>
                  ) : (
                    <span className="flex flex-wrap items-center gap-x-2 px-1">{text}</span>
                  )}
                </li>
              );
            })}
          </ol>
        )}
      </div>
    </div>
  );
}

/** Events within this share of the band are drawn as one mark above it. */
const MARK_GROUP_PCT = 2.5;

function groupMarks<E extends { n: number; atSec: number; event: BandEvent["event"] }>(events: E[], pct: (sec: number) => number): Array<{ first: E; events: E[]; atPct: number }> {
  const groups: Array<{ first: E; events: E[]; atPct: number }> = [];
  for (const e of events) {
    const at = pct(e.atSec);
    const last = groups[groups.length - 1];
    if (last && at - last.atPct < MARK_GROUP_PCT) last.events.push(e);
    else groups.push({ first: e, events: [e], atPct: at });
  }
  return groups;
}

export function BandLegend() {
  const states: LinkState[] = ["intact", "damaged", "lost"];
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-2" aria-label="Link states">
      {states.map((s) => (
        <li key={s} className="flex items-center gap-1" title={STATE_MEANINGS[s]}>
          <span className={`band-${s} inline-block h-3 w-5 rounded-sm ${s === "lost" ? "bg-bad-soft" : ""}`} style={s === "lost" ? { outlineColor: "var(--color-bad)" } : undefined} aria-hidden />
          {STATE_WORDS[s]}
        </li>
      ))}
    </ul>
  );
}
