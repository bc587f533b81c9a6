"use client";
// The link-state band under a timeline: intact solid, damaged hatched, lost empty with a dashed
// outline (classes in app/globals.css), each interval labelled on hover, and the same intervals in an
// accessible list whose entries seek. Colour never carries the meaning alone: pattern and word do.
import { layoutTraceBand, STATE_MEANINGS, STATE_WORDS, type BandInterval, type LinkState } from "./layout-trace-band";

export function TraceBand({
  intervals,
  totalSec,
  clock = "playable",
  currentSec,
  onSeek,
  label = "Signal trace",
}: {
  intervals: BandInterval[];
  totalSec: number;
  clock?: "playable" | "recorder";
  currentSec?: number;
  onSeek?: (sec: number) => void;
  label?: string;
}) {
  const segments = layoutTraceBand(intervals, clock, totalSec);
  const degraded = segments.filter((s) => s.state !== "intact");
  return (
    <div className="flex flex-col gap-1">
      <div className="relative h-4 w-full rounded-sm border border-line bg-paper" aria-hidden>
        {segments.map((s, i) => (
          <button
            key={i}
            type="button"
            tabIndex={-1}
            title={s.label}
            onClick={() => onSeek?.(s.atSec)}
            className={`band-${s.state} absolute top-0.5 bottom-0.5 ${onSeek ? "cursor-pointer" : "cursor-default"}`}
            style={{ left: `${s.leftPct}%`, width: `${s.widthPct}%` }}
          />
        ))}
        {currentSec !== undefined && totalSec > 0 && (
          <span className="absolute -top-0.5 -bottom-0.5 w-0.5 bg-lake" style={{ left: `${Math.min(100, (currentSec / totalSec) * 100)}%` }} />
        )}
      </div>
      <BandLegend />
      <details className="text-xs">
        <summary className="cursor-pointer text-ink-2">
          {label}: {intervals.length === 1 && intervals[0].state === "intact" ? "intact throughout" : `${degraded.length} degraded interval${degraded.length === 1 ? "" : "s"}`} (list)
        </summary>
        <ol className="mt-1 flex max-h-48 flex-col gap-0.5 overflow-y-auto font-mono tabular" aria-label={`${label} intervals`}>
          {segments.map((s, i) => (
            <li key={i} className="flex items-center gap-2">
              <span className={`band-${s.state} inline-block h-3 w-6 shrink-0 rounded-sm`} aria-hidden />
              {onSeek ? (
                <button type="button" className="text-left underline-offset-2 hover:underline" onClick={() => onSeek(s.atSec)}>
                  {s.label}
                </button>
              ) : (
                <span>{s.label}</span>
              )}
            </li>
          ))}
        </ol>
      </details>
    </div>
  );
}

export function BandLegend() {
  const states: LinkState[] = ["intact", "damaged", "lost"];
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-2" aria-label="Link states">
      {states.map((s) => (
        <li key={s} className="flex items-center gap-1" title={STATE_MEANINGS[s]}>
          <span className={`band-${s} inline-block h-3 w-5 rounded-sm`} aria-hidden />
          {STATE_WORDS[s]}
        </li>
      ))}
    </ul>
  );
}
