import { describe, expect, it } from "vitest";
import { rangeCheckCreateInput, rangeCheckFromTraceInput, rangeCheckPatchInput } from "@/lib/validation/range-checks";

const flightId = "0b6c2f4e-8a51-4c1e-9f3e-2d7a4b9c1e00";
const ok = { flightId, event: "total_loss", positionBy: "distance", groundDistance: "1926", heightAgl: "400", units: "ft" };

const issuesOf = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  Object.fromEntries((r.error?.issues ?? []).map((i) => [i.path.join("."), i.message]));

describe("rangeCheckCreateInput", () => {
  it("converts feet to metres exactly (1 ft = 0.3048 m, NIST SP 811)", () => {
    const v = rangeCheckCreateInput.parse(ok);
    expect(v.heightAglM).toBe(121.92);
    expect(v.position).toEqual({ by: "distance", groundDistanceM: 587.0448, bearingDeg: null });
  });

  it("reads coordinates typed in degrees, minutes and seconds", () => {
    const v = rangeCheckCreateInput.parse({ ...ok, positionBy: "coordinates", latitude: "54°24'36\"N", longitude: "2 37 12 W" });
    // 54 + 24/60 + 36/3600 = 54.41; 2 + 37/60 + 12/3600 = 2.62 (sexagesimal degrees, NIST SP 811)
    expect(v.position.by).toBe("coordinates");
    if (v.position.by === "coordinates") {
      expect(v.position.latitude).toBeCloseTo(54.41, 12);
      expect(v.position.longitude).toBeCloseTo(-2.62, 12);
    }
  });

  it("accepts numbers as well as text for every number field", () => {
    const v = rangeCheckCreateInput.parse({ ...ok, groundDistance: 100, heightAgl: 50, units: "m", bearingDeg: 90, atSec: 3.5 });
    expect(v.position).toEqual({ by: "distance", groundDistanceM: 100, bearingDeg: 90 });
    expect(v.atSec).toBe(3.5);
  });

  const bad: [string, Record<string, unknown>, string, RegExp][] = [
    ["flight id", { flightId: "nope" }, "flightId", /Choose one/],
    ["event", { event: "fade" }, "event", /picture breaking up, video lost or video back/],
    ["position mode", { positionBy: "guess" }, "positionBy", /coordinates, or ground distance/],
    ["units", { units: "yd" }, "units", /ft or m/],
    ["height missing", { heightAgl: "" }, "heightAgl", /Give the height/],
    ["height text", { heightAgl: "four hundred" }, "heightAgl", /must be a number/],
    ["height negative", { heightAgl: "-1" }, "heightAgl", /cannot be negative/],
    ["height too high", { heightAgl: "40000" }, "heightAgl", /at most 32,808 ft/],
    ["distance missing", { groundDistance: null }, "groundDistance", /Give the ground distance/],
    ["distance negative", { groundDistance: -3 }, "groundDistance", /cannot be negative/],
    ["distance too far", { groundDistance: "300000", units: "m" }, "groundDistance", /at most 200,000 m/],
    ["distance infinite", { groundDistance: "Infinity" }, "groundDistance", /must be a number/],
    ["bearing out of range", { bearingDeg: 361 }, "bearingDeg", /between 0 and 360/],
    ["bearing text", { bearingDeg: "north" }, "bearingDeg", /must be a number/],
    ["time negative", { atSec: -1 }, "atSec", /between 0 and 86400/],
    ["recording id", { recordingId: "x" }, "recordingId", /Choose one/],
    ["latitude missing", { positionBy: "coordinates", longitude: "-2.6" }, "latitude", /Give the latitude/],
    ["latitude beyond 90", { positionBy: "coordinates", latitude: "91", longitude: "-2.6" }, "latitude", /beyond 90/],
    ["longitude letter", { positionBy: "coordinates", latitude: "54.4", longitude: "2.6 N" }, "longitude", /marks a latitude/],
    ["longitude mixed units", { positionBy: "coordinates", latitude: "54.4", longitude: "2.5°30'" }, "longitude", /mixes units/],
    ["orientation too long", { cameraOrientation: "x".repeat(81) }, "cameraOrientation", /At most 80/],
    ["aircraft too long", { aircraft: "x".repeat(121) }, "aircraft", /At most 120/],
    ["firmware too long", { firmware: "x".repeat(81) }, "firmware", /At most 80/],
    ["notes too long", { notes: "x".repeat(2001) }, "notes", /At most 2000/],
  ];
  it.each(bad)("refuses a bad %s with an error on that field", (_label, change, field, message) => {
    const r = rangeCheckCreateInput.safeParse({ ...ok, ...change });
    expect(r.success).toBe(false);
    expect(issuesOf(r)[field]).toMatch(message);
  });
});

describe("rangeCheckFromTraceInput", () => {
  it("takes no event or time from the body: those come from the trace", () => {
    const v = rangeCheckFromTraceInput.parse({ ...ok, event: "reacquired", atSec: 99, recordingId: flightId, intervalIndex: "2" });
    expect(v).not.toHaveProperty("event");
    expect(v).not.toHaveProperty("atSec");
    expect(v.intervalIndex).toBe(2);
    expect(v.recordingId).toBe(flightId);
  });

  it.each([[-1], [1.5], ["two"], [null]])("refuses interval index %j", (intervalIndex) => {
    const r = rangeCheckFromTraceInput.safeParse({ ...ok, recordingId: flightId, intervalIndex });
    expect(issuesOf(r).intervalIndex).toMatch(/Choose an interval/);
  });
});

describe("rangeCheckPatchInput", () => {
  it("refuses unknown fields, so a misspelt field is an error rather than a silent no-op", () => {
    expect(rangeCheckPatchInput.safeParse({ hieghtAgl: 3 }).success).toBe(false);
    expect(rangeCheckPatchInput.safeParse({ flightId }).success).toBe(false);
  });
  it("accepts any subset of the fields, with no defaults filled in", () => {
    expect(rangeCheckPatchInput.parse({ notes: "windy" })).toEqual({ notes: "windy" });
  });
});
