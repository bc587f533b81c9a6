// The checks every track passes, whatever its format: coordinates on the WGS84 ellipsoid's range, times in
// strict order, no two points at the same time. Each problem names the point and its line.
import { MAX_PROBLEMS, MAX_TRACK_POINTS, type TrackPoint, type TrackProblem } from "./track-types";

export type LocatedPoint = TrackPoint & { readonly line: number | null };

export function checkCoordinates(lat: number, lon: number): string | null {
  if (!Number.isFinite(lat) || lat < -90 || lat > 90) return `the latitude ${lat} is outside -90 to 90 degrees`;
  // GPX 1.1 longitudeType: -180 <= value < 180 (the schema's minInclusive/maxExclusive)
  if (!Number.isFinite(lon) || lon < -180 || lon >= 180) return `the longitude ${lon} is outside -180 to 180 degrees`;
  return null;
}

/** Problems of order and duplicates, numbered from point 1. */
export function checkPointOrder(points: readonly LocatedPoint[]): TrackProblem[] {
  const problems: TrackProblem[] = [];
  if (points.length > MAX_TRACK_POINTS) {
    problems.push({ line: null, point: null, reason: `the track has ${points.length} points; at most ${MAX_TRACK_POINTS} are read` });
    return problems;
  }
  for (let i = 1; i < points.length && problems.length < MAX_PROBLEMS; i++) {
    const prev = points[i - 1];
    const p = points[i];
    if (p.t === prev.t) {
      problems.push({ line: p.line, point: i + 1, reason: `the time ${iso(p.t)} is the same as point ${i}'s; each point needs its own time` });
    } else if (p.t < prev.t) {
      problems.push({ line: p.line, point: i + 1, reason: `the time ${iso(p.t)} is earlier than point ${i}'s (${iso(prev.t)}); points must be in time order` });
    }
  }
  return problems;
}

export const iso = (ms: number) => new Date(ms).toISOString();
