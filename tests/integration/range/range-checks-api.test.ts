// The range-checks API against the real Postgres: authorization, bad input, figures computed on the
// server (checked against GeographicLib and Pythagoras), archive, CSV export and chart data.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import geographiclib from "geographiclib-geodesic";
import * as list from "@/app/api/range-checks/route";
import * as one from "@/app/api/range-checks/[id]/route";
import * as exportCsv from "@/app/api/range-checks/export.csv/route";
import * as chart from "@/app/api/range-checks/chart/route";
import { db, closeDb } from "@/db/client";
import { rangeChecks } from "@/db/schema";
import { feetToMetres, metresToFeet, slantRange } from "@/lib/geo";
import { RANGE_CHECK_CSV_HEADER } from "@/lib/range-checks/build-range-checks-csv";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { closeRedis } from "@/lib/queue/redis";
import { insertTracedRecording } from "./range-fixtures";

// GeographicLib (C. F. F. Karney), called directly: the outside reference for stored distances.
const wgs84 = geographiclib.Geodesic.WGS84;

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let flightId: string;
let noLaunchFlightId: string;
let otherOrgFlightId: string;
const launch = { lat: 54.41301, lon: -2.61955 };

const body = (over: Record<string, unknown> = {}) => ({
  flightId,
  event: "first_degradation",
  positionBy: "distance",
  groundDistance: 1926,
  bearingDeg: 214,
  heightAgl: 400,
  units: "ft",
  antennaOrientation: "Vertical",
  cameraOrientation: "Pitched up",
  ...over,
});

async function post(who: DemoActorKey, b: unknown) {
  return list.POST(await req(actors[who], "POST", "/api/range-checks", b));
}
async function createOne(over: Record<string, unknown> = {}) {
  const res = await post("owner", body(over));
  expect(res.status).toBe(201);
  return res.json();
}
const countChecks = () => db().$count(rangeChecks);

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  flightId = (await makeFlight(orgId, { launchLatitude: launch.lat, launchLongitude: launch.lon, maxAltitudeAglM: 61, aircraft: "Test quad" })).id;
  noLaunchFlightId = (await makeFlight(orgId, { launchLatitude: null, launchLongitude: null })).id;
  otherOrgFlightId = (await makeFlight(actors.other!.organisationId)).id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("authorization", () => {
  const cases: [DemoActorKey, number, number][] = [
    // actor, GET list of the flight, POST create
    ["owner", 200, 201],
    ["pilot", 200, 201],
    ["reviewer", 200, 403],
    ["client", 403, 403], // the range tools are the crew's (range.read)
    ["other", 404, 404],
    ["anonymous", 401, 401],
  ];
  it.each(cases)("%s: list %i, create %i", async (who, listStatus, createStatus) => {
    const before = await countChecks();
    expect((await list.GET(await req(actors[who], "GET", `/api/range-checks?flightId=${flightId}`))).status).toBe(listStatus);
    const res = await post(who, body());
    expect(res.status).toBe(createStatus);
    expect(await countChecks()).toBe(before + (createStatus === 201 ? 1 : 0));
  });

  it.each([
    ["owner", 200, 200, 200],
    ["pilot", 200, 200, 200],
    ["reviewer", 200, 403, 403],
    ["client", 403, 403, 403],
    ["other", 404, 404, 404],
    ["anonymous", 401, 401, 401],
  ] as [DemoActorKey, number, number, number][])("%s on one range check: read %i, edit %i, archive %i", async (who, read, edit, archive) => {
    const { id } = await createOne();
    expect((await one.GET(await req(actors[who], "GET", "/x"), route({ id }))).status).toBe(read);
    expect((await one.PATCH(await req(actors[who], "PATCH", "/x", { notes: `by ${who}` }), route({ id }))).status).toBe(edit);
    expect((await one.DELETE(await req(actors[who], "DELETE", "/x"), route({ id }))).status).toBe(archive);
    const [row] = await db().select().from(rangeChecks).where(eq(rangeChecks.id, id));
    expect(row.notes).toBe(edit === 200 ? `by ${who}` : null);
    expect(row.archivedAt !== null).toBe(archive === 200);
  });

  it("the other organisation's flight answers 404 to list, create, chart and export, and its checks never leak", async () => {
    const [theirs] = await db()
      .insert(rangeChecks)
      .values({ organisationId: actors.other!.organisationId, flightId: otherOrgFlightId, event: "total_loss", groundDistanceM: 1, heightAglM: 1, slantRangeM: Math.SQRT2 })
      .returning();
    const owner = actors.owner;
    expect((await list.GET(await req(owner, "GET", `/api/range-checks?flightId=${otherOrgFlightId}`))).status).toBe(404);
    expect((await post("owner", body({ flightId: otherOrgFlightId }))).status).toBe(404);
    expect((await chart.GET(await req(owner, "GET", `/api/range-checks/chart?flightId=${otherOrgFlightId}`))).status).toBe(404);
    expect((await exportCsv.GET(await req(owner, "GET", `/api/range-checks/export.csv?flightId=${otherOrgFlightId}`))).status).toBe(404);
    expect((await one.GET(await req(owner, "GET", "/x"), route({ id: theirs.id }))).status).toBe(404);
    const all = await (await list.GET(await req(owner, "GET", "/api/range-checks?pageSize=200"))).json();
    expect(all.items.map((r: { id: string }) => r.id)).not.toContain(theirs.id);
    const csv = await (await exportCsv.GET(await req(owner, "GET", "/api/range-checks/export.csv"))).text();
    expect(csv).not.toContain(theirs.id);
  });
});

