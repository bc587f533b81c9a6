// Where the aircraft is drawn at a moment of the track's clock, from the display points the track view
// sends (plan metres east/north of the launch, height, ground distance): linear between the two points
// around the moment, like lib/tracks/track-position-at.ts on the full track; null outside the track or
// in a gap longer than MAX_GAP_MS.
import { lastPointAtOrBefore, MAX_GAP_MS } from "./track-position-at";

export type DisplayPoint = { t: number; east: number; north: number; h: number | null; d: number; state: "intact" | "damaged" | "lost" | "unrecorded" };

export function displayAt(points: readonly DisplayPoint[], t: number): (Omit<DisplayPoint, "t"> & { t: number }) | null {
  if (!points.length || t < points[0].t || t > points[points.length - 1].t) return null;
  const lo = lastPointAtOrBefore(points, t);
  const a = points[lo];
  if (a.t === t || lo === points.length - 1) return a;
  const b = points[lo + 1];
  if (b.t - a.t > MAX_GAP_MS * 4) return null; // display points are thinned; allow a few original gaps' worth
  const f = (t - a.t) / (b.t - a.t);
  const east = a.east + (b.east - a.east) * f;
  const north = a.north + (b.north - a.north) * f;
  return { t, east, north, h: a.h === null || b.h === null ? null : a.h + (b.h - a.h) * f, d: Math.hypot(east, north), state: f < 0.5 ? a.state : b.state };
}
