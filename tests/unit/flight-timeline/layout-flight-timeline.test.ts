// Widths of the flight timeline: proportional to seconds, with floors for tiny files and unknown gaps,
// summing to the whole width. Worked by hand.
import { describe, expect, it } from "vitest";
import { layoutFlightTimeline } from "@/components/flight-timeline/layout-flight-timeline";

describe("layoutFlightTimeline", () => {
  it("is proportional to seconds when nothing is tiny", () => {
    const w = layoutFlightTimeline([
      { kind: "file", seconds: 60 },
      { kind: "gap", seconds: 20 },
      { kind: "file", seconds: 120 },
    ]);
    expect(w.map((x) => +x.toFixed(6))).toEqual([30, 10, 60]);
  });

  it("gives unknown gaps and tiny files a floor, and always fills 100 %", () => {
    const w = layoutFlightTimeline([
      { kind: "file", seconds: 1200 },
      { kind: "gap", seconds: null },
      { kind: "file", seconds: 2 },
    ]);
    expect(w[1]).toBeGreaterThan(0);
    expect(w[2]).toBeGreaterThan(2);
    expect(w.reduce((a, b) => a + b, 0)).toBeCloseTo(100, 9);
  });
});
