import { inverse, slantRange, type GeoPoint } from "@/lib/geo";

/**
 * How far a finding lies from the flight's launch point: the ground distance on the WGS84 ellipsoid
 * (GeographicLib), the initial bearing, and, when the height of the point above the launch ground is
 * known, the slant distance (Pythagoras). Called when a finding with a position is saved and when the
 * report prints it.
 *
 * `null` when the flight has no launch point: there is nothing to measure from, and a made-up origin
 * would put a wrong figure into a report.
 */

export type FindingPosition = {
  readonly latitude: number;
  readonly longitude: number;
  /**
   * Height of the point above the ground level at the launch point, metres; unknown when null/undefined.
   * Negative for a point below it (the underside of a bridge deck flown from the bank above).
   */
  readonly heightAglM?: number | null;
};

export type FindingDistances = {
  readonly groundDistanceM: number;
  /** Degrees clockwise from true north, [0, 360), as seen from the launch point. */
  readonly bearingDeg: number;
  /** Straight line from the launch point; null when the height is unknown. */
  readonly slantDistanceM: number | null;
};

export function findingDistances(launch: GeoPoint | null, finding: FindingPosition): FindingDistances | null {
  if (!launch) return null;
  const { distanceM, initialBearingDeg } = inverse(launch.lat, launch.lon, finding.latitude, finding.longitude);
  const height = finding.heightAglM;
  return {
    groundDistanceM: distanceM,
    bearingDeg: initialBearingDeg,
    // The straight line is as long below the launch level as above it.
    slantDistanceM: height === null || height === undefined ? null : slantRange({ groundDistance: distanceM, heightAgl: Math.abs(height) }),
  };
}
