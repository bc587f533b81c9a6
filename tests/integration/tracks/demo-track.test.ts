// The demo's invented track matches its generated recordings: it covers both files of the fading-link
// flight, its clock differs from the recorder's by the stated amount, and the picture breaks up and the
// video is lost while the aircraft is out past the invented tower, and comes back on the way home.
import { afterAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { inverse } from "@/lib/geo";
import { DEMO_FLIGHTS, DEMO_SITES } from "@/db/seed/demo-scenario";
import { DEMO_FILES, TOWER_FADE } from "@/db/seed/seed-demo-recordings";
import { DEMO_TRACK_CLOCK_AHEAD_MS, demoTrackCsv, seedDemoTrack } from "@/db/seed/seed-demo-track";
import { parseTrack } from "@/lib/tracks/parse-track";
import { proposeOffset } from "@/lib/tracks/align-track";
import { trackPositionAt } from "@/lib/tracks/track-position-at";
import { demoOrganisationId } from "@/tests/support/session";

afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const FLIGHT = DEMO_FLIGHTS[0];
const LAUNCH = { lat: FLIGHT.launch[0], lon: FLIGHT.launch[1] };
const TOWER = DEMO_SITES.find((x) => x.key === "tower")!;
const DAY = "2026-03-14";
const T0 = Date.parse(`${DAY}T10:00:00Z`);
const FPS = 30; // the demo streams' rate (seed-demo-recordings.ts)

describe("the demo flight track", () => {
  const parsed = parseTrack(new TextEncoder().encode(demoTrackCsv(DAY, LAUNCH)));
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.problems));
  const points = parsed.track.points;
  // the recorder's view of the two files of the fading-link flight, as the seed stores them
  const files = DEMO_FILES.filter((f) => f.flightKeyIndex === 0).map((f) => ({ id: f.name, startMs: T0 + f.startSec * 1000, endMs: T0 + (f.startSec + f.seconds) * 1000 }));

  it("is a valid track that starts at the flight's launch point and covers both recordings", () => {
    expect(points[0]).toMatchObject({ lat: LAUNCH.lat, lon: LAUNCH.lon, h: 0 });
    for (const f of files) {
      expect(points[0].t).toBeLessThan(f.startMs + DEMO_TRACK_CLOCK_AHEAD_MS);
      expect(points[points.length - 1].t).toBeGreaterThan(f.endMs + DEMO_TRACK_CLOCK_AHEAD_MS);
    }
    // the proposal from file times finds them inside the track without a shift: the pilot corrects the 3.4 s
    expect(proposeOffset(files, { startMs: points[0].t, endMs: points[points.length - 1].t }).offsetMs).toBe(0);
  });

  it("puts the break-up and the loss out past the tower, and the return on the way home", () => {
    const at = (frame: number) => {
      const p = trackPositionAt(points, files[0].startMs + (frame * 1000) / FPS + DEMO_TRACK_CLOCK_AHEAD_MS);
      if (!p.ok) throw new Error(p.reason);
      return { d: inverse(LAUNCH.lat, LAUNCH.lon, p.lat, p.lon).distanceM, h: p.h! };
    };
    const towerM = inverse(LAUNCH.lat, LAUNCH.lon, TOWER.latitude, TOWER.longitude).distanceM;
    const breakUp = at(TOWER_FADE.scramble[0]); // frame 300: the first scrambled IDR
    const loss = at(455); // the video lost from frame 455 ...
    const back = at(510); // ... and back at the IDR at frame 510
    expect(breakUp.d).toBeGreaterThan(towerM);
    expect(loss.d).toBeGreaterThan(breakUp.d);
    expect(back.d).toBeLessThan(loss.d);
    // within the common 120 m height limit (docs/product-rules.md, "Safety cautions") and the logged maximum
    expect(Math.max(...points.map((p) => p.h ?? 0))).toBeLessThanOrEqual(FLIGHT.maxAltitudeAglM);
  });

  it("is imported on the demo's first tower flight once, as evidence", async () => {
    const orgId = await demoOrganisationId();
    expect(await seedDemoTrack(db(), orgId)).toBe(true);
    expect(await seedDemoTrack(db(), orgId)).toBe(false);
    const rows = await db().select({ name: s.flightTracks.originalName, n: s.flightTracks.pointCount }).from(s.flightTracks).where(eq(s.flightTracks.organisationId, orgId));
    expect(rows.filter((r) => r.name === "FLIGHTLOG_0001.csv")).toHaveLength(1);
  });
});
