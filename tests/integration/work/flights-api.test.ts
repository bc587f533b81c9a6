// The flights API against the real Postgres: authorization matrix (pilots log flights), job and pilot
// references, altitude in metres, bad input and filters.
import { clientOf, tieClientAccount } from "@/tests/support/client-scope";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as list from "@/app/api/flights/route";
import * as one from "@/app/api/flights/[id]/route";
import { db, closeDb } from "@/db/client";
import { flights } from "@/db/schema";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight, makeJob, makeSite } from "@/tests/support/factories";
import { closeRedis } from "@/lib/queue/redis";
import { crudRoleMatrix } from "@/tests/support/role-matrix";
import { feetToMetres } from "@/lib/geo/units";
import { isoDayFromNow } from "@/lib/validation/work";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let jobId: string;
let otherOrgJobId: string;
let otherOrgFlightId: string;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  jobId = (await makeJob(orgId, { title: "Flights test job" })).id;
  // the demo client account sees this job's flights (client-scope.test.ts covers the rest)
  await tieClientAccount(actors.client!, await clientOf({ jobId }));
  otherOrgJobId = (await makeJob(actors.other!.organisationId, { title: "Other org job" })).id;
  otherOrgFlightId = (await makeFlight(actors.other!.organisationId, { jobId: otherOrgJobId, aircraft: "Other airframe" })).id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const countFlights = () => db().$count(flights);
const flight = (over: Record<string, unknown> = {}) => ({ jobId, flownOn: "2026-03-14", ...over });

describe("authorization matrix", () => {
  crudRoleMatrix({
    path: "flights",
    list,
    one,
    actors: () => actors,
    expected: {
      owner: [200, 201, 200, 200, 200],
      pilot: [200, 201, 200, 200, 200],
      reviewer: [200, 403, 200, 403, 403],
      client: [200, 403, 200, 403, 403],
      other: [200, 422, 404, 404, 404],
      anonymous: [401, 401, 401, 401, 401],
    },
    make: (who) => makeFlight(orgId, { jobId, aircraft: `Matrix airframe ${who}` }),
    createBody: (who) => flight({ aircraft: `Made by ${who}` }),
    editBody: (who) => ({ notes: `Edited by ${who}` }),
    effects: async (who, id, want) => {
      expect(await db().$count(flights, eq(flights.aircraft, `Made by ${who}`))).toBe(want.create === 201 ? 1 : 0);
      const [after] = await db().select().from(flights).where(eq(flights.id, id));
      expect(after.notes).toBe(want.edit === 200 ? `Edited by ${who}` : null);
      expect(after.archivedAt === null).toBe(want.archive !== 200);
    },
  });

  it("another organisation's flight answers 404 to read, edit and archive, and stays as it was", async () => {
    const at = route({ id: otherOrgFlightId });
    expect((await one.GET(await req(actors.pilot, "GET", "/x"), at)).status).toBe(404);
    expect((await one.PATCH(await req(actors.pilot, "PATCH", "/x", { aircraft: "Taken" }), at)).status).toBe(404);
    expect((await one.DELETE(await req(actors.pilot, "DELETE", "/x"), at)).status).toBe(404);
    const [row] = await db().select().from(flights).where(eq(flights.id, otherOrgFlightId));
    expect(row.aircraft).toBe("Other airframe");
    expect(row.archivedAt).toBeNull();
  });

  it("lists never show another organisation's flights, even when filtered by its job", async () => {
    const body = await (await list.GET(await req(actors.owner, "GET", `/api/flights?jobId=${otherOrgJobId}`))).json();
    expect(body).toEqual({ items: [], total: 0, totalIsLowerBound: false, nextCursor: null });
  });
});

describe("job and pilot references", () => {
  const refused: [string, () => Record<string, unknown>, string, string][] = [
    ["a job of another organisation", () => flight({ jobId: otherOrgJobId }), "jobId", "No such job in this organisation"],
    ["an unknown job", () => flight({ jobId: "00000000-0000-4000-8000-000000000000" }), "jobId", "No such job in this organisation"],
    ["a pilot of another organisation", () => flight({ pilotId: actors.other!.userId }), "pilotId", "Not a member of this organisation"],
    ["a reviewer as pilot in command", () => flight({ pilotId: actors.reviewer!.userId }), "pilotId", "The pilot must be a member with the role pilot or owner"],
  ];
  it.each(refused)("%s is refused as a field error, nothing written", async (_label, body, field, message) => {
    const before = await countFlights();
    const res = await list.POST(await req(actors.owner, "POST", "/api/flights", body()));
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields[field]).toEqual([message]);
    expect(await countFlights()).toBe(before);
  });

  it("a pilot who logs a flight without naming the pilot in command is taken as the pilot", async () => {
    const res = await list.POST(await req(actors.pilot, "POST", "/api/flights", flight()));
    expect(res.status).toBe(201);
    expect((await res.json()).pilotId).toBe(actors.pilot!.userId);
    // an owner logging for the crew leaves the seat empty rather than guessing
    const byOwner = await list.POST(await req(actors.owner, "POST", "/api/flights", flight()));
    expect((await byOwner.json()).pilotId).toBeNull();
  });

  it("moving a flight to another organisation's job changes nothing", async () => {
    const f = await makeFlight(orgId, { jobId });
    expect((await one.PATCH(await req(actors.owner, "PATCH", "/x", { jobId: otherOrgJobId }), route({ id: f.id }))).status).toBe(422);
    const [row] = await db().select().from(flights).where(eq(flights.id, f.id));
    expect(row.jobId).toBe(jobId);
  });
});

