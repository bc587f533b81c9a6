// One-click range checks from a signal-trace interval: the event and time come from the stored trace.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as fromTrace from "@/app/api/range-checks/from-trace/route";
import * as traceEvents from "@/app/api/range-checks/trace-events/route";
import { db, closeDb } from "@/db/client";
import { rangeChecks, recordings, signalTraces } from "@/db/schema";
import { slantRange } from "@/lib/geo";
import { demoActors, demoOrganisationId, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { closeRedis } from "@/lib/queue/redis";
import { insertTracedRecording, TEST_INTERVALS } from "./range-fixtures";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let flightId: string;

const confirm = (recordingId: string, intervalIndex: unknown, over: Record<string, unknown> = {}) => ({
  flightId,
  recordingId,
  intervalIndex,
  positionBy: "distance",
  groundDistance: 412,
  bearingDeg: 214,
  heightAgl: 61,
  units: "m",
  cameraOrientation: "Pitched up",
  ...over,
});
const post = async (who: DemoActorKey, b: unknown) => fromTrace.POST(await req(actors[who], "POST", "/api/range-checks/from-trace", b));
const countChecks = () => db().$count(rangeChecks);

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  flightId = (await makeFlight(orgId, { maxAltitudeAglM: 61, aircraft: "Trace quad" })).id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("POST /api/range-checks/from-trace", () => {
  it.each([
    [1, "first_degradation", 10],
    [2, "total_loss", 12],
    [3, "reacquired", 15],
  ])("interval %i logs %s at %i s, with the slant range of the confirmed figures", async (index, event, atSec) => {
    const rec = await insertTracedRecording(orgId, flightId);
    const res = await post("pilot", confirm(rec.id, index));
    expect(res.status).toBe(201);
    const created = await res.json();
    expect(created.event).toBe(event);
    expect(created.atSec).toBe(atSec);
    expect(created.recordingId).toBe(rec.id);
    expect(created.recordingName).toBe(rec.originalName);
    expect(created.slantRangeM).toBe(slantRange({ groundDistance: 412, heightAgl: 61 }));
  });

  it("ignores an event or time sent in the body: the trace decides", async () => {
    const rec = await insertTracedRecording(orgId, flightId);
    const res = await post("owner", confirm(rec.id, 2, { event: "reacquired", atSec: 1 }));
    const created = await res.json();
    expect([created.event, created.atSec]).toEqual(["total_loss", 12]);
  });

  it("logs an interval once: a second click answers 409 and saves nothing", async () => {
    const rec = await insertTracedRecording(orgId, flightId);
    expect((await post("owner", confirm(rec.id, 1))).status).toBe(201);
    const before = await countChecks();
    const again = await post("pilot", confirm(rec.id, 1));
    expect(again.status).toBe(409);
    expect(await countChecks()).toBe(before);
  });

  it("two simultaneous clicks on the same interval log it once", async () => {
    const rec = await insertTracedRecording(orgId, flightId);
    const statuses = (await Promise.all([post("owner", confirm(rec.id, 3)), post("pilot", confirm(rec.id, 3))])).map((r) => r.status).sort();
    expect(statuses).toEqual([201, 409]);
    expect(await db().$count(rangeChecks, eq(rangeChecks.recordingId, rec.id))).toBe(1);
  });

  it.each([
    ["owner", 201],
    ["pilot", 201],
    ["reviewer", 403],
    ["client", 403],
    ["other", 404],
    ["anonymous", 401],
  ] as [DemoActorKey, number][])("%s -> %i", async (who, status) => {
    const rec = await insertTracedRecording(orgId, flightId);
    expect((await post(who, confirm(rec.id, 1))).status).toBe(status);
  });

  const refusals: [string, (recId: string, otherRecId: string, bareRecId: string) => unknown, string][] = [
    ["an intact interval with nothing before it", (r) => confirm(r, 0), "intervalIndex"],
    ["an interval index past the end", (r) => confirm(r, TEST_INTERVALS.length), "intervalIndex"],
    ["a negative interval index", (r) => confirm(r, -1), "intervalIndex"],
    ["a recording of another flight", (_r, o) => confirm(o, 1), "recordingId"],
    ["a recording with no signal trace yet", (_r, _o, b) => confirm(b, 1), "recordingId"],
    ["a missing ground distance", (r) => confirm(r, 1, { groundDistance: "" }), "groundDistance"],
    ["a missing height", (r) => confirm(r, 1, { heightAgl: null }), "heightAgl"],
    ["a bad recording id", () => confirm("x", 1), "recordingId"],
  ];
  it.each(refusals)("refuses %s with 422 on the field, nothing saved", async (_label, make, field) => {
    const rec = await insertTracedRecording(orgId, flightId);
    const other = await insertTracedRecording(orgId, (await makeFlight(orgId)).id);
    const bare = await insertTracedRecording(orgId, flightId);
    await db().delete(signalTraces).where(eq(signalTraces.recordingId, bare.id));
    const before = await countChecks();
    const res = await post("owner", make(rec.id, other.id, bare.id));
    expect(res.status).toBe(422);
    expect(Object.keys((await res.json()).error.fields)).toContain(field);
    expect(await countChecks()).toBe(before);
  });
});

describe("GET /api/range-checks/trace-events", () => {
  it("lists the events of every traced recording of the flight, marking those already logged", async () => {
    const flight = await makeFlight(orgId, { maxAltitudeAglM: 45, aircraft: "Listed quad" });
    const rec = await insertTracedRecording(orgId, flight.id);
    const logged = await (await fromTrace.POST(await req(actors.owner, "POST", "/x", { ...confirm(rec.id, 2), flightId: flight.id }))).json();
    const res = await traceEvents.GET(await req(actors.reviewer, "GET", `/api/range-checks/trace-events?flightId=${flight.id}`));
    expect(res.status).toBe(200);
    const data = await res.json();
    expect(data.items.map((e: { event: string; atSec: number; rangeCheckId: string | null }) => [e.event, e.atSec, e.rangeCheckId])).toEqual([
      ["first_degradation", 10, null],
      ["total_loss", 12, logged.id],
      ["reacquired", 15, null],
    ]);
    expect(data.prefill).toEqual({ heightAglM: 45, aircraft: "Listed quad", hasLaunchPoint: true });
  });

  it("leaves out deleted recordings and answers 404 for another organisation's flight", async () => {
    const flight = await makeFlight(orgId);
    const rec = await insertTracedRecording(orgId, flight.id);
    await db().update(recordings).set({ deletedAt: new Date() }).where(eq(recordings.id, rec.id));
    const data = await (await traceEvents.GET(await req(actors.owner, "GET", `/api/range-checks/trace-events?flightId=${flight.id}`))).json();
    expect(data.items).toEqual([]);
    const theirs = await makeFlight(actors.other!.organisationId);
    expect((await traceEvents.GET(await req(actors.owner, "GET", `/api/range-checks/trace-events?flightId=${theirs.id}`))).status).toBe(404);
  });
});
