// The demo's flight track: the first tower flight (whose link fades behind the tower, db/seed/seed-demo-recordings.ts)
// gets an invented CSV track that matches its two generated recordings. Invented like everything in the
// demo: the points start at the flight's invented launch point (db/seed/demo-scenario.ts) and fly out past
// the invented valve tower, so the picture breaks up and the video is lost while the tower is between the
// aircraft and the pilot, and comes back on the way home.
//
// The flight app's clock runs DEMO_TRACK_CLOCK_AHEAD_MS ahead of the controller's, as clocks do: the
// proposal from file times leaves that difference for the pilot to correct by matching a frame.
import { and, asc, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";
import { direct } from "@/lib/geo";
import { importTrack } from "@/lib/tracks/import-track";

export const DEMO_TRACK_NAME = "FLIGHTLOG_0001.csv";
export const DEMO_TRACK_CLOCK_AHEAD_MS = 3_400;
const BEARING_DEG = 175; // out past the tower, which stands about 72 m south of the launch point
const START_SEC = -10; // seconds from 10:00:00 on the flight's day, on the track's clock
const END_SEC = 55;
const STEP_SEC = 0.5;

/** Distance out along the bearing (m) and height above the launch (m) at a second of the track's clock. */
export function demoFlightProfile(sec: number): { outM: number; heightM: number } {
  const heightM = sec < -5 ? 0 : sec < 10 ? (sec + 5) * 3 : sec < 38 ? 45 : Math.max(0, 45 - (sec - 38) * 3);
  const outM = sec < 0 ? 0 : sec < 19 ? sec * 12 : Math.max(0, 228 - (sec - 19) * 8.8);
  return { outM, heightM };
}

/** The invented track as CSV text, for a flight flown on `flownOn` from `launch`. */
export function demoTrackCsv(flownOn: string, launch: { lat: number; lon: number }): string {
  const t0 = Date.parse(`${flownOn}T10:00:00Z`);
  const rows = ["time,latitude,longitude,height_above_launch_m"];
  for (let k = 0; START_SEC + k * STEP_SEC <= END_SEC; k++) {
    const sec = START_SEC + k * STEP_SEC;
    const { outM, heightM } = demoFlightProfile(sec);
    const p = outM === 0 ? launch : direct(launch.lat, launch.lon, BEARING_DEG, outM);
    rows.push(`${new Date(t0 + sec * 1000).toISOString()},${p.lat.toFixed(7)},${p.lon.toFixed(7)},${heightM.toFixed(1)}`);
  }
  return rows.join("\n") + "\n";
}

/** Imports the demo track on the first tower flight, once. Returns true when it imported one. */
export async function seedDemoTrack(database: Db, organisationId: string): Promise<boolean> {
  // the same flight the demo recordings go to: the first flight of the job in review (seed-demo-recordings.ts)
  const [job] = await database.select({ id: s.jobs.id }).from(s.jobs).where(and(eq(s.jobs.organisationId, organisationId), eq(s.jobs.status, "review"))).limit(1);
  if (!job) return false;
  const [flight] = await database
    .select({ id: s.flights.id, flownOn: s.flights.flownOn, lat: s.flights.launchLatitude, lon: s.flights.launchLongitude })
    .from(s.flights)
    .where(eq(s.flights.jobId, job.id))
    .orderBy(asc(s.flights.createdAt))
    .limit(1);
  if (!flight || flight.lat === null || flight.lon === null) return false;
  const [has] = await database.select({ id: s.flightTracks.id }).from(s.flightTracks).where(eq(s.flightTracks.flightId, flight.id));
  if (has) return false;
  const [pilot] = await database
    .select({ id: s.users.id })
    .from(s.memberships)
    .innerJoin(s.users, eq(s.users.id, s.memberships.userId))
    .where(and(eq(s.memberships.organisationId, organisationId), eq(s.memberships.role, "pilot")))
    .limit(1);
  if (!pilot) return false;
  const csv = demoTrackCsv(flight.flownOn, { lat: flight.lat, lon: flight.lon });
  await importTrack({ organisationId, userId: pilot.id, role: "pilot" }, flight.id, { name: DEMO_TRACK_NAME, bytes: new TextEncoder().encode(csv) });
  return true;
}
