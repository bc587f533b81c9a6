// Flight tracks through their routes: import as evidence (byte-exact, SHA-256, write-once, custody),
// every kind of bad input refused with nothing saved, alignment with who and when, distances at the
// link events, and the one-click range check.
import { execFileSync } from "node:child_process";
import { readFileSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, desc, eq } from "drizzle-orm";
import * as trackApi from "@/app/api/flights/[id]/track/route";
import * as alignApi from "@/app/api/flights/[id]/track/alignment/route";
import * as checkApi from "@/app/api/flights/[id]/track/range-checks/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { diskPath, onDiskStore, storedFileCopy } from "@/tests/support/stored-files";
import { env } from "@/lib/config/env";
import { inverse } from "@/lib/geo";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { insertTracedRecording } from "@/tests/integration/range/range-fixtures";

const FIXTURES = path.resolve(__dirname, "../../fixtures/tracks");
const T0 = Date.UTC(2026, 2, 14, 10, 0, 0);
const LAUNCH = { lat: 54.41301, lon: -2.61955 };

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

const body = (fileName: string, bytes: Uint8Array | Buffer) => ({ fileName, contentBase64: Buffer.from(bytes).toString("base64") });
const importAs = async (who: DemoActorKey, flightId: string, b: unknown) =>
  trackApi.POST(await req(actors[who], "POST", `/api/flights/${flightId}/track?name=x`, b), route({ id: flightId }));
const view = async (who: DemoActorKey, flightId: string) => trackApi.GET(await req(actors[who], "GET", `/api/flights/${flightId}/track`), route({ id: flightId }));

function storedTrackFiles(): string[] {
  const dir = path.join(env().storageDir, "tracks", orgId);
  try {
    return readdirSync(dir);
  } catch {
    return [];
  }
}
const custodyCount = () => db().$count(s.custodyEvents, eq(s.custodyEvents.organisationId, orgId));

/** A CSV track at 10 Hz, climbing 1 m/s from the launch and moving north 2 m/s from 5 s, for 60 s. */
function climbingTrack(startMs = T0): string {
  const rows = ["time,latitude,longitude,height_above_launch_m"];
  for (let i = 0; i <= 600; i++) {
    const sec = i / 10;
    const north = Math.max(0, sec - 5) * 2;
    const lat = LAUNCH.lat + north / 111_300; // about 111.3 km per degree of latitude here
    rows.push(`${new Date(startMs + i * 100).toISOString()},${lat.toFixed(8)},${LAUNCH.lon},${Math.min(sec, 40).toFixed(1)}`);
  }
  return rows.join("\n") + "\n";
}

