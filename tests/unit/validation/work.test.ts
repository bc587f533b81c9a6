// The schemas that check work objects in both the browser forms and the route handlers.
import { describe, expect, it } from "vitest";
import { clientInput, flightInput, flightPatch, isoDayFromNow, isTimeZone, canonicalTimeZone, jobInput, jobPatch, siteInput, sitePatch } from "@/lib/validation/work";
import { isRealIsoDate } from "@/lib/validation/common";

const id = "6f1c2b8e-3d4a-4c5b-9e6f-7a8b9c0d1e2f";
const fields = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) => (r.error?.issues ?? []).map((i) => i.path.join("."));

describe("dates", () => {
  it.each([
    // Gregorian calendar: leap years divide by 4, except centuries not divisible by 400
    ["2024-02-29", true],
    ["2000-02-29", true],
    ["2026-02-29", false],
    ["1900-02-29", false],
    ["2026-02-30", false],
    ["2026-04-31", false],
    ["2026-12-31", true],
    ["2026-13-01", false],
    ["2026-00-10", false],
  ])("%s is a real date: %s", (s, real) => {
    expect(isRealIsoDate(s)).toBe(real);
    expect(jobInput.safeParse({ siteId: id, title: "t", dueDate: s }).success).toBe(real);
  });

  it.each(["14/03/2026", "2026-3-14", "20260314", "2026-03-14T00:00:00Z", "0999-01-01", " 2026-03-14"])("refuses %j", (s) => {
    expect(fields(jobInput.safeParse({ siteId: id, title: "t", dueDate: s }))).toEqual(["dueDate"]);
  });

  it("an empty due date means none", () => {
    expect(jobInput.parse({ siteId: id, title: "t", dueDate: "" }).dueDate).toBeNull();
  });

  it("a flight may be dated up to tomorrow (UTC), never later", () => {
    const now = Date.UTC(2026, 2, 14, 23, 30);
    expect(isoDayFromNow(1, now)).toBe("2026-03-15");
    expect(flightInput.safeParse({ jobId: id, flownOn: isoDayFromNow(0) }).success).toBe(true);
    expect(flightInput.safeParse({ jobId: id, flownOn: isoDayFromNow(1) }).success).toBe(true);
    expect(fields(flightInput.safeParse({ jobId: id, flownOn: isoDayFromNow(2) }))).toEqual(["flownOn"]);
  });
});

describe("time zones", () => {
  it.each([
    ["Europe/London", "Europe/London"],
    ["europe/london", "Europe/London"],
    ["UTC", "UTC"],
    // IANA tz database, file "backward": US/Eastern is a link to America/New_York
    ["US/Eastern", "America/New_York"],
    ["Pacific/Chatham", "Pacific/Chatham"],
  ])("%s is stored as %s", (tz, canonical) => {
    expect(isTimeZone(tz)).toBe(true);
    expect(canonicalTimeZone(tz)).toBe(canonical);
    expect(siteInput.parse({ clientId: id, name: "s", timeZone: tz }).timeZone).toBe(canonical);
  });

  it.each(["Mars/Olympus_Mons", "GMT+25", "", "Europe/London; DROP TABLE sites"])("refuses %j", (tz) => {
    expect(fields(siteInput.safeParse({ clientId: id, name: "s", timeZone: tz }))).toEqual(["timeZone"]);
  });

  it("defaults to UTC on create, but a patch without a zone leaves it out", () => {
    expect(siteInput.parse({ clientId: id, name: "s" }).timeZone).toBe("UTC");
    expect(sitePatch.parse({ name: "s" })).toEqual({ name: "s" });
  });
});

describe("coordinates", () => {
  it("accept both or neither, in range, from numbers or typed text", () => {
    expect(siteInput.parse({ clientId: id, name: "s", latitude: "54.41237", longitude: "-2.61942" })).toMatchObject({ latitude: 54.41237, longitude: -2.61942 });
    expect(siteInput.parse({ clientId: id, name: "s", latitude: "", longitude: "" })).toMatchObject({ latitude: null, longitude: null });
    expect(siteInput.parse({ clientId: id, name: "s", latitude: -90, longitude: 180 })).toMatchObject({ latitude: -90, longitude: 180 });
  });

  it.each([
    [{ latitude: 54.4 }, "longitude"],
    [{ longitude: -2.6 }, "latitude"],
    [{ latitude: 90.0001, longitude: 0 }, "latitude"],
    [{ latitude: 0, longitude: -180.5 }, "longitude"],
    [{ latitude: "north", longitude: 1 }, "latitude"],
    [{ latitude: "NaN", longitude: 1 }, "latitude"],
    [{ latitude: 1, longitude: "Infinity" }, "longitude"],
  ])("refuses %j at %s", (coords, field) => {
    expect(fields(siteInput.safeParse({ clientId: id, name: "s", ...coords }))).toContain(field);
  });

  it("the launch point of a flight follows the same pair rule", () => {
    expect(fields(flightInput.safeParse({ jobId: id, flownOn: "2026-03-14", launchLatitude: 54.4 }))).toEqual(["launchLongitude"]);
    expect(flightInput.safeParse({ jobId: id, flownOn: "2026-03-14", launchLatitude: 54.4, launchLongitude: -2.6 }).success).toBe(true);
  });
});

