"use client";
// The recording's timeline on the client's page: the play position and one stone per finding,
// each a button that jumps to its moment. Positions are fractions of the duration.
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import type { ShareViewFinding } from "@/lib/sharing/build-share-view";
import { SeverityStone } from "./severity-stone";

export function FindingTimeline({
  findings,
  durationSec,
  currentSec,
  onJump,
  labelOf = (f) => formatClockTime(f.startSec),
}: {
  findings: ShareViewFinding[];
  durationSec: number;
  currentSec: number;
  onJump: (f: ShareViewFinding) => void;
  /** a finding's time as the page labels it (its frame time, when the frame rate is known) */
  labelOf?: (f: ShareViewFinding) => string;
}) {
  const pct = (s: number) => `${Math.min(100, Math.max(0, (s / durationSec) * 100))}%`;
  if (!(durationSec > 0)) return null;
  return (
    <div role="group" className="mt-3" aria-label="Findings on the timeline">
      <div className="relative h-10 rounded-md border border-line bg-paper-2">
        <div className="absolute inset-y-0 left-0 bg-lake-soft" style={{ width: pct(currentSec) }} aria-hidden />
        {findings.map((f) => (
          <button
            key={f.id}
            type="button"
            onClick={() => onJump(f)}
            className="absolute top-1/2 -translate-x-1/2 -translate-y-1/2 rounded p-1 hover:bg-paper"
            style={{ left: pct(f.startSec) }}
            aria-label={`Jump to ${f.severityLabel} finding at ${labelOf(f)}`}
            title={`${f.severityLabel}${f.categoryName ? `: ${f.categoryName}` : ""} at ${labelOf(f)}`}
          >
            <SeverityStone severity={f.severity} size={18} />
          </button>
        ))}
      </div>
      <div className="mt-1 flex justify-between font-mono text-xs text-ink-2 tabular">
        <span>{formatClockTime(0)}</span>
        <span>{formatClockTime(durationSec)}</span>
      </div>
    </div>
  );
}
