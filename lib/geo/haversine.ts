import { requireLatitude, requireLongitude } from "./geo-input-error";

/**
 * Mean Earth radius R1 = (2a + b) / 3 of the ellipsoid, 6,371,008.7714 m for GRS80 / WGS84
 * (H. Moritz, "Geodetic Reference System 1980", Bulletin Géodésique 54, 1980, adopted by the IUGG;
 * value recalled from memory, and checked in the tests against GeographicLib's WGS84 a and f),
 * rounded to 0.1 m.
 */
export const MEAN_EARTH_RADIUS_M = 6_371_008.8;

const DEG = Math.PI / 180;

/**
 * Great-circle distance on a sphere of radius R1, by the haversine formula (R. W. Sinnott, "Virtues of
 * the Haversine", Sky and Telescope 68(2), 159, 1984), which stays well conditioned for short lines
 * where the spherical law of cosines loses its digits.
 *
 * For quick estimates only (list views, sanity checks). The sphere differs from the ellipsoid by up to
 * about 0.56 %: worst on short north-south lines near the equator, where the meridian's radius of
 * curvature a(1 - e^2) = 6,335,439 m is furthest below R1. Stored and displayed figures use geodesic.ts.
 */
export function haversineDistanceM(lat1: number, lon1: number, lat2: number, lon2: number): number {
  requireLatitude("lat1", lat1);
  requireLongitude("lon1", lon1);
  requireLatitude("lat2", lat2);
  requireLongitude("lon2", lon2);
  const dLat = (lat2 - lat1) * DEG;
  const dLon = (lon2 - lon1) * DEG;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(lat1 * DEG) * Math.cos(lat2 * DEG) * Math.sin(dLon / 2) ** 2;
  // Rounding can push h a hair above 1 for antipodal points; asin would then return NaN.
  return 2 * MEAN_EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
}