describe("names and text", () => {
  it("trims, requires and bounds names", () => {
    expect(clientInput.parse({ name: "  Fennmarsh  " }).name).toBe("Fennmarsh");
    expect(fields(clientInput.safeParse({ name: "   " }))).toEqual(["name"]);
    expect(clientInput.safeParse({ name: "x".repeat(120) }).success).toBe(true);
    expect(fields(clientInput.safeParse({ name: "x".repeat(121) }))).toEqual(["name"]);
    expect(fields(clientInput.safeParse({ name: 7 }))).toEqual(["name"]);
  });

  it("keeps markup as text and refuses the NUL character PostgreSQL cannot store", () => {
    expect(clientInput.parse({ name: "<script>alert(1)</script>" }).name).toBe("<script>alert(1)</script>");
    expect(fields(clientInput.safeParse({ name: "a\u0000b" }))).toEqual(["name"]);
    expect(fields(clientInput.safeParse({ name: "ok", notes: "x\u0000" }))).toEqual(["notes"]);
  });

  it("turns empty optional text into null and lower-cases e-mail", () => {
    expect(clientInput.parse({ name: "c", contactName: "", contactEmail: " Ops@Example.COM ", notes: "" })).toEqual({ name: "c", contactName: null, contactEmail: "ops@example.com", notes: null });
    expect(fields(clientInput.safeParse({ name: "c", contactEmail: "ops at example" }))).toEqual(["contactEmail"]);
  });
});

describe("jobs", () => {
  it("defaults the status on create only", () => {
    expect(jobInput.parse({ siteId: id, title: "t" }).status).toBe("planned");
    expect(jobPatch.parse({ title: "t" })).toEqual({ title: "t" });
  });

  it("takes empty crew seats as none and refuses ids that are not UUIDs", () => {
    expect(jobInput.parse({ siteId: id, title: "t", pilotId: "", reviewerId: null })).toMatchObject({ pilotId: null, reviewerId: null });
    expect(fields(jobInput.safeParse({ siteId: id, title: "t", pilotId: "bram" }))).toEqual(["pilotId"]);
    expect(fields(jobInput.safeParse({ siteId: "", title: "t" }))).toEqual(["siteId"]);
  });

  it("knows only the five statuses", () => {
    for (const s of ["planned", "fieldwork", "review", "delivered", "closed"]) expect(jobInput.safeParse({ siteId: id, title: "t", status: s }).success).toBe(true);
    expect(fields(jobInput.safeParse({ siteId: id, title: "t", status: "done" }))).toEqual(["status"]);
  });

  it("patches are strict: unknown fields are refused", () => {
    expect(jobPatch.safeParse({ organisationId: id }).success).toBe(false);
    expect(jobPatch.safeParse({ legalHold: true }).success).toBe(false);
    expect(jobPatch.parse({ archived: true })).toEqual({ archived: true });
  });
});

describe("flights", () => {
  it("bounds the altitude in metres: 0 to 10 000", () => {
    const f = (maxAltitudeAglM: unknown) => flightInput.safeParse({ jobId: id, flownOn: "2026-03-14", maxAltitudeAglM });
    expect(f(0).success).toBe(true);
    expect(f(121.92).success).toBe(true);
    expect(f(10000).success).toBe(true);
    expect(f("").success && f("").data?.maxAltitudeAglM).toBe(null);
    expect(fields(f(-0.1))).toEqual(["maxAltitudeAglM"]);
    expect(fields(f(10000.01))).toEqual(["maxAltitudeAglM"]);
    expect(fields(f("high"))).toEqual(["maxAltitudeAglM"]);
  });

  it("patches keep to the fields sent", () => {
    expect(flightPatch.parse({ notes: "n" })).toEqual({ notes: "n" });
    expect(flightPatch.safeParse({ flownOn: "2026-02-30" }).success).toBe(false);
  });
});
