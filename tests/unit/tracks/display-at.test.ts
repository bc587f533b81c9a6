import { describe, expect, it } from "vitest";
import { displayAt, type DisplayPoint } from "@/lib/tracks/display-at";

const pts: DisplayPoint[] = [
  { t: 0, east: 0, north: 0, h: 0, d: 0, state: "intact" },
  { t: 1000, east: 30, north: 40, h: 10, d: 50, state: "damaged" },
  { t: 60_000, east: 30, north: 40, h: 10, d: 50, state: "lost" },
];

describe("the drawn aircraft position", () => {
  it("moves linearly between display points; its distance is the plan's hypotenuse (3-4-5 triangle, by hand)", () => {
    const p = displayAt(pts, 500)!;
    expect(p).toMatchObject({ east: 15, north: 20, h: 5, state: "damaged" });
    expect(p.d).toBeCloseTo(25, 12);
    expect(displayAt(pts, 1000)).toMatchObject({ east: 30, north: 40, state: "damaged" });
  });
  it("is absent outside the track and across a long gap", () => {
    expect(displayAt(pts, -1)).toBeNull();
    expect(displayAt(pts, 60_001)).toBeNull();
    expect(displayAt(pts, 30_000)).toBeNull();
  });
});
