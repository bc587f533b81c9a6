// Across flights: range checks logged from tracks on flights at two sites compare by site on the range
// chart, and every point carries its flight, recording, second and frame.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as trackApi from "@/app/api/flights/[id]/track/route";
import * as checkApi from "@/app/api/flights/[id]/track/range-checks/route";
import * as chart from "@/app/api/range-checks/chart/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight, makeJob, makeSite } from "@/tests/support/factories";
import { insertTracedRecording } from "@/tests/integration/range/range-fixtures";

const T0 = Date.UTC(2026, 2, 14, 10, 0, 0);
let actors: Record<DemoActorKey, Actor>;
let orgId: string;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

/** A flight at its own invented site, flown north at `speed` m/s, with a traced recording lying inside its track. */
async function flightWithTrack(siteName: string, speed: number) {
  const site = await makeSite(orgId, { name: siteName, latitude: 54.40, longitude: -2.60 });
  const job = await makeJob(orgId, { siteId: site.id });
  const flight = await makeFlight(orgId, { jobId: job.id, launchLatitude: 54.40, launchLongitude: -2.60 });
  const rec = await insertTracedRecording(orgId, flight.id);
  await db().update(s.recordings).set({ recorderModifiedAt: new Date(T0 + 30_000), facts: { fps: 30, frameCount: 600, durationSec: 20 } }).where(eq(s.recordings.id, rec.id));
  const rows = ["time,lat,lon,height_m"];
  for (let i = 0; i <= 60; i++) rows.push(`${new Date(T0 + i * 1000).toISOString()},${(54.4 + (i * speed) / 111_300).toFixed(8)},-2.6,30`);
  const post = await trackApi.POST(await req(actors.pilot, "POST", `/api/flights/${flight.id}/track`, { fileName: "t.csv", contentBase64: Buffer.from(rows.join("\n") + "\n").toString("base64") }), route({ id: flight.id }));
  expect(post.status).toBe(201);
  // the video is lost at interval 2 (12 s into the file, frame 360)
  const made = await checkApi.POST(await req(actors.pilot, "POST", `/api/flights/${flight.id}/track/range-checks`, { recordingId: rec.id, intervalIndex: 2 }), route({ id: flight.id }));
  expect(made.status).toBe(201);
  return { flight, rec, check: await made.json() };
}

describe("the range chart across flights", () => {
  it("compares link-loss distances by site, each point traceable to its flight and frame", async () => {
    const slow = await flightWithTrack("Invented hill A", 4);
    const fast = await flightWithTrack("Invented hill B", 8);
    // the loss is 22 s after the track starts (file from 10:00:10, 12 s in): 88 m and 176 m north, 30 m up
    expect(slow.check.groundDistanceM).toBeCloseTo(88, 0);
    expect(fast.check.groundDistanceM).toBeCloseTo(176, 0);

    const res = await chart.GET(await req(actors.reviewer, "GET", "/api/range-checks/chart?by=site"));
    expect(res.status).toBe(200);
    const data = await res.json();
    const a = data.groups.find((g: { label: string }) => g.label === "Invented hill A");
    const b = data.groups.find((g: { label: string }) => g.label === "Invented hill B");
    expect(a.stats.total_loss.medianM).toBeCloseTo(slow.check.slantRangeM, 6);
    expect(b.stats.total_loss.medianM).toBeCloseTo(fast.check.slantRangeM, 6);
    const point = data.points.find((p: { id: string }) => p.id === fast.check.id);
    expect(point.source).toEqual({ flightId: fast.flight.id, flownOn: "2026-03-14", recordingId: fast.rec.id, recordingName: fast.rec.originalName, atSec: 12, atFrame: 360 });
  });
});