describe("figures stored with their inputs", () => {
  it("stores the slant range lib/geo computes, from the inputs converted exactly to metres", async () => {
    const created = await createOne({ groundDistance: 1926, heightAgl: 400, units: "ft" });
    const [row] = await db().select().from(rangeChecks).where(eq(rangeChecks.id, created.id));
    expect(row.groundDistanceM).toBe(feetToMetres(1926));
    expect(row.heightAglM).toBe(121.92); // 400 ft x 0.3048 m/ft (NIST SP 811)
    expect(row.slantRangeM).toBe(slantRange({ groundDistance: feetToMetres(1926), heightAgl: feetToMetres(400) }));
    // common practice, no published source: 400 ft AGL over 1926 ft of ground -> 1967.1 ft
    expect(metresToFeet(row.slantRangeM).toFixed(1)).toBe("1967.1");
  });

  it("from coordinates: ground distance and bearing from the launch point, as GeographicLib gives them", async () => {
    const target = { lat: 54.41012, lon: -2.62511 };
    const created = await createOne({ positionBy: "coordinates", latitude: "54.41012", longitude: "-2.62511", groundDistance: null, bearingDeg: null, heightAgl: 40, units: "m" });
    const ref = wgs84.Inverse(launch.lat, launch.lon, target.lat, target.lon);
    expect(Math.abs(created.groundDistanceM - ref.s12)).toBeLessThan(1e-6);
    expect(created.bearingDeg).toBeCloseTo((ref.azi1 + 360) % 360, 9);
    expect(created.slantRangeM).toBeCloseTo(Math.hypot(ref.s12, 40), 9);
    expect(created.latitude).toBe(target.lat);
  });

  it("from coordinates typed in DMS: the same point as in decimal degrees", async () => {
    // 54°24'36"N = 54.41°, 2°37'12"W = -2.62° (sexagesimal degrees, NIST SP 811)
    const created = await createOne({ positionBy: "coordinates", latitude: "54°24'36\"N", longitude: "2°37'12\"W", heightAgl: 40, units: "m" });
    const ref = wgs84.Inverse(launch.lat, launch.lon, 54.41, -2.62);
    expect(Math.abs(created.groundDistanceM - ref.s12)).toBeLessThan(1e-6);
  });

  it("from ground distance and bearing: coordinates placed with GeographicLib Direct", async () => {
    const created = await createOne({ groundDistance: 538, bearingDeg: 219, heightAgl: 40, units: "m" });
    const ref = wgs84.Direct(launch.lat, launch.lon, 219, 538);
    expect(created.latitude).toBeCloseTo(ref.lat2, 10);
    expect(created.longitude).toBeCloseTo(ref.lon2, 10);
    expect(created.groundDistanceM).toBe(538);
  });

  it("a flight without a launch point takes a distance (no coordinates) but refuses coordinates", async () => {
    const created = await createOne({ flightId: noLaunchFlightId, groundDistance: 300, units: "m" });
    expect(created.latitude).toBeNull();
    expect(created.slantRangeM).toBe(slantRange({ groundDistance: 300, heightAgl: 400 }));
    const before = await countChecks();
    const res = await post("owner", body({ flightId: noLaunchFlightId, positionBy: "coordinates", latitude: "54.4", longitude: "-2.6" }));
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.latitude[0]).toMatch(/no launch point/);
    expect(await countChecks()).toBe(before);
  });

  it("PATCH of the height alone recomputes the slant range from the stored distance", async () => {
    const created = await createOne({ groundDistance: 300, heightAgl: 40, units: "m", bearingDeg: 90 });
    const res = await one.PATCH(await req(actors.pilot, "PATCH", "/x", { heightAgl: 400, units: "ft" }), route({ id: created.id }));
    expect(res.status).toBe(200);
    const [row] = await db().select().from(rangeChecks).where(eq(rangeChecks.id, created.id));
    expect(row.heightAglM).toBe(121.92);
    expect(row.groundDistanceM).toBeCloseTo(300, 9);
    expect(row.slantRangeM).toBeCloseTo(slantRange({ groundDistance: 300, heightAgl: 121.92 }), 9);
    expect(row.latitude).toBeCloseTo(created.latitude, 9);
  });

  it("PATCH with coordinates moves the position and recomputes distance and bearing", async () => {
    const created = await createOne();
    const res = await one.PATCH(await req(actors.owner, "PATCH", "/x", { latitude: "54.415", longitude: "-2.615" }), route({ id: created.id }));
    expect(res.status).toBe(200);
    const moved = await res.json();
    const ref = wgs84.Inverse(launch.lat, launch.lon, 54.415, -2.615);
    expect(Math.abs(moved.groundDistanceM - ref.s12)).toBeLessThan(1e-6);
    expect(moved.slantRangeM).toBeCloseTo(Math.hypot(ref.s12, 121.92), 6);
  });
});

