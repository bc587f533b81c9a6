// Every flight in a picker reads differently (the issue: one job's three flights of a day were
// three identical lines). Cairn's own rule, no outside source.
import { describe, expect, it } from "vitest";
import { labelFlights } from "@/components/range/flight-labels";

const f = (id: string, flownOn: string, jobTitle: string, siteName: string, aircraft: string | null = null) => ({ id, flownOn, jobTitle, siteName, aircraft });

describe("labelFlights", () => {
  it("numbers the flights of one job on one day and names the site", () => {
    const labels = labelFlights([
      f("a1111111-0000", "2026-12-01", "Storm damage claim, terrace roofs", "Lower terrace"),
      f("b2222222-0000", "2026-12-01", "Storm damage claim, terrace roofs", "Lower terrace"),
      f("c3333333-0000", "2026-12-01", "Storm damage claim, terrace roofs", "Lower terrace", "Quad 7"),
      f("d4444444-0000", "2026-11-30", "Storm damage claim, terrace roofs", "Lower terrace"),
    ]);
    expect(labels.get("a1111111-0000")).toBe("2026-12-01 · Storm damage claim, terrace roofs · Lower terrace · flight 1 of 3 that day");
    expect(labels.get("c3333333-0000")).toBe("2026-12-01 · Storm damage claim, terrace roofs · Lower terrace · flight 3 of 3 that day · Quad 7");
    expect(labels.get("d4444444-0000")).toBe("2026-11-30 · Storm damage claim, terrace roofs · Lower terrace");
    expect(new Set(labels.values()).size).toBe(4);
  });
  it("keeps labels apart when two jobs share a title at one site", () => {
    const labels = labelFlights([f("aaaaaaaa-1", "2026-12-01", "Roof check", "Yard"), f("bbbbbbbb-2", "2026-12-01", "Roof check", "Yard")]);
    expect(new Set(labels.values()).size).toBe(2);
  });
});