describe("import", () => {
  it("stores the exact bytes write-once with their SHA-256 (checked with GNU sha256sum) and a custody event", async () => {
    const flight = await makeFlight(orgId, { launchLatitude: LAUNCH.lat, launchLongitude: LAUNCH.lon });
    const bytes = readFileSync(path.join(FIXTURES, "hand-worked.gpx"));
    const before = await custodyCount();
    const res = await importAs("pilot", flight.id, body("hand-worked.gpx", bytes));
    expect(res.status).toBe(201);
    const out = await res.json();
    expect(out).toMatchObject({ originalName: "hand-worked.gpx", format: "gpx", pointCount: 3, sizeBytes: bytes.byteLength });
    const [row] = await db().select().from(s.flightTracks).where(eq(s.flightTracks.id, out.id));
    const file = await storedFileCopy(row.storageKey);
    expect(readFileSync(file).equals(bytes)).toBe(true);
    // GNU coreutils sha256sum shares no code with Node's crypto
    expect(execFileSync("sha256sum", [file], { encoding: "utf8" }).split(" ")[0]).toBe(out.sha256);
    if (onDiskStore()) expect(statSync(diskPath(row.storageKey)).mode & 0o222).toBe(0); // read-only on disk
    expect(await custodyCount()).toBe(before + 1);
    const [ev] = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.organisationId, orgId), eq(s.custodyEvents.evidenceId, out.id)));
    expect(ev).toMatchObject({ eventType: "track_imported", evidenceType: "track", originalSha256: out.sha256, originalSize: bytes.byteLength, storageLocation: row.storageKey });

    // the database keeps the track write-once (migration 0010)
    await expect(db().update(s.flightTracks).set({ sha256: "0".repeat(64) }).where(eq(s.flightTracks.id, out.id))).rejects.toThrow();
    // a second track for the same flight is refused, and stores nothing
    const files = storedTrackFiles().length;
    const again = await importAs("owner", flight.id, body("flight.csv", readFileSync(path.join(FIXTURES, "flight.csv"))));
    expect(again.status).toBe(409);
    expect((await again.json()).error.message).toMatch(/flight\.csv was not imported/);
    expect(storedTrackFiles().length).toBe(files);
  });

  const badFiles = ["bad/malformed.gpx", "bad/no-times.gpx", "bad/no-zone.gpx", "bad/out-of-order.gpx", "bad/duplicate-times.gpx", "bad/latitude-out-of-range.gpx", "bad/unknown-column.csv"];
  for (const name of badFiles) {
    it(`refuses ${name} naming the file and where, and saves nothing`, async () => {
      const flight = await makeFlight(orgId);
      const files = storedTrackFiles().length;
      const events = await custodyCount();
      const res = await importAs("pilot", flight.id, body(path.basename(name), readFileSync(path.join(FIXTURES, name))));
      expect(res.status).toBe(422);
      const err = (await res.json()).error;
      expect(err.message).toMatch(new RegExp(`^${path.basename(name).replace(".", "\\.")}(, line \\d+)?(, point \\d+)?: .+ Nothing was saved\\.$`));
      expect(err.fields.file[0]).toMatch(/(line|point|none of)/);
      expect(await db().$count(s.flightTracks, eq(s.flightTracks.flightId, flight.id))).toBe(0);
      expect(storedTrackFiles().length).toBe(files);
      expect(await custodyCount()).toBe(events);
    });
  }

  it("refuses a 200 MB upload by its declared length, and one sent without a length once it passes the limit", async () => {
    const flight = await makeFlight(orgId);
    const declared = new Request(`http://localhost/api/flights/${flight.id}/track?name=huge.gpx`, {
      method: "POST",
      headers: { ...Object.fromEntries((await req(actors.pilot, "POST", "/x", {})).headers), "content-length": String(200 * 1024 * 1024) },
      body: "{}",
    });
    const a = await trackApi.POST(declared, route({ id: flight.id }));
    expect(a.status).toBe(413);
    expect((await a.json()).error.message).toMatch(/^huge\.gpx: the file is about 150\.0 MiB; a track may be at most 16\.0 MiB\. Nothing was saved\.$/);

    let sent = 0;
    const chunk = new Uint8Array(1024 * 1024).fill(0x41);
    const stream = new ReadableStream<Uint8Array>({
      pull(c) {
        if (sent >= 200) return c.close();
        sent++;
        c.enqueue(chunk);
      },
    });
    const base = await req(actors.pilot, "POST", "/x", {});
    const headers = new Headers(base.headers);
    headers.delete("content-length");
    const streamed = new Request(`http://localhost/api/flights/${flight.id}/track?name=huge.csv`, { method: "POST", headers, body: stream, duplex: "half" } as RequestInit);
    const b = await trackApi.POST(streamed, route({ id: flight.id }));
    expect(b.status).toBe(413);
    expect((await b.json()).error.message).toMatch(/^huge\.csv: /);
    expect(sent).toBeLessThan(40); // stopped reading a little past the limit, not at 200 MB
    expect(await db().$count(s.flightTracks, eq(s.flightTracks.flightId, flight.id))).toBe(0);
  });

  it("refuses file names with NUL or lone surrogates, content that is not base64, and other organisations' flights", async () => {
    const flight = await makeFlight(orgId);
    expect((await importAs("pilot", flight.id, { fileName: "a\u0000.gpx", contentBase64: "" })).status).toBe(422);
    expect((await importAs("pilot", flight.id, { fileName: "a\ud800.gpx", contentBase64: "" })).status).toBe(422);
    expect((await importAs("pilot", flight.id, { fileName: "a.gpx", contentBase64: "!!" })).status).toBe(422);
    expect((await importAs("other", flight.id, body("flight.csv", readFileSync(path.join(FIXTURES, "flight.csv"))))).status).toBe(404);
    expect((await view("other", flight.id)).status).toBe(404);
    expect((await view("client", flight.id)).status).toBe(403);
  });
});

