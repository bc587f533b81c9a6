import { describe, expect, it } from "vitest";
import geographiclib from "geographiclib-geodesic";
import { computeRangeCheckFigures } from "@/lib/range-checks/compute-range-check";
import { feetToMetres, metresToFeet, GeoInputError } from "@/lib/geo";

// GeographicLib (C. F. F. Karney), called directly: the outside reference for every distance below.
const wgs84 = geographiclib.Geodesic.WGS84;
const launch = { lat: 54.41301, lon: -2.61955 };

describe("computeRangeCheckFigures from coordinates", () => {
  it("measures ground distance and bearing from the launch point as GeographicLib does", () => {
    const target = { latitude: 54.41012, longitude: -2.62511 };
    const f = computeRangeCheckFigures(launch, { by: "coordinates", ...target }, 40);
    const ref = wgs84.Inverse(launch.lat, launch.lon, target.latitude, target.longitude);
    expect(Math.abs(f.groundDistanceM - ref.s12)).toBeLessThan(1e-9);
    expect(f.bearingDeg).toBeCloseTo((ref.azi1 + 360) % 360, 12);
    expect(f.latitude).toBe(target.latitude);
    expect(f.longitude).toBe(target.longitude);
    // Pythagoras on GeographicLib's distance
    expect(f.slantRangeM).toBeCloseTo(Math.sqrt(ref.s12 ** 2 + 40 ** 2), 9);
  });

  it("refuses coordinates when the flight has no launch point, naming the latitude field", () => {
    try {
      computeRangeCheckFigures(null, { by: "coordinates", latitude: 54.4, longitude: -2.6 }, 40);
      expect.unreachable("should refuse");
    } catch (err) {
      expect(err).toBeInstanceOf(GeoInputError);
      expect((err as GeoInputError).field).toBe("latitude");
    }
  });
});

describe("computeRangeCheckFigures from ground distance and bearing", () => {
  it("places the point with GeographicLib Direct and reads back the same distance", () => {
    const f = computeRangeCheckFigures(launch, { by: "distance", groundDistanceM: 538, bearingDeg: 219 }, 40);
    const ref = wgs84.Direct(launch.lat, launch.lon, 219, 538);
    expect(f.latitude).toBeCloseTo(ref.lat2, 12);
    expect(f.longitude).toBeCloseTo(ref.lon2, 12);
    const back = wgs84.Inverse(launch.lat, launch.lon, f.latitude!, f.longitude!);
    expect(Math.abs(back.s12 - 538)).toBeLessThan(1e-6);
  });

  it("gives the field figure: 400 ft AGL over 1926 ft of ground is 1967.1 ft of slant range", () => {
    // common practice, no published source
    const f = computeRangeCheckFigures(null, { by: "distance", groundDistanceM: feetToMetres(1926), bearingDeg: null }, feetToMetres(400));
    expect(metresToFeet(f.slantRangeM).toFixed(1)).toBe("1967.1");
  });

  it("gives Pythagoras' 3-4-5 triangle: 6000 ft AGL over 8000 ft of ground is 10,000 ft", () => {
    // slant range = sqrt(AGL^2 + ground^2) (Pythagoras' theorem); the 3-4-5 right triangle scaled by 2000,
    // checkable by hand (docs/outside-checks.md): 6000 ft AGL, 8000 ft ground -> 10,000 ft
    const f = computeRangeCheckFigures(null, { by: "distance", groundDistanceM: feetToMetres(8000), bearingDeg: null }, feetToMetres(6000));
    expect(metresToFeet(f.slantRangeM)).toBeCloseTo(10_000, 9);
  });

  it("keeps a distance without a bearing, or without a launch point, as a distance only", () => {
    for (const [l, b] of [[launch, null], [null, 90]] as const) {
      const f = computeRangeCheckFigures(l, { by: "distance", groundDistanceM: 300, bearingDeg: b }, 0);
      expect(f.latitude).toBeNull();
      expect(f.longitude).toBeNull();
      expect(f.slantRangeM).toBe(300);
    }
  });

  it("writes a bearing of 360 as 0 (both are north)", () => {
    expect(computeRangeCheckFigures(launch, { by: "distance", groundDistanceM: 10, bearingDeg: 360 }, 0).bearingDeg).toBe(0);
  });

  it.each([
    ["heightAgl", { by: "distance", groundDistanceM: 10, bearingDeg: null }, -1],
    ["heightAgl", { by: "distance", groundDistanceM: 10, bearingDeg: null }, Number.NaN],
    ["groundDistance", { by: "distance", groundDistanceM: -5, bearingDeg: null }, 10],
    ["groundDistance", { by: "distance", groundDistanceM: Number.POSITIVE_INFINITY, bearingDeg: null }, 10],
  ] as const)("refuses a bad %s", (field, position, height) => {
    expect(() => computeRangeCheckFigures(launch, position, height)).toThrow(GeoInputError);
    try {
      computeRangeCheckFigures(launch, position, height);
    } catch (err) {
      expect((err as GeoInputError).field).toBe(field);
    }
  });
});
