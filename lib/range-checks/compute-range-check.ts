import { GeoInputError, direct, inverse, normalizeBearing, slantRange, type GeoPoint } from "@/lib/geo";

/**
 * The figures of one range check, all in metres and degrees, computed from what the pilot measured.
 * A position is given one of two ways, because recorders keep no telemetry and pilots work from
 * whatever they have: the coordinates of the point under the aircraft (read off a map or a GNSS
 * display), or a ground distance and bearing from the launch point (paced out, or a laser
 * rangefinder and compass). Whichever is given, the other is derived on the WGS84 ellipsoid from the
 * flight's launch point, so every stored row can be compared with every other.
 */

export type PositionInput =
  | { readonly by: "coordinates"; readonly latitude: number; readonly longitude: number }
  | { readonly by: "distance"; readonly groundDistanceM: number; readonly bearingDeg: number | null };

export type RangeCheckFigures = {
  readonly latitude: number | null;
  readonly longitude: number | null;
  readonly groundDistanceM: number;
  readonly bearingDeg: number | null;
  readonly heightAglM: number;
  readonly slantRangeM: number;
};

/**
 * Field names in the errors are the form's (latitude, groundDistance, heightAgl...), so a route
 * handler can hand them straight back as field errors.
 */
export function computeRangeCheckFigures(launch: GeoPoint | null, position: PositionInput, heightAglM: number): RangeCheckFigures {
  if (!Number.isFinite(heightAglM) || heightAglM < 0) {
    throw new GeoInputError("heightAgl", "Height above ground must be a number, zero or more.");
  }
  if (position.by === "coordinates") {
    if (!launch) {
      throw new GeoInputError(
        "latitude",
        "This flight has no launch point, so a distance cannot be measured from these coordinates. Add the launch point to the flight, or give a ground distance instead.",
      );
    }
    const { distanceM, initialBearingDeg } = inverse(launch.lat, launch.lon, position.latitude, position.longitude);
    return {
      latitude: position.latitude,
      longitude: position.longitude,
      groundDistanceM: distanceM,
      bearingDeg: initialBearingDeg,
      heightAglM,
      slantRangeM: slantRange({ groundDistance: distanceM, heightAgl: heightAglM }),
    };
  }
  const { groundDistanceM, bearingDeg } = position;
  if (!Number.isFinite(groundDistanceM) || groundDistanceM < 0) {
    throw new GeoInputError("groundDistance", "Ground distance must be a number, zero or more.");
  }
  const bearing = bearingDeg === null ? null : normalizeBearing(bearingDeg);
  // Without a launch point (or a bearing) the position stays a distance only: still enough for the slant range.
  const point = launch && bearing !== null ? direct(launch.lat, launch.lon, bearing, groundDistanceM) : null;
  return {
    latitude: point?.lat ?? null,
    longitude: point?.lon ?? null,
    groundDistanceM,
    bearingDeg: bearing,
    heightAglM,
    slantRangeM: slantRange({ groundDistance: groundDistanceM, heightAgl: heightAglM }),
  };
}