describe("alignment, distances at the link events, and the one-click range check", () => {
  it("proposes from file times, takes the pilot's frame match, measures every event and logs one with one click", async () => {
    const flight = await makeFlight(orgId, { launchLatitude: LAUNCH.lat, launchLongitude: LAUNCH.lon, aircraft: "Track quad" });
    // the recording (20 s at 30 fps: picture breaking up at 10 s, lost at 12 s, back at 15 s) was closed at
    // 10:00:35 on a recorder clock 7.25 s behind the track's: it really ran 10:00:22.25 to 10:00:42.25
    const rec = await insertTracedRecording(orgId, flight.id);
    await db().update(s.recordings).set({ recorderModifiedAt: new Date(T0 + 35_000), facts: { fps: 30, frameCount: 600, durationSec: 20 } }).where(eq(s.recordings.id, rec.id));
    const imported = await importAs("pilot", flight.id, body("climb.csv", new TextEncoder().encode(climbingTrack())));
    expect(imported.status).toBe(201);

    // before anyone sets it: the proposal (offset 0, file times), rough
    let v = await (await view("reviewer", flight.id)).json();
    expect(v.alignment).toMatchObject({ offsetMs: 0, method: "file_times", stored: false });
    expect(v.alignment.description).toMatch(/^Rough/);
    expect(v.events.map((e: { event: string }) => e.event)).toEqual(["first_degradation", "total_loss", "reacquired"]);

    // the pilot matches frame 300 (10 s into the file; recorder clock 10:00:25) with track point 322 (10:00:32.2)
    const align = async (who: DemoActorKey, b: unknown) => alignApi.POST(await req(actors[who], "POST", `/api/flights/${flight.id}/track/alignment`, b), route({ id: flight.id }));
    expect((await align("reviewer", { method: "file_times" })).status).toBe(403);
    expect((await align("pilot", { method: "frame_match", recordingId: rec.id, frame: 600, pointIndex: 0 })).status).toBe(422);
    const events = await custodyCount();
    const res = await align("pilot", { method: "frame_match", recordingId: rec.id, frame: 300, pointIndex: 322 });
    expect(res.status).toBe(200);
    const { alignment, view: after } = await res.json();
    expect(alignment.offsetMs).toBeCloseTo(7_200, 6);
    expect(await custodyCount()).toBe(events + 1);
    expect(after.alignment).toMatchObject({ method: "frame_match", stored: true, frame: 300, pointIndex: 322 });
    expect(after.alignment.setBy).toBeTruthy();
    expect(after.alignment.setAt).toMatch(/^\d{4}-\d{2}-\d{2}T/);
    v = after;

    // the break-up at 10 s into the file is now 10:00:32.2 on the track: 27.2 s after moving off, 54.4 m north
    const breakUp = v.events[0];
    expect(breakUp.measured.trackTime).toBe("2026-03-14T10:00:32.200Z");
    const ref = inverse(LAUNCH.lat, LAUNCH.lon, breakUp.measured.position.latitude, breakUp.measured.position.longitude);
    expect(breakUp.measured.position.groundDistanceM).toBeCloseTo(ref.distanceM, 6);
    expect(breakUp.measured.position.groundDistanceM).toBeGreaterThan(54);
    expect(breakUp.measured.position.groundDistanceM).toBeLessThan(55);
    expect(breakUp.measured.position.heightM).toBeCloseTo(32.2, 6);

    // one click: nothing typed but the event's id
    const click = async (who: DemoActorKey, b: unknown) => checkApi.POST(await req(actors[who], "POST", `/api/flights/${flight.id}/track/range-checks`, b), route({ id: flight.id }));
    expect((await click("reviewer", { recordingId: rec.id, intervalIndex: 1 })).status).toBe(403);
    expect((await click("pilot", { recordingId: rec.id, intervalIndex: 0 })).status).toBe(422); // intact start: no event
    const made = await click("pilot", { recordingId: rec.id, intervalIndex: 1 });
    expect(made.status).toBe(201);
    const check = await made.json();
    expect(check).toMatchObject({ event: "first_degradation", atSec: 10, recordingId: rec.id, aircraft: "Track quad" });
    expect(check.groundDistanceM).toBeCloseTo(breakUp.measured.position.groundDistanceM, 6);
    expect(check.heightAglM).toBeCloseTo(32.2, 6);
    expect(check.slantRangeM).toBeCloseTo(Math.hypot(breakUp.measured.position.groundDistanceM, 32.2), 6);
    expect(check.notes).toMatch(/climb\.csv/);
    expect((await click("pilot", { recordingId: rec.id, intervalIndex: 1 })).status).toBe(409);
    v = await (await view("pilot", flight.id)).json();
    expect(v.events[0].rangeCheckId).toBe(check.id);

    // alignments are a history: an old one cannot be rewritten
    const [latest] = await db().select().from(s.trackAlignments).where(eq(s.trackAlignments.organisationId, orgId)).orderBy(desc(s.trackAlignments.createdAt)).limit(1);
    await expect(db().update(s.trackAlignments).set({ offsetMs: 0 }).where(eq(s.trackAlignments.id, latest.id))).rejects.toThrow();
  });

  it("flags a track that starts away from the flight's logged launch point", async () => {
    // 0.001 degrees of latitude is about 111 m (by hand: a meridian degree is about 111.3 km)
    const flight = await makeFlight(orgId, { launchLatitude: LAUNCH.lat - 0.001, launchLongitude: LAUNCH.lon });
    expect((await importAs("pilot", flight.id, body("climb.csv", new TextEncoder().encode(climbingTrack())))).status).toBe(201);
    const v = await (await view("pilot", flight.id)).json();
    expect(v.warnings.join("\n")).toMatch(/The track starts 111 m from the flight's launch point/);
  });

  it("flags a recording that does not overlap the track", async () => {
    const flight = await makeFlight(orgId, { launchLatitude: LAUNCH.lat, launchLongitude: LAUNCH.lon });
    const rec = await insertTracedRecording(orgId, flight.id);
    // closed on the next day at the same time: 24 h is past every time-zone offset the proposal tries
    await db().update(s.recordings).set({ recorderModifiedAt: new Date(T0 + 86_400_000) }).where(eq(s.recordings.id, rec.id));
    expect((await importAs("pilot", flight.id, body("climb.csv", new TextEncoder().encode(climbingTrack())))).status).toBe(201);
    const v = await (await view("pilot", flight.id)).json();
    expect(v.warnings.join("\n")).toMatch(/does not overlap the track/);
    expect(v.events[0].measured.position).toBeNull();
    expect(v.events[0].measured.reason).toMatch(/outside the track/);
  });
});
