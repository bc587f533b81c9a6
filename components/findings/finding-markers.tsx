"use client";
// The review timeline under the player: a stone-shaped pin at each finding's frame (outline thickness
// by severity, severity word in its label), a bar under a range, the playhead. Clicking a pin jumps
// to its frame; clicking the track seeks there.
import { SEVERITY_SCALE } from "@/lib/findings/severity-scale";
import { formatFrameClockTime } from "@/lib/timecode/format-frame-clock-time";
import type { FrameRate } from "@/lib/timecode/frame-rate";
import { FindingStone } from "./finding-stone";
import type { FindingItem } from "./finding-types";

export function FindingMarkers({
  findings,
  frameCount,
  rate,
  currentFrame,
  selectedId,
  draft,
  onSeekFrame,
  onSelect,
}: {
  findings: FindingItem[];
  frameCount: number;
  rate: FrameRate;
  currentFrame: number;
  selectedId: string | null;
  draft: { startFrame: number; endFrame: number | null } | null;
  onSeekFrame(frame: number): void;
  onSelect(f: FindingItem): void;
}) {
  const last = Math.max(1, frameCount - 1);
  const pct = (frame: number) => `${(frame / last) * 100}%`;
  return (
    <div className="select-none" data-testid="finding-markers">
      <div
        className="relative h-12 cursor-pointer rounded border border-line bg-paper-2"
        onClick={(e) => {
          const r = e.currentTarget.getBoundingClientRect();
          onSeekFrame(Math.round(((e.clientX - r.left) / r.width) * last));
        }}
        role="presentation"
      >
        {draft && draft.endFrame !== null && (
          <div className="absolute bottom-1 h-1.5 rounded bg-lake/60" style={{ left: pct(draft.startFrame), width: `calc(${pct(draft.endFrame)} - ${pct(draft.startFrame)})` }} aria-hidden />
        )}
        {findings.map((f) =>
          f.endFrame !== null ? (
            <div
              key={`${f.id}-range`}
              className="absolute bottom-1 h-1.5 rounded border border-ink bg-ink/20"
              style={{ left: pct(f.startFrame), width: `calc(${pct(f.endFrame)} - ${pct(f.startFrame)})` }}
              aria-hidden
            />
          ) : null,
        )}
        {findings.map((f) => {
          const level = SEVERITY_SCALE[f.severity];
          return (
            <button
              key={f.id}
              type="button"
              data-testid="finding-marker"
              data-severity={f.severity}
              className={`absolute top-0.5 -translate-x-1/2 rounded focus-visible:outline ${selectedId === f.id ? "scale-125" : ""}`}
              style={{ left: pct(f.startFrame) }}
              title={`${level.label}${f.categoryName ? `, ${f.categoryName}` : ""} at ${formatFrameClockTime(f.startFrame, rate)} (frame ${f.startFrame})`}
              aria-label={`${level.label} finding at ${formatFrameClockTime(f.startFrame, rate)}, frame ${f.startFrame}`}
              onClick={(e) => {
                e.stopPropagation();
                onSelect(f);
              }}
            >
              <FindingStone severity={f.severity} size={14} pin />
            </button>
          );
        })}
        {draft && (
          <div className="absolute top-0 h-full w-0.5 bg-lake" style={{ left: pct(draft.startFrame) }} title="Start of the finding being marked" aria-hidden />
        )}
        <div className="pointer-events-none absolute top-0 h-full w-px bg-bad" style={{ left: pct(currentFrame) }} aria-hidden data-testid="playhead" />
      </div>
      <p className="sr-only">Findings on the timeline are also listed beside the player.</p>
    </div>
  );
}
