"use client";
// The track on a plan of the site drawn from coordinates alone (no map tiles): metres east and north of the
// launch point (lib/range-checks/plan-projection.ts), the line patterned by link state (solid, dashed,
// dotted, thin, each named in the legend), the link events as their shapes, and the aircraft where the
// player is, as a ring with a cross.
import { useMemo } from "react";
import { fromMetres } from "@/lib/geo";
import { roundLengthBelow } from "@/lib/range-checks/plan-projection";
import { formatMetresIn } from "@/lib/range-checks/format-figures";
import type { DisplayPoint } from "@/lib/tracks/display-at";
import type { LinkEvent } from "@/lib/range-checks/link-events";
import { LINK_EVENT_META } from "@/lib/range-checks/link-events";
import type { DisplayUnits } from "@/lib/validation/range-checks";
import { TRACK_LINK_STYLE, type TrackLinkState } from "./link-state-style";

const SIZE = 420;
const PAD = 28;

export type PlanEvent = { key: string; event: LinkEvent; east: number; north: number; label: string };

export function TrackPlan({ points, events, aircraft, units }: { points: DisplayPoint[]; events: PlanEvent[]; aircraft: { east: number; north: number } | null; units: DisplayUnits }) {
  const extent = useMemo(() => Math.max(20, ...points.map((p) => Math.max(Math.abs(p.east), Math.abs(p.north)))) * 1.1, [points]);
  const scale = (SIZE / 2 - PAD) / extent;
  const x = (east: number) => SIZE / 2 + east * scale;
  const y = (north: number) => SIZE / 2 - north * scale;

  // one polyline per run of the same state
  const runs = useMemo(() => {
    const out: { state: TrackLinkState; pts: string }[] = [];
    let cur: { state: TrackLinkState; list: DisplayPoint[] } | null = null;
    for (const p of points) {
      if (!cur || cur.state !== p.state) {
        if (cur) out.push({ state: cur.state, pts: cur.list.map((q) => `${x(q.east).toFixed(1)},${y(q.north).toFixed(1)}`).join(" ") });
        cur = { state: p.state, list: cur ? [cur.list[cur.list.length - 1], p] : [p] };
      } else cur.list.push(p);
    }
    if (cur) out.push({ state: cur.state, pts: cur.list.map((q) => `${x(q.east).toFixed(1)},${y(q.north).toFixed(1)}`).join(" ") });
    return out;
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [points, scale]);

  const bar = roundLengthBelow(fromMetres(extent, units) * 0.5);
  const barPx = (bar / fromMetres(1, units)) * scale;
  const present = new Set(points.map((p) => p.state));

  return (
    <figure className="flex flex-col gap-2">
      <svg viewBox={`0 0 ${SIZE} ${SIZE}`} className="w-full max-w-[420px] rounded-md border border-line bg-paper" role="img" aria-label="Plan of the flight track round the launch point, north up" data-testid="track-plan">
        <text x={SIZE - 20} y={22} textAnchor="middle" className="fill-ink text-[12px]">N ↑</text>
        {runs.map((r, i) => (
          <polyline key={i} points={r.pts} fill="none" className={TRACK_LINK_STYLE[r.state].className} strokeWidth={TRACK_LINK_STYLE[r.state].width} strokeDasharray={TRACK_LINK_STYLE[r.state].dash} strokeLinecap="round">
            <title>{TRACK_LINK_STYLE[r.state].word}</title>
          </polyline>
        ))}
        {/* the launch point: a square with a dot */}
        <rect x={SIZE / 2 - 6} y={SIZE / 2 - 6} width={12} height={12} className="fill-paper stroke-ink" strokeWidth={1.5} />
        <circle cx={SIZE / 2} cy={SIZE / 2} r={2} className="fill-ink" />
        <text x={SIZE / 2 + 9} y={SIZE / 2 + 16} className="fill-ink text-[11px]">Launch</text>
        {events.map((e) => {
          const ex = x(e.east);
          const ey = y(e.north);
          const shape = LINK_EVENT_META[e.event].shape;
          return (
            <g key={e.key}>
              <title>{e.label}</title>
              {shape === "circle" && <circle cx={ex} cy={ey} r={6} className="fill-lake stroke-paper" strokeWidth={1.5} />}
              {shape === "triangle" && <path d={`M${ex} ${ey - 7} L${ex + 7} ${ey + 6} L${ex - 7} ${ey + 6} Z`} className="fill-bad stroke-paper" strokeWidth={1.5} />}
              {shape === "square" && <rect x={ex - 5.5} y={ey - 5.5} width={11} height={11} className="fill-ink stroke-paper" strokeWidth={1.5} />}
            </g>
          );
        })}
        {aircraft && (
          <g data-testid="track-aircraft" data-east={aircraft.east.toFixed(2)} data-north={aircraft.north.toFixed(2)}>
            <title>Aircraft at the player&apos;s moment</title>
            <circle cx={x(aircraft.east)} cy={y(aircraft.north)} r={9} fill="none" className="stroke-ink" strokeWidth={2.5} />
            <path d={`M${x(aircraft.east) - 13} ${y(aircraft.north)} H${x(aircraft.east) + 13} M${x(aircraft.east)} ${y(aircraft.north) - 13} V${y(aircraft.north) + 13}`} className="stroke-ink" strokeWidth={1.5} />
          </g>
        )}
        <g>
          <line x1={PAD} x2={PAD + barPx} y1={SIZE - 16} y2={SIZE - 16} className="stroke-ink" strokeWidth={2} />
          <line x1={PAD} x2={PAD} y1={SIZE - 20} y2={SIZE - 12} className="stroke-ink" strokeWidth={2} />
          <line x1={PAD + barPx} x2={PAD + barPx} y1={SIZE - 20} y2={SIZE - 12} className="stroke-ink" strokeWidth={2} />
          <text x={PAD + barPx / 2} y={SIZE - 22} textAnchor="middle" className="fill-ink font-mono text-[11px]">
            {bar.toLocaleString("en-US")} {units}
          </text>
        </g>
      </svg>
      <figcaption className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-2">
        {(Object.keys(TRACK_LINK_STYLE) as TrackLinkState[])
          .filter((s) => present.has(s))
          .map((s) => (
            <span key={s} className="inline-flex items-center gap-1.5">
              <svg width="28" height="8" aria-hidden>
                <line x1="1" x2="27" y1="4" y2="4" className={TRACK_LINK_STYLE[s].className} strokeWidth={TRACK_LINK_STYLE[s].width} strokeDasharray={TRACK_LINK_STYLE[s].dash} />
              </svg>
              {TRACK_LINK_STYLE[s].word} ({TRACK_LINK_STYLE[s].legend})
            </span>
          ))}
        <span>□ launch point · ⊕ aircraft · farthest point {formatMetresIn(Math.max(0, ...points.map((p) => p.d)), units)} from launch</span>
      </figcaption>
    </figure>
  );
}