describe("bad input", () => {
  // bodies are built when the test runs, after beforeAll has made the flight
  const bad: [string, () => unknown, string][] = [
    ["flight id", () => body({ flightId: "not-a-uuid" }), "flightId"],
    ["event", () => body({ event: "fade" }), "event"],
    ["time into recording", () => body({ atSec: -2 }), "atSec"],
    ["recording id", () => body({ recordingId: "x" }), "recordingId"],
    ["position mode", () => body({ positionBy: "radar" }), "positionBy"],
    ["latitude", () => body({ positionBy: "coordinates", latitude: "95", longitude: "-2.6" }), "latitude"],
    ["longitude", () => body({ positionBy: "coordinates", latitude: "54.4", longitude: "2.6 N" }), "longitude"],
    ["ground distance", () => body({ groundDistance: "far" }), "groundDistance"],
    ["bearing", () => body({ bearingDeg: 400 }), "bearingDeg"],
    ["height", () => body({ heightAgl: -10 }), "heightAgl"],
    ["units", () => body({ units: "furlongs" }), "units"],
    ["antenna orientation", () => body({ antennaOrientation: "x".repeat(81) }), "antennaOrientation"],
    ["camera orientation", () => body({ cameraOrientation: 12 }), "cameraOrientation"],
    ["aircraft", () => body({ aircraft: "x".repeat(121) }), "aircraft"],
    ["firmware", () => body({ firmware: "x".repeat(81) }), "firmware"],
    ["notes", () => body({ notes: "x".repeat(2001) }), "notes"],
  ];
  it.each(bad)("a bad %s -> 422 naming the field, nothing saved", async (_label, b, field) => {
    const before = await countChecks();
    const res = await post("owner", b());
    expect(res.status).toBe(422);
    const json = await res.json();
    expect(json.error.code).toBe("unprocessable");
    expect(Object.keys(json.error.fields)).toContain(field);
    expect(await countChecks()).toBe(before);
  });

  it("a recording of another flight -> 422 on recordingId, nothing saved", async () => {
    const elsewhere = await makeFlight(orgId);
    const rec = await insertTracedRecording(orgId, elsewhere.id);
    const before = await countChecks();
    const res = await post("owner", body({ recordingId: rec.id }));
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.recordingId).toBeDefined();
    expect(await countChecks()).toBe(before);
  });

  it("malformed JSON -> 400", async () => {
    expect((await post("owner", "{event:")).status).toBe(400);
  });

  it("a bad PATCH changes nothing", async () => {
    const created = await createOne({ notes: "kept" });
    for (const patch of [{ heightAgl: "high" }, { bearingDeg: -1 }, { unknownField: 1 }, { latitude: "54.4", groundDistance: 10 }, { event: "none" }]) {
      const res = await one.PATCH(await req(actors.owner, "PATCH", "/x", patch), route({ id: created.id }));
      expect(res.status).toBe(422);
    }
    const [row] = await db().select().from(rangeChecks).where(eq(rangeChecks.id, created.id));
    expect(row.notes).toBe("kept");
    expect(row.slantRangeM).toBe(created.slantRangeM);
  });

  it("unknown and non-UUID ids answer 404", async () => {
    for (const id of ["00000000-0000-4000-8000-000000000000", "nope"]) {
      expect((await one.GET(await req(actors.owner, "GET", "/x"), route({ id }))).status).toBe(404);
      expect((await one.PATCH(await req(actors.owner, "PATCH", "/x", { notes: "x" }), route({ id }))).status).toBe(404);
    }
  });
});

