import { describe, expect, it } from "vitest";
import geographiclib from "geographiclib-geodesic";
import { demoRangeChecks } from "@/lib/range-checks/demo-range-checks";
import { DEMO_FLIGHTS } from "@/db/seed/demo-scenario";

const wgs84 = geographiclib.Geodesic.WGS84;
const ids = Object.fromEntries(DEMO_FLIGHTS.map((f, i) => [f.key, `00000000-0000-4000-8000-00000000000${i}`]));

describe("demoRangeChecks", () => {
  const rows = demoRangeChecks("org-id", ids, "user-id");

  it("gives every demo flight all three link events", () => {
    for (const f of DEMO_FLIGHTS) {
      expect(rows.filter((r) => r.flightId === ids[f.key]).map((r) => r.event).sort()).toEqual(["first_degradation", "reacquired", "total_loss"]);
    }
  });

  it("stores figures that agree with each other: coordinates at the stated distance (GeographicLib), slant by Pythagoras", () => {
    for (const r of rows) {
      const flight = DEMO_FLIGHTS.find((f) => ids[f.key] === r.flightId)!;
      const back = wgs84.Inverse(flight.launch[0], flight.launch[1], r.latitude!, r.longitude!);
      expect(Math.abs(back.s12 - r.groundDistanceM)).toBeLessThan(1e-6);
      expect(r.slantRangeM).toBeCloseTo(Math.hypot(r.groundDistanceM, r.heightAglM), 9);
    }
  });

  it("skips flights the seed did not create", () => {
    expect(demoRangeChecks("org-id", { "tower-f1": ids["tower-f1"] })).toHaveLength(3);
  });
});