describe("altitude and dates", () => {
  it("stores the altitude in metres as sent; 400 ft converts to exactly 121.92 m", async () => {
    // 1 ft = 0.3048 m exactly (NIST SP 811, Appendix B): 400 ft = 121.92 m
    const res = await list.POST(await req(actors.pilot, "POST", "/api/flights", flight({ maxAltitudeAglM: feetToMetres(400) })));
    expect(res.status).toBe(201);
    const [row] = await db().select().from(flights).where(eq(flights.id, (await res.json()).id));
    expect(row.maxAltitudeAglM).toBe(121.92);
  });

  const bad: [string, Record<string, unknown>, string][] = [
    ["negative altitude", { maxAltitudeAglM: -1 }, "maxAltitudeAglM"],
    ["altitude above 10 000 m", { maxAltitudeAglM: 10000.5 }, "maxAltitudeAglM"],
    ["altitude as words", { maxAltitudeAglM: "high" }, "maxAltitudeAglM"],
    ["a date that does not exist", { flownOn: "2026-02-30" }, "flownOn"],
    ["a date in the future", { flownOn: isoDayFromNow(3) }, "flownOn"],
    ["a date with a time", { flownOn: "2026-03-14T10:00:00Z" }, "flownOn"],
    ["launch latitude without longitude", { launchLatitude: 54.4 }, "launchLongitude"],
    ["launch longitude out of range", { launchLatitude: 54.4, launchLongitude: 181 }, "launchLongitude"],
    ["over-long aircraft", { aircraft: "a".repeat(121) }, "aircraft"],
    ["over-long notes", { notes: "n".repeat(2001) }, "notes"],
  ];
  it.each(bad)("%s -> 422 naming the field, nothing written", async (_label, over, field) => {
    const before = await countFlights();
    const res = await list.POST(await req(actors.pilot, "POST", "/api/flights", flight(over)));
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("unprocessable");
    expect(Object.keys(body.error.fields)).toContain(field);
    expect(await countFlights()).toBe(before);
  });

  it("malformed JSON is 400; a <script> in notes is stored as text", async () => {
    expect((await list.POST(await req(actors.pilot, "POST", "/api/flights", "{jobId"))).status).toBe(400);
    const res = await list.POST(await req(actors.pilot, "POST", "/api/flights", flight({ notes: "<script>alert(1)</script>" })));
    expect(res.status).toBe(201);
    expect((await res.json()).notes).toBe("<script>alert(1)</script>");
  });

  it("PATCH refuses unknown fields and half a launch point", async () => {
    const f = await makeFlight(orgId, { jobId, launchLatitude: 54.41, launchLongitude: -2.62 });
    const at = route({ id: f.id });
    expect((await one.PATCH(await req(actors.pilot, "PATCH", "/x", { organisationId: orgId }), at)).status).toBe(422);
    expect((await one.PATCH(await req(actors.pilot, "PATCH", "/x", { launchLongitude: null }), at)).status).toBe(422);
    const both = await one.PATCH(await req(actors.pilot, "PATCH", "/x", { launchLatitude: null, launchLongitude: null }), at);
    expect(both.status).toBe(200);
    expect(await both.json()).toMatchObject({ launchLatitude: null, launchLongitude: null });
  });
});

describe("filters and detail", () => {
  it("?jobId=, ?siteId= and ?pilotId= narrow the list; newest flights first", async () => {
    const site = await makeSite(orgId, { name: "Flight filter site" });
    const job = await makeJob(orgId, { siteId: site.id, title: "Flight filter job" });
    await makeFlight(orgId, { jobId: job.id, flownOn: "2026-01-05", aircraft: "Older" });
    await makeFlight(orgId, { jobId: job.id, flownOn: "2026-01-09", aircraft: "Newer", pilotId: actors.pilot!.userId });
    const aircraft = async (qs: string) =>
      ((await (await list.GET(await req(actors.reviewer, "GET", `/api/flights?${qs}`))).json()).items as { aircraft: string }[]).map((f) => f.aircraft);
    expect(await aircraft(`jobId=${job.id}`)).toEqual(["Newer", "Older"]);
    expect(await aircraft(`siteId=${site.id}&sort=flownOn&dir=asc`)).toEqual(["Older", "Newer"]);
    expect(await aircraft(`jobId=${job.id}&pilotId=${actors.pilot!.userId}`)).toEqual(["Newer"]);
    for (const q of ["jobId=nope", "siteId=1", "sort=flownOn&dir=up", "q=%00"]) {
      expect((await list.GET(await req(actors.owner, "GET", `/api/flights?${q}`))).status, q).toBe(422);
    }
  });

  it("the detail carries the job, site and pilot", async () => {
    const f = await makeFlight(orgId, { jobId, pilotId: actors.pilot!.userId, maxAltitudeAglM: 61 });
    const body = await (await one.GET(await req(actors.client, "GET", "/x"), route({ id: f.id }))).json();
    expect(body).toMatchObject({ id: f.id, jobId, jobTitle: "Flights test job", pilotName: "Bram Ellery", maxAltitudeAglM: 61 });
    expect(body.siteName).toMatch(/^Test site/);
    expect(body.total).toBeUndefined();
  });
});
