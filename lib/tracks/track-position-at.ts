// Where the aircraft was at a moment of the track's clock: linear interpolation between the two track
// points around it (over a few metres and a second or two, a straight line between fixes is as good
// as any curve; common practice, no published source). A moment outside the track, or inside a gap
// longer than MAX_GAP_MS, has no position: a figure invented across a gap could put a break-up kilometres
// from where it happened.
import type { TrackPoint } from "./track-types";

/** The longest gap between two points that is still bridged, ms. */
export const MAX_GAP_MS = 5_000;

export type PositionAt =
  | { ok: true; lat: number; lon: number; h: number | null; /** the track point nearest in time, 0-based */ nearest: number; /** ms to it */ nearestMs: number }
  | { ok: false; reason: string };

/** Index of the last point at or before `t` (binary search; points in time order, t not before the first). */
export function lastPointAtOrBefore(points: readonly { t: number }[], t: number): number {
  let lo = 0;
  let hi = points.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (points[mid].t <= t) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

export function trackPositionAt(points: readonly TrackPoint[], t: number): PositionAt {
  if (!points.length) return { ok: false, reason: "the track has no points" };
  const first = points[0].t;
  const last = points[points.length - 1].t;
  if (t < first || t > last) return { ok: false, reason: `outside the track (it runs ${iso(first)} to ${iso(last)})` };
  const lo = lastPointAtOrBefore(points, t);
  const a = points[lo];
  if (a.t === t || lo === points.length - 1) return { ok: true, lat: a.lat, lon: a.lon, h: a.h, nearest: lo, nearestMs: Math.abs(t - a.t) };
  const b = points[lo + 1];
  if (b.t - a.t > MAX_GAP_MS) return { ok: false, reason: `in a gap of ${((b.t - a.t) / 1000).toFixed(1)} s between track points ${lo + 1} and ${lo + 2}` };
  const f = (t - a.t) / (b.t - a.t);
  const nearest = f < 0.5 ? lo : lo + 1;
  return {
    ok: true,
    lat: a.lat + (b.lat - a.lat) * f,
    // no track of a small drone crosses the antimeridian between two fixes a few seconds apart
    lon: a.lon + (b.lon - a.lon) * f,
    h: a.h === null || b.h === null ? null : a.h + (b.h - a.h) * f,
    nearest,
    nearestMs: Math.abs(t - points[nearest].t),
  };
}

const iso = (ms: number) => new Date(ms).toISOString();
