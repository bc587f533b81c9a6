import { describe, expect, it } from "vitest";
import geographiclib from "geographiclib-geodesic";
import { findingDistances } from "@/lib/range-checks/finding-distances";
import { feetToMetres, metresToFeet } from "@/lib/geo";

// GeographicLib (C. F. F. Karney), called directly, is the outside reference for the ground leg.
const wgs84 = geographiclib.Geodesic.WGS84;
const launch = { lat: 54.4079, lon: -2.6246 };

describe("findingDistances", () => {
  it("gives the geodesic ground distance and bearing GeographicLib gives", () => {
    const finding = { latitude: 54.40811, longitude: -2.62517, heightAglM: 6 };
    const d = findingDistances(launch, finding)!;
    const ref = wgs84.Inverse(launch.lat, launch.lon, finding.latitude, finding.longitude);
    expect(Math.abs(d.groundDistanceM - ref.s12)).toBeLessThan(1e-9);
    expect(d.bearingDeg).toBeCloseTo((ref.azi1 + 360) % 360, 12);
    expect(d.slantDistanceM).toBeCloseTo(Math.hypot(ref.s12, 6), 9);
  });

  it("gives 10,000 ft slant for 6000 ft AGL on a point placed 8000 ft away (3-4-5 triangle)", () => {
    // Pythagoras on the 3-4-5 right triangle scaled by 2000, checkable by hand (docs/outside-checks.md):
    // 6000 ft AGL, 8000 ft ground -> 10,000 ft slant. The point is placed with
    // GeographicLib Direct, so the ground leg is 8000 ft to GeographicLib's accuracy.
    const p = wgs84.Direct(launch.lat, launch.lon, 47, feetToMetres(8000));
    const d = findingDistances(launch, { latitude: p.lat2, longitude: p.lon2, heightAglM: feetToMetres(6000) })!;
    expect(metresToFeet(d.groundDistanceM)).toBeCloseTo(8000, 6);
    expect(metresToFeet(d.slantDistanceM!)).toBeCloseTo(10_000, 6);
    expect(d.bearingDeg).toBeCloseTo(47, 9);
  });

  it("has no slant distance when the height is unknown", () => {
    for (const heightAglM of [null, undefined]) {
      const d = findingDistances(launch, { latitude: 54.41, longitude: -2.62, heightAglM })!;
      expect(d.slantDistanceM).toBeNull();
      expect(d.groundDistanceM).toBeGreaterThan(0);
    }
  });

  it("measures a point below the launch level (under a bridge deck) by the same straight line", () => {
    const p = wgs84.Direct(launch.lat, launch.lon, 90, 40);
    const below = findingDistances(launch, { latitude: p.lat2, longitude: p.lon2, heightAglM: -30 })!;
    // Pythagoras, the 3-4-5 triangle scaled by 10
    expect(below.slantDistanceM).toBeCloseTo(50, 6);
  });

  it("is null when the flight has no launch point", () => {
    expect(findingDistances(null, { latitude: 54.41, longitude: -2.62, heightAglM: 10 })).toBeNull();
  });

  it("refuses coordinates outside the globe instead of returning a figure", () => {
    expect(() => findingDistances(launch, { latitude: 91, longitude: 0 })).toThrow(/between -90 and 90/);
  });
});
