"use client";
// Ground distance from the launch point against the track's time, with the link state as a band under it
// (solid: clear picture, hatched: breaking up, empty dashed box: video lost, as components/trace/trace-band.tsx
// draws it), the link events as their shapes, and a line where the player is.
import { useId } from "react";
import { fromMetres } from "@/lib/geo";
import { roundLengthBelow } from "@/lib/range-checks/plan-projection";
import { LINK_EVENT_META, type LinkEvent } from "@/lib/range-checks/link-events";
import type { DisplayPoint } from "@/lib/tracks/display-at";
import type { DisplayUnits } from "@/lib/validation/range-checks";

const W = 640;
const H = 220;
const L = 52;
const R = 12;
const T = 12;
const PLOT_H = 150;
const BAND_Y = T + PLOT_H + 18;
const BAND_H = 14;

export type ChartEvent = { key: string; event: LinkEvent; t: number; d: number; label: string };

export function DistanceChart({ points, events, nowT, units }: { points: DisplayPoint[]; events: ChartEvent[]; nowT: number | null; units: DisplayUnits }) {
  const hatch = useId().replace(/:/g, "");
  if (points.length < 2) return null;
  const t0 = points[0].t;
  const t1 = points[points.length - 1].t;
  const maxD = Math.max(10, ...points.map((p) => p.d));
  const x = (t: number) => L + ((t - t0) / (t1 - t0)) * (W - L - R);
  const y = (d: number) => T + PLOT_H - (d / maxD) * PLOT_H;
  const step = roundLengthBelow(fromMetres(maxD, units) / 2);
  const ticks = [0, 1, 2].map((k) => k * step).filter((v) => v <= fromMetres(maxD, units));
  const path = points.map((p, i) => `${i ? "L" : "M"}${x(p.t).toFixed(1)} ${y(p.d).toFixed(1)}`).join(" ");
  const band: { state: DisplayPoint["state"]; from: number; to: number }[] = [];
  for (const p of points) {
    const last = band[band.length - 1];
    if (last && last.state === p.state) last.to = p.t;
    else band.push({ state: p.state, from: last ? last.to : p.t, to: p.t });
  }
  const minutes = (t1 - t0) / 60_000;
  return (
    <figure className="flex flex-col gap-1">
      <svg viewBox={`0 0 ${W} ${H}`} className="w-full max-w-3xl rounded-md border border-line bg-paper" role="img" aria-label={`Ground distance from the launch point over ${minutes.toFixed(1)} minutes of track, with the link state under it`} data-testid="distance-chart">
        <defs>
          <pattern id={hatch} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <line x1="0" y1="0" x2="0" y2="6" className="stroke-warn" strokeWidth="2.5" />
          </pattern>
        </defs>
        {ticks.map((v) => (
          <g key={v}>
            <line x1={L} x2={W - R} y1={y(v / fromMetres(1, units))} y2={y(v / fromMetres(1, units))} className="stroke-line" strokeWidth={1} />
            <text x={L - 6} y={y(v / fromMetres(1, units)) + 4} textAnchor="end" className="fill-ink-2 font-mono text-[10px]">
              {v.toLocaleString("en-US")} {units}
            </text>
          </g>
        ))}
        <path d={path} fill="none" className="stroke-ink" strokeWidth={1.75} />
        {events.map((e) => {
          const ex = x(e.t);
          const ey = y(e.d);
          const shape = LINK_EVENT_META[e.event].shape;
          return (
            <g key={e.key}>
              <title>{e.label}</title>
              {shape === "circle" && <circle cx={ex} cy={ey} r={5} className="fill-lake" />}
              {shape === "triangle" && <path d={`M${ex} ${ey - 6} L${ex + 6} ${ey + 5} L${ex - 6} ${ey + 5} Z`} className="fill-bad" />}
              {shape === "square" && <rect x={ex - 4.5} y={ey - 4.5} width={9} height={9} className="fill-ink" />}
            </g>
          );
        })}
        {band.map((b, i) => {
          const bx = x(b.from);
          const bw = Math.max(1, x(b.to) - bx);
          if (b.state === "intact") return <rect key={i} x={bx} y={BAND_Y} width={bw} height={BAND_H} className="fill-lake"><title>Clear picture</title></rect>;
          if (b.state === "damaged") return <rect key={i} x={bx} y={BAND_Y} width={bw} height={BAND_H} fill={`url(#${hatch})`} className="stroke-warn" strokeWidth={1}><title>Picture breaking up</title></rect>;
          if (b.state === "lost") return <rect key={i} x={bx} y={BAND_Y} width={bw} height={BAND_H} fill="none" className="stroke-bad" strokeWidth={1.5} strokeDasharray="3 2"><title>Video lost</title></rect>;
          return <line key={i} x1={bx} x2={bx + bw} y1={BAND_Y + BAND_H / 2} y2={BAND_Y + BAND_H / 2} className="stroke-line" strokeWidth={1}><title>Not recorded</title></line>;
        })}
        <text x={L - 6} y={BAND_Y + 11} textAnchor="end" className="fill-ink-2 text-[10px]">Link</text>
        <text x={L} y={H - 4} className="fill-ink-2 font-mono text-[10px]">{new Date(t0).toISOString().slice(11, 19)} UTC</text>
        <text x={W - R} y={H - 4} textAnchor="end" className="fill-ink-2 font-mono text-[10px]">{new Date(t1).toISOString().slice(11, 19)} UTC</text>
        {nowT !== null && nowT >= t0 && nowT <= t1 && <line x1={x(nowT)} x2={x(nowT)} y1={T} y2={BAND_Y + BAND_H} className="stroke-ink" strokeWidth={1.5} strokeDasharray="2 2" data-testid="chart-now" />}
      </svg>
      <figcaption className="text-xs text-ink-2">
        Ground distance from the launch point (WGS84) against the track&apos;s time. Band: solid = clear picture, hatched = picture breaking up, empty dashed box = video lost, thin line = not recorded.
      </figcaption>
    </figure>
  );
}