describe("archive, export and chart", () => {
  let exportFlightId: string;
  beforeAll(async () => {
    exportFlightId = (await makeFlight(orgId, { launchLatitude: launch.lat, launchLongitude: launch.lon, aircraft: "Export quad" })).id;
  });

  it("archived checks leave the list, the chart and the export; a second archive is 404", async () => {
    const kept = await createOne({ flightId: exportFlightId, event: "total_loss", cameraOrientation: "Level" });
    const gone = await createOne({ flightId: exportFlightId, event: "reacquired", cameraOrientation: "Level" });
    expect((await one.DELETE(await req(actors.pilot, "DELETE", "/x"), route({ id: gone.id }))).status).toBe(200);
    expect((await one.DELETE(await req(actors.pilot, "DELETE", "/x"), route({ id: gone.id }))).status).toBe(404);
    const listed = await (await list.GET(await req(actors.owner, "GET", `/api/range-checks?flightId=${exportFlightId}`))).json();
    expect(listed.items.map((r: { id: string }) => r.id)).toEqual([kept.id]);
    const archived = await (await list.GET(await req(actors.owner, "GET", `/api/range-checks?flightId=${exportFlightId}&archived=1`))).json();
    expect(archived.items.map((r: { id: string }) => r.id)).toEqual([gone.id]);
    const c = await (await chart.GET(await req(actors.reviewer, "GET", `/api/range-checks/chart?flightId=${exportFlightId}&by=cameraOrientation`))).json();
    expect(c.points.map((p: { id: string }) => p.id)).toEqual([kept.id]);
    expect(c.groups[0].label).toBe("Level");
    expect(c.groups[0].stats.total_loss.count).toBe(1);
  });

  it("exports RFC 4180 CSV with units in the header and typed formulas disarmed", async () => {
    await createOne({ flightId: exportFlightId, notes: '=HYPERLINK("http://x.invalid"), then "lost"', firmware: "@v1" });
    const res = await exportCsv.GET(await req(actors.reviewer, "GET", `/api/range-checks/export.csv?flightId=${exportFlightId}`));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8; header=present");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="range-checks-flight-[0-9a-f]{8}-\d{4}-\d{2}-\d{2}\.csv"$/);
    const text = await res.text();
    const lines = text.split("\r\n");
    expect(lines[0]).toBe(RANGE_CHECK_CSV_HEADER.map((h) => `"${h}"`).join(","));
    expect(lines.at(-1)).toBe("");
    expect(lines).toHaveLength(1 + 2 + 1); // header, the two active checks, the final CRLF
    expect(text).toContain(`"'=HYPERLINK(""http://x.invalid""), then ""lost"""`);
    expect(text).toContain(`"'@v1"`);
    expect(text).toContain('"Export quad"');
  });

  it("exports every flight of the organisation without a flightId", async () => {
    const res = await exportCsv.GET(await req(actors.owner, "GET", "/api/range-checks/export.csv"));
    expect(res.headers.get("content-disposition")).toMatch(/range-checks-all-flights-/);
    const text = await res.text();
    const active = await db().$count(rangeChecks, and(eq(rangeChecks.organisationId, orgId)));
    const archivedCount = (await db().select({ a: rangeChecks.archivedAt }).from(rangeChecks).where(eq(rangeChecks.organisationId, orgId))).filter((r) => r.a).length;
    expect(text.split("\r\n").length - 2).toBe(active - archivedCount);
  });

  it("refuses an unknown chart grouping with a field error", async () => {
    const res = await chart.GET(await req(actors.owner, "GET", "/api/range-checks/chart?by=colour"));
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.by).toBeDefined();
  });
});
