// The flight timeline API against the real Postgres: a flight's files in order with the gaps between
// them, the pilot's re-ordering (all or nothing, in one transaction), authorization and isolation.
import { clientOf, tieClientAccount } from "@/tests/support/client-scope";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { recordings, signalTraces } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import * as timelineRoute from "@/app/api/flights/[id]/timeline/route";
import * as orderRoute from "@/app/api/flights/[id]/order/route";
import { makeFlight } from "@/tests/support/factories";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let flightId: string;
const ids: Record<string, string> = {};

async function addFile(flight: { id: string; jobId: string }, name: string, closedAt: string, lengthSec: number, sequenceIndex: number, trace?: { lostFrames: number; firstDegradationSec: number }) {
  const id = randomUUID();
  await db().insert(recordings).values({
    id,
    organisationId: orgId,
    jobId: flight.jobId,
    flightId: flight.id,
    originalName: name,
    sizeBytes: 1000,
    kind: "raw_h264",
    sha256: "0".repeat(64),
    recorderModifiedAt: new Date(closedAt),
    sequenceIndex,
    state: "ready",
    durationSec: lengthSec,
  });
  const frames = Math.round(lengthSec * 30);
  const lost = trace?.lostFrames ?? 0;
  await db().insert(signalTraces).values({
    recordingId: id,
    organisationId: orgId,
    fps: 30,
    intervals: [{ state: "intact", startFrame: 0, endFrame: frames, startSec: 0, endSec: lengthSec }],
    summary: {
      frameCount: frames,
      intactFrames: frames - lost,
      damagedFrames: 0,
      lostFrames: lost,
      intactShare: (frames - lost) / frames,
      firstDegradationSec: trace?.firstDegradationSec ?? null,
      longestLossSec: lost / 30,
      durationSec: lengthSec,
    } as typeof signalTraces.$inferInsert.summary,
  });
  return id;
}

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId);
  flightId = flight.id;
  // the demo client account is tied to this flight's client; a client account tied elsewhere gets 404
  await tieClientAccount(actors.client!, await clientOf({ flightId }));
  // Uploaded in a muddled order; sequenceIndex as ingest placed them by file time.
  ids.second = await addFile(flight, "REC_0002.264", "2026-03-14T10:02:30Z", 30, 1, { lostFrames: 45, firstDegradationSec: 12 });
  ids.first = await addFile(flight, "REC_0001.264", "2026-03-14T10:01:00Z", 60, 0);
  ids.third = await addFile(flight, "REC_0010.264", "2026-03-14T10:04:00Z", 45, 2);
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const get = async (who: DemoActorKey, id = flightId) => timelineRoute.GET(await req(actors[who], "GET", `/api/flights/${id}/timeline`), route({ id }));
const patch = async (who: DemoActorKey, body: unknown, id = flightId) => orderRoute.PATCH(await req(actors[who], "PATCH", `/api/flights/${id}/order`, body), route({ id }));

describe("GET /api/flights/:id/timeline", () => {
  it("lists the files in order with the gaps between them and the flight's summary", async () => {
    const res = await get("reviewer");
    expect(res.status).toBe(200);
    const t = await res.json();
    expect(t.segments.map((s: { recordingId: string }) => s.recordingId)).toEqual([ids.first, ids.second, ids.third]);
    // closed 10:01:00; next closed 10:02:30 after 30 s -> started 10:02:00 -> 60 s gap; then 45 s
    expect(t.gaps.map((g: { seconds: number }) => g.seconds)).toEqual([60, 45]);
    // the gaps are outages between files: counted as loss, estimated; the first one starts at the end of the first file
    expect(t.summary).toMatchObject({
      files: 3,
      longestGapSec: 60,
      longestLossSec: 60,
      longestLossEstimated: true,
      outages: 2,
      outageSec: 105,
      firstDegradation: { recordingId: ids.first, flightSec: 60, between: true },
    });
  });

  it.each([
    ["client", 200],
    ["pilot", 200],
    ["other", 404],
    ["anonymous", 401],
  ] as const)("%s -> %i", async (who, status) => {
    expect((await get(who)).status).toBe(status);
  });

  it("a flight id that does not exist is 404", async () => {
    expect((await get("owner", randomUUID())).status).toBe(404);
    expect((await get("owner", "not-an-id")).status).toBe(404);
  });
});

describe("PATCH /api/flights/:id/order", () => {
  it("the pilot sets a new order for all files in one go", async () => {
    const res = await patch("pilot", { recordingIds: [ids.third, ids.first, ids.second] });
    expect(res.status).toBe(200);
    const t = await res.json();
    expect(t.segments.map((s: { recordingId: string }) => s.recordingId)).toEqual([ids.third, ids.first, ids.second]);
    // the file times now contradict the order: the first gap cannot be estimated
    expect(t.gaps[0]).toMatchObject({ seconds: null, reason: "file times contradict the order" });
    const rows = await db().select({ id: recordings.id, sequenceIndex: recordings.sequenceIndex }).from(recordings).where(eq(recordings.flightId, flightId));
    expect(Object.fromEntries(rows.map((r) => [r.id, r.sequenceIndex]))).toEqual({ [ids.third]: 0, [ids.first]: 1, [ids.second]: 2 });
  });

  it("puts the files back in the recorder's order on request", async () => {
    const t = await (await patch("owner", { recorderOrder: true })).json();
    expect(t.segments.map((s: { recordingId: string }) => s.recordingId)).toEqual([ids.first, ids.second, ids.third]);
  });

  const bad: [string, DemoActorKey, unknown, number][] = [
    ["a reviewer may not re-order", "reviewer", { recordingIds: [] }, 403],
    ["a missing file", "pilot", { recordingIds: ["FIRST", "SECOND"] }, 422],
    ["a file listed twice", "pilot", { recordingIds: ["FIRST", "FIRST", "SECOND"] }, 422],
    ["a foreign id", "pilot", { recordingIds: ["FIRST", "SECOND", "FOREIGN"] }, 422],
    ["not ids", "pilot", { recordingIds: ["x"] }, 422],
    ["extra keys", "pilot", { recordingIds: ["FIRST"], hack: 1 }, 422],
    ["another organisation's flight", "other", { recorderOrder: true }, 404],
  ];
  it.each(bad)("%s -> %i and nothing changes", async (_label, who, body, status) => {
    const before = await db().select({ id: recordings.id, sequenceIndex: recordings.sequenceIndex }).from(recordings).where(eq(recordings.flightId, flightId));
    const swap = (v: unknown): unknown =>
      Array.isArray(v)
        ? v.map(swap)
        : v && typeof v === "object"
          ? Object.fromEntries(Object.entries(v).map(([k, x]) => [k, swap(x)]))
          : v === "FIRST"
            ? ids.first
            : v === "SECOND"
              ? ids.second
              : v === "FOREIGN"
                ? randomUUID()
                : v;
    const res = await patch(who, swap(body));
    expect(res.status).toBe(status);
    const after = await db().select({ id: recordings.id, sequenceIndex: recordings.sequenceIndex }).from(recordings).where(eq(recordings.flightId, flightId));
    expect(after.sort((a, b) => a.id.localeCompare(b.id))).toEqual(before.sort((a, b) => a.id.localeCompare(b.id)));
  });
});
