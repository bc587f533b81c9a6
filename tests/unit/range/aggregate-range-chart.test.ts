import { describe, expect, it } from "vitest";
import { aggregateRangeChart, median, NOT_RECORDED, EVENT_OFFSET, type ChartInputRow } from "@/lib/range-checks/aggregate-range-chart";

let n = 0;
const row = (event: ChartInputRow["event"], slantRangeM: number, over: Partial<ChartInputRow> = {}): ChartInputRow => ({
  id: `rc-${++n}`,
  event,
  slantRangeM,
  cameraOrientation: "Pitched up",
  antennaOrientation: "Vertical",
  aircraft: "Airframe A",
  ...over,
});

describe("median", () => {
  it("takes the middle value, or the mean of the two middle values", () => {
    expect(median([3])).toBe(3);
    expect(median([9, 1, 5])).toBe(5);
    expect(median([4, 1, 3, 2])).toBe(2.5);
  });
  it("refuses an empty list", () => {
    expect(() => median([])).toThrow();
  });
});

describe("aggregateRangeChart", () => {
  const rows = [
    row("first_degradation", 400),
    row("first_degradation", 500),
    row("first_degradation", 450),
    row("total_loss", 600),
    row("reacquired", 480),
    row("first_degradation", 300, { cameraOrientation: "pitched  UP " }),
    row("total_loss", 380, { cameraOrientation: "Level" }),
    row("total_loss", 390, { cameraOrientation: null }),
    row("total_loss", 395, { cameraOrientation: "   " }),
  ];

  it("groups by the chosen variable, folding case and spacing, named groups alphabetically and 'Not recorded' last", () => {
    const data = aggregateRangeChart(rows, "cameraOrientation");
    expect(data.groups.map((g) => g.label)).toEqual(["Level", "Pitched up", NOT_RECORDED]);
    expect(data.groups.map((g) => g.index)).toEqual([0, 1, 2]);
  });

  it("gives count, min, median and max per event in each group", () => {
    const up = aggregateRangeChart(rows, "cameraOrientation").groups[1];
    // hand arithmetic: 300, 400, 450, 500 -> median (400 + 450) / 2 = 425
    expect(up.stats.first_degradation).toEqual({ count: 4, minM: 300, medianM: 425, maxM: 500 });
    expect(up.stats.total_loss).toEqual({ count: 1, minM: 600, medianM: 600, maxM: 600 });
    expect(up.stats.reacquired).toEqual({ count: 1, minM: 480, medianM: 480, maxM: 480 });
    const none = aggregateRangeChart(rows, "cameraOrientation").groups[2];
    expect(none.stats.first_degradation).toBeNull();
    expect(none.stats.total_loss).toEqual({ count: 2, minM: 390, medianM: 392.5, maxM: 395 });
  });

  it("places each point at its group index plus its event's offset, keeping every row", () => {
    const data = aggregateRangeChart(rows, "cameraOrientation");
    expect(data.points).toHaveLength(rows.length);
    for (const p of data.points) expect(p.x).toBeCloseTo(p.groupIndex + EVENT_OFFSET[p.event], 12);
    // the three events never share a position inside a group
    expect(new Set(Object.values(EVENT_OFFSET)).size).toBe(3);
  });

  it("regroups the same rows by another variable", () => {
    const data = aggregateRangeChart([row("total_loss", 100, { aircraft: "B" }), row("total_loss", 200, { aircraft: "A" })], "aircraft");
    expect(data.groups.map((g) => [g.label, g.stats.total_loss?.maxM])).toEqual([
      ["A", 200],
      ["B", 100],
    ]);
  });

  it("leaves out non-finite figures rather than drawing them", () => {
    const data = aggregateRangeChart([row("total_loss", Number.NaN), row("total_loss", 10)], "aircraft");
    expect(data.points).toHaveLength(1);
  });

  it("is empty for no rows", () => {
    expect(aggregateRangeChart([], "antennaOrientation")).toEqual({ dimension: "antennaOrientation", groups: [], points: [] });
  });
});
