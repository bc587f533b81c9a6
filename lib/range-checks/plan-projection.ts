import { direct, inverse, type GeoPoint } from "@/lib/geo";

/**
 * The site plan is drawn in an azimuthal equidistant projection centred on the site: every point
 * sits at its true geodesic distance and bearing from the centre (GeographicLib inverse), and a click
 * on the plan goes back to coordinates along the same geodesic (GeographicLib direct). Over a site a
 * few kilometres across this is as good as a surveyor's local grid, and it needs no map tiles.
 */

/** Metres east and north of the centre, as drawn on the plan (north up). */
export type PlanOffset = { readonly east: number; readonly north: number };

export function toPlan(centre: GeoPoint, point: GeoPoint): PlanOffset {
  const { distanceM, initialBearingDeg } = inverse(centre.lat, centre.lon, point.lat, point.lon);
  const rad = (initialBearingDeg * Math.PI) / 180;
  return { east: distanceM * Math.sin(rad), north: distanceM * Math.cos(rad) };
}

export function fromPlan(centre: GeoPoint, offset: PlanOffset): GeoPoint {
  const distance = Math.hypot(offset.east, offset.north);
  if (distance === 0) return { lat: centre.lat, lon: centre.lon };
  // atan2(east, north): bearings run clockwise from north, the other way round from the maths convention.
  const bearing = (Math.atan2(offset.east, offset.north) * 180) / Math.PI;
  return direct(centre.lat, centre.lon, bearing, distance);
}

/**
 * The largest 1, 2 or 5 times a power of ten that does not exceed `limit`: the lengths a scale bar or
 * a distance ring can carry as a round label. `limit` must be positive.
 */
export function roundLengthBelow(limit: number): number {
  if (!Number.isFinite(limit) || limit <= 0) throw new RangeError(`roundLengthBelow needs a positive length, got ${limit}`);
  const power = 10 ** Math.floor(Math.log10(limit));
  // Multiply before comparing so 0.3 / 0.1 style float noise cannot drop a step.
  for (const step of [5, 2, 1]) if (step * power <= limit * (1 + 1e-12)) return step * power;
  return power;
}
