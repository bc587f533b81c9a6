import { describe, expect, it } from "vitest";
import geographiclib from "geographiclib-geodesic";
import { fromPlan, roundLengthBelow, toPlan } from "@/lib/range-checks/plan-projection";

// GeographicLib (C. F. F. Karney) is the outside reference: an azimuthal equidistant plan keeps every
// geodesic distance and azimuth from its centre.
const wgs84 = geographiclib.Geodesic.WGS84;
const centre = { lat: 54.41237, lon: -2.61942 };

describe("site plan projection", () => {
  it("puts a point at its geodesic distance and azimuth from the centre", () => {
    const p = { lat: 54.41301, lon: -2.61955 };
    const { east, north } = toPlan(centre, p);
    const ref = wgs84.Inverse(centre.lat, centre.lon, p.lat, p.lon);
    expect(Math.hypot(east, north)).toBeCloseTo(ref.s12, 9);
    expect((Math.atan2(east, north) * 180) / Math.PI).toBeCloseTo(ref.azi1, 9);
  });

  it("draws a point due north straight up and one due east straight right", () => {
    const north = wgs84.Direct(centre.lat, centre.lon, 0, 250);
    const east = wgs84.Direct(centre.lat, centre.lon, 90, 250);
    const n = toPlan(centre, { lat: north.lat2, lon: north.lon2 });
    const e = toPlan(centre, { lat: east.lat2, lon: east.lon2 });
    expect(n.east).toBeCloseTo(0, 9);
    expect(n.north).toBeCloseTo(250, 9);
    expect(e.east).toBeCloseTo(250, 9);
    expect(e.north).toBeCloseTo(0, 6);
  });

  it("turns a click on the plan back into the same coordinates", () => {
    for (const offset of [{ east: 120, north: -340 }, { east: -2500, north: 1800 }, { east: 0.4, north: 0 }]) {
      const point = fromPlan(centre, offset);
      const back = toPlan(centre, point);
      expect(back.east).toBeCloseTo(offset.east, 6);
      expect(back.north).toBeCloseTo(offset.north, 6);
    }
  });

  it("returns the centre for a click on the centre", () => {
    expect(fromPlan(centre, { east: 0, north: 0 })).toEqual(centre);
  });
});

describe("roundLengthBelow", () => {
  it.each([
    [1, 1],
    [1.9, 1],
    [2, 2],
    [4.99, 2],
    [5, 5],
    [9.99, 5],
    [10, 10],
    [0.3, 0.2],
    [130, 100],
    [260, 200],
    [777, 500],
    [1640.42, 1000],
  ])("%d -> %d", (limit, expected) => {
    expect(roundLengthBelow(limit)).toBeCloseTo(expected, 12);
  });

  it("refuses zero, negatives and non-numbers", () => {
    for (const bad of [0, -1, Number.NaN, Number.POSITIVE_INFINITY]) expect(() => roundLengthBelow(bad)).toThrow(RangeError);
  });
});
