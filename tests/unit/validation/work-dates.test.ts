// Dates shown for jobs and flights are the site's calendar date; "overdue" is judged there too.
import { describe, expect, it } from "vitest";
import { isOverdue, isoDateIn } from "@/lib/filing/format-work-dates";
import { altitudeCautionsToShow, formatAltitude } from "@/lib/filing/format-altitude";

describe("isoDateIn", () => {
  it("gives the local calendar date of an instant", () => {
    const instant = new Date("2026-03-14T23:30:00Z");
    expect(isoDateIn(instant, "UTC")).toBe("2026-03-14");
    // Pacific/Auckland is UTC+13 in March (NZ daylight time until the first Sunday of April; IANA tz database)
    expect(isoDateIn(instant, "Pacific/Auckland")).toBe("2026-03-15");
    // America/New_York is UTC-4 after the second Sunday of March (US Energy Policy Act of 2005 rules)
    expect(isoDateIn("2026-03-15T03:30:00Z", "America/New_York")).toBe("2026-03-14");
  });
});

describe("isOverdue", () => {
  const now = new Date("2026-03-14T23:30:00Z");
  it("compares the due date with today at the site", () => {
    expect(isOverdue("2026-03-14", "planned", "UTC", now)).toBe(false);
    expect(isOverdue("2026-03-13", "planned", "UTC", now)).toBe(true);
    // already the 15th in Auckland: due on the 14th is past there
    expect(isOverdue("2026-03-14", "fieldwork", "Pacific/Auckland", now)).toBe(true);
  });
  it("never flags delivered, closed or undated work", () => {
    expect(isOverdue("2020-01-01", "delivered", "UTC", now)).toBe(false);
    expect(isOverdue("2020-01-01", "closed", "UTC", now)).toBe(false);
    expect(isOverdue(null, "review", "UTC", now)).toBe(false);
  });
});

describe("formatAltitude", () => {
  it("writes the member's unit first, with units", () => {
    // 121.92 m = 400 ft exactly (NIST SP 811 Appendix B, 1 ft = 0.3048 m)
    expect(formatAltitude(121.92, "ft")).toEqual({ primary: "400 ft AGL", secondary: "122 m" });
    expect(formatAltitude(61, "m")).toEqual({ primary: "61 m AGL", secondary: "200 ft" });
  });
  it("shows the altitude caution above 120 m only", () => {
    expect(altitudeCautionsToShow(120)).toEqual([]);
    expect(altitudeCautionsToShow(121.92).map((c) => c.id)).toEqual(["altitude-limit", "local-rules"]);
    expect(altitudeCautionsToShow(null)).toEqual([]);
  });
});
