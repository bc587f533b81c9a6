"use client";
// A scaled plan of the site drawn from its coordinates alone (no map tiles: the field has no signal):
// site marker, launch point, target, distance rings round the launch point, north arrow, scale bar.
// Click to place the target; or focus the plan and move the target with the arrow keys.
import { useId, useMemo, useRef, useState } from "react";
import { fromMetres, inverse, toMetres, type GeoPoint } from "@/lib/geo";
import { fromPlan, roundLengthBelow, toPlan } from "@/lib/range-checks/plan-projection";
import { formatBearing, formatMetresIn } from "@/lib/range-checks/format-figures";
import type { DisplayUnits } from "@/lib/validation/range-checks";

const SIZE = 480;
const C = SIZE / 2;
const DRAW_RADIUS = 210; // px from the centre to the plan's edge
// plan radii in metres; zoom steps through them
const RADII = [25, 50, 100, 200, 500, 1000, 2000, 5000, 10_000, 20_000, 50_000];

const START_RADIUS = 500; // m: room for a typical visual-line-of-sight flight round the site

const farthest = (points: (GeoPoint | null)[], centre: GeoPoint) =>
  Math.max(0, ...points.filter((p): p is GeoPoint => p !== null).map((p) => inverse(centre.lat, centre.lon, p.lat, p.lon).distanceM));

function fitRadius(points: (GeoPoint | null)[], centre: GeoPoint, least: number): number {
  const need = Math.max(least, farthest(points, centre) * 1.25);
  return RADII.find((r) => r >= need) ?? RADII[RADII.length - 1];
}

