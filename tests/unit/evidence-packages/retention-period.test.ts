// Retention arithmetic (lib/retention): which period applies, the disposal date, days left on a given
// clock, and which reminder is due. Calendar facts used here (2028 is a leap year; 2026-01-10 + 30 days
// is 2026-02-09) are also checked against Python's datetime in tests/integration/retention/retention.test.ts.
import { describe, expect, it } from "vitest";
import { daysUntil, disposalDate, effectiveRetention, isDue } from "@/lib/retention/retention-period";
import { leadDue } from "@/lib/retention/send-disposal-reminders";

describe("effectiveRetention", () => {
  it("takes the job's, then the client's, then the organisation's period", () => {
    expect(effectiveRetention(10, 20, 30)).toEqual({ days: 10, source: "job" });
    expect(effectiveRetention(null, 20, 30)).toEqual({ days: 20, source: "client" });
    expect(effectiveRetention(null, null, 30)).toEqual({ days: 30, source: "organisation" });
    expect(effectiveRetention(null, null, null)).toBeNull();
  });
});

describe("disposalDate and daysUntil", () => {
  it("count whole UTC days from the closing date", () => {
    expect(disposalDate(new Date("2026-01-10T23:59:59.999Z"), 30)).toBe("2026-02-09");
    expect(disposalDate(new Date("2028-02-28T12:00:00Z"), 1)).toBe("2028-02-29");
    expect(disposalDate(new Date("2026-01-10T00:00:00Z"), 0)).toBe("2026-01-10");
    expect(() => disposalDate(new Date(), -1)).toThrow(RangeError);
    expect(() => disposalDate(new Date(), 1.5)).toThrow(RangeError);
  });
  it("fall due at the start of the disposal date, UTC", () => {
    expect(daysUntil("2026-02-09", new Date("2026-02-08T23:59:59Z"))).toBe(1);
    expect(isDue("2026-02-09", new Date("2026-02-08T23:59:59Z"))).toBe(false);
    expect(daysUntil("2026-02-09", new Date("2026-02-09T00:00:00Z"))).toBe(0);
    expect(isDue("2026-02-09", new Date("2026-02-09T00:00:00Z"))).toBe(true);
    expect(daysUntil("2026-02-09", new Date("2026-03-01T08:00:00Z"))).toBe(-20);
  });
});

describe("leadDue", () => {
  it.each([
    [45, null],
    [31, null],
    [30, 30],
    [8, 30],
    [7, 7],
    [1, 7],
    [0, 0],
    [-5, 0],
  ])("%i days left: the %s-day reminder", (left, lead) => {
    expect(leadDue(left)).toBe(lead);
  });
});
