import geographiclib from "geographiclib-geodesic";
import { requireFinite, requireLatitude, requireLongitude, requireNonNegative } from "./geo-input-error";

/**
 * Geodesics on the WGS84 ellipsoid, solved by GeographicLib (C. F. F. Karney, "Algorithms for geodesics",
 * J. Geodesy 87, 43-55, 2013): accurate to nanometres anywhere on Earth, including nearly antipodal
 * points where Vincenty's iteration fails to converge. This is the figure Cairn stores and shows;
 * haversine.ts is only for quick estimates.
 */

const wgs84 = geographiclib.Geodesic.WGS84;

export type InverseSolution = {
  /** Length of the shortest path on the ellipsoid, metres. */
  readonly distanceM: number;
  /** Direction of travel at the first point, degrees clockwise from true north, in [0, 360). */
  readonly initialBearingDeg: number;
  /** Direction of travel on arrival at the second point, degrees clockwise from true north, in [0, 360). */
  readonly finalBearingDeg: number;
};

export type GeoPoint = { readonly lat: number; readonly lon: number };

/** GeographicLib answers azimuths in [-180, 180]; people read compass bearings in [0, 360). */
export function normalizeBearing(deg: number): number {
  const b = deg % 360;
  const positive = b < 0 ? b + 360 : b;
  // -1e-15 + 360 rounds to 360, and -0 reads badly; both mean north.
  return positive >= 360 || Object.is(positive, -0) ? 0 : positive;
}

/** Distance and bearings between two points given in decimal degrees (latitude first). */
export function inverse(lat1: number, lon1: number, lat2: number, lon2: number): InverseSolution {
  requireLatitude("lat1", lat1);
  requireLongitude("lon1", lon1);
  requireLatitude("lat2", lat2);
  requireLongitude("lon2", lon2);
  const r = wgs84.Inverse(lat1, lon1, lat2, lon2);
  return {
    distanceM: r.s12,
    initialBearingDeg: normalizeBearing(r.azi1),
    finalBearingDeg: normalizeBearing(r.azi2),
  };
}

/**
 * The point reached by travelling `distanceM` metres along the geodesic leaving (lat, lon) on
 * `bearingDeg`. Used to place a range-check position from the launch point and a measured distance and
 * bearing. Longitude comes back in [-180, 180].
 */
export function direct(lat: number, lon: number, bearingDeg: number, distanceM: number): GeoPoint {
  requireLatitude("lat", lat);
  requireLongitude("lon", lon);
  requireFinite("bearingDeg", bearingDeg);
  requireNonNegative("distanceM", distanceM);
  const r = wgs84.Direct(lat, lon, bearingDeg, distanceM);
  return { lat: r.lat2, lon: r.lon2 };
}