export function SitePlan({
  centre,
  siteName,
  launch,
  target,
  units,
  onPickTarget,
}: {
  centre: GeoPoint;
  siteName: string;
  launch: GeoPoint | null;
  target: GeoPoint | null;
  units: DisplayUnits;
  onPickTarget: (p: GeoPoint) => void;
}) {
  // the scale stays put while the pilot clicks and types (a plan that rescales under the cursor misleads);
  // it changes only on zoom or "Fit"
  const [radius, setRadius] = useState(() => fitRadius([launch, target], centre, START_RADIUS));
  const svgRef = useRef<SVGSVGElement>(null);
  const helpId = useId();
  const scale = DRAW_RADIUS / radius; // px per metre
  const toPx = (p: GeoPoint) => {
    const { east, north } = toPlan(centre, p);
    return { x: C + east * scale, y: C - north * scale };
  };
  const origin = launch ?? centre;
  const originPx = toPx(origin);

  // rings round the launch point at round distances in the reader's unit
  const rings = useMemo(() => {
    const step = roundLengthBelow(fromMetres(radius, units) / 2);
    return [1, 2, 3, 4].map((k) => ({ label: `${(k * step).toLocaleString("en-US")} ${units}`, metres: toMetres(k * step, units) })).filter((r) => r.metres <= radius * 1.02);
  }, [radius, units]);
  const barLength = roundLengthBelow(fromMetres(radius, units) * 0.45);
  const barPx = toMetres(barLength, units) * scale;

  const zoom = (dir: 1 | -1) => {
    const i = RADII.indexOf(radius);
    setRadius(RADII[Math.min(RADII.length - 1, Math.max(0, i + dir))]);
  };
  const offPlan = farthest([launch, target], centre) > radius;

  const pickAt = (clientX: number, clientY: number) => {
    const rect = svgRef.current?.getBoundingClientRect();
    if (!rect) return;
    const x = ((clientX - rect.left) / rect.width) * SIZE;
    const y = ((clientY - rect.top) / rect.height) * SIZE;
    onPickTarget(fromPlan(centre, { east: (x - C) / scale, north: (C - y) / scale }));
  };

  const onKey = (e: React.KeyboardEvent) => {
    const moves: Record<string, [number, number]> = { ArrowUp: [0, 1], ArrowDown: [0, -1], ArrowLeft: [-1, 0], ArrowRight: [1, 0] };
    const move = moves[e.key];
    if (e.key === "+" || e.key === "=") return zoom(-1);
    if (e.key === "-") return zoom(1);
    if (!move) return;
    e.preventDefault();
    // one step is a fiftieth of the plan, ten times that with Shift
    const step = (radius / 50) * (e.shiftKey ? 10 : 1);
    const from = toPlan(centre, target ?? origin);
    onPickTarget(fromPlan(centre, { east: from.east + move[0] * step, north: from.north + move[1] * step }));
  };

  const targetPx = target ? toPx(target) : null;
  const leg = launch && target ? inverse(launch.lat, launch.lon, target.lat, target.lon) : null;
  const sitePx = toPx(centre);

  return (
    <div className="flex flex-col gap-2">
      <div
        tabIndex={0}
        role="application"
        aria-roledescription="site plan"
        aria-label={`Plan of ${siteName}. Click to place the target, or use the arrow keys (Shift for bigger steps); plus and minus zoom.`}
        aria-describedby={helpId}
        onKeyDown={onKey}
        className="rounded-md border border-line bg-white dark:bg-paper-2"
      >
        <svg
          ref={svgRef}
          viewBox={`0 0 ${SIZE} ${SIZE}`}
          className="block h-auto w-full max-w-[480px] cursor-crosshair touch-manipulation"
          onClick={(e) => pickAt(e.clientX, e.clientY)}
          data-testid="site-plan"
        >
          <title>{`Plan of ${siteName}, ${formatMetresIn(radius, units, 0)} from centre to edge`}</title>
          {/* plan edge */}
          <circle cx={C} cy={C} r={DRAW_RADIUS} className="fill-none stroke-line" strokeWidth="1" />
          {/* distance rings round the launch point */}
          {rings.map((r) => (
            <g key={r.label}>
              <circle cx={originPx.x} cy={originPx.y} r={r.metres * scale} className="fill-none stroke-ink-2" strokeWidth="0.8" strokeDasharray="3 4" />
              <text x={originPx.x + r.metres * scale * 0.7071 + 3} y={originPx.y - r.metres * scale * 0.7071 - 3} className="fill-ink-2 font-mono" fontSize="11">
                {r.label}
              </text>
            </g>
          ))}
          {/* site marker: a small cairn */}
          <g aria-hidden>
            <rect x={sitePx.x - 8} y={sitePx.y - 1} width="16" height="6" rx="3" className="fill-ink" />
            <rect x={sitePx.x - 5.5} y={sitePx.y - 7} width="11" height="5" rx="2.5" className="fill-ink" />
            <rect x={sitePx.x - 3} y={sitePx.y - 12} width="6" height="4" rx="2" className="fill-ink" />
          </g>
          <text x={sitePx.x + 11} y={sitePx.y + 4} className="fill-ink" fontSize="12">
            Site
          </text>
          {/* launch to target */}
          {targetPx && launch && (
            <line x1={originPx.x} y1={originPx.y} x2={targetPx.x} y2={targetPx.y} className="stroke-lake" strokeWidth="2" />
          )}
          {launch && (
            <g>
              <path d={`M ${originPx.x} ${originPx.y - 8} L ${originPx.x + 7} ${originPx.y + 5} L ${originPx.x - 7} ${originPx.y + 5} Z`} className="fill-lake stroke-white" strokeWidth="1" />
              <text x={originPx.x - 10} y={originPx.y + 19} className="fill-ink" fontSize="12">
                Launch
              </text>
            </g>
          )}
          {targetPx && (
            <g>
              <circle cx={targetPx.x} cy={targetPx.y} r="7" className="fill-none stroke-bad" strokeWidth="2" />
              <path d={`M ${targetPx.x - 11} ${targetPx.y} H ${targetPx.x + 11} M ${targetPx.x} ${targetPx.y - 11} V ${targetPx.y + 11}`} className="stroke-bad" strokeWidth="1.5" />
              <text x={targetPx.x + 10} y={targetPx.y - 10} className="fill-ink" fontSize="12">
                Target
              </text>
            </g>
          )}
          {/* north arrow */}
          <g transform={`translate(${SIZE - 34} 40)`} aria-hidden>
            <path d="M 0 -22 L 8 4 L 0 -2 L -8 4 Z" className="fill-ink" />
            <text x="0" y="20" textAnchor="middle" className="fill-ink" fontSize="13" fontWeight="600">
              N
            </text>
          </g>
          {/* scale bar */}
          <g transform={`translate(20 ${SIZE - 24})`}>
            <rect x="0" y="0" width={barPx / 2} height="6" className="fill-ink" />
            <rect x={barPx / 2} y="0" width={barPx / 2} height="6" className="fill-white stroke-ink" strokeWidth="1" />
            <text x="0" y="-5" className="fill-ink font-mono" fontSize="11">
              0
            </text>
            <text x={barPx} y="-5" textAnchor="end" className="fill-ink font-mono" fontSize="11" data-testid="scale-bar-label">
              {`${barLength.toLocaleString("en-US")} ${units}`}
            </text>
          </g>
        </svg>
      </div>
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <button type="button" className="min-h-10 rounded-md border border-line px-3" onClick={() => zoom(-1)} disabled={radius === RADII[0]}>
          Zoom in
        </button>
        <button type="button" className="min-h-10 rounded-md border border-line px-3" onClick={() => zoom(1)} disabled={radius === RADII[RADII.length - 1]}>
          Zoom out
        </button>
        <button type="button" className="min-h-10 rounded-md border border-line px-3" onClick={() => setRadius(fitRadius([launch, target], centre, RADII[0]))} disabled={!launch && !target}>
          Fit launch and target
        </button>
        {offPlan && (
          <span role="status" className="text-warn">
            The launch point or target lies outside the plan: choose “Fit launch and target”.
          </span>
        )}
      </div>
      <p id={helpId} className="text-xs text-ink-2" aria-live="polite">
        {leg && target
          ? `Target ${formatMetresIn(leg.distanceM, units)} from launch, bearing ${formatBearing(leg.initialBearingDeg)}.`
          : launch
            ? "No target yet: click the plan or use the arrow keys to place one."
            : "Give a launch point to draw the distance from it."}{" "}
        Plan drawn from coordinates; distances and bearings from the centre are true (azimuthal equidistant).
      </p>
    </div>
  );
}
