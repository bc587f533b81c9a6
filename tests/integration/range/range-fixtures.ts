// Test data for the range-check tests: a recording row and its signal trace, inserted directly.
// The recording is TEST DATA ONLY: its storage key points at no file and its hash is of nothing real;
// the range-check code reads only its id, flight and name, and the trace row.
import { randomUUID, createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import type { TraceInterval } from "@/db/schema/media";

export const TEST_TRACE_FPS = 30;

/** intact 0-10 s, damaged 10-12 s, lost 12-15 s, intact 15-20 s (frame counts exact at 30 fps) */
export const TEST_INTERVALS: TraceInterval[] = [
  { state: "intact", startFrame: 0, endFrame: 299, startSec: 0, endSec: 10 },
  { state: "damaged", startFrame: 300, endFrame: 359, startSec: 10, endSec: 12 },
  { state: "lost", startFrame: 360, endFrame: 449, startSec: 12, endSec: 15 },
  { state: "intact", startFrame: 450, endFrame: 599, startSec: 15, endSec: 20 },
];

export async function insertTracedRecording(organisationId: string, flightId: string, intervals: TraceInterval[] = TEST_INTERVALS) {
  const [flight] = await db().select({ jobId: s.flights.jobId }).from(s.flights).where(eq(s.flights.id, flightId));
  const id = randomUUID();
  const [recording] = await db()
    .insert(s.recordings)
    .values({
      id,
      organisationId,
      jobId: flight.jobId,
      flightId,
      originalName: `test-range-${id.slice(0, 6)}.264`,
      sizeBytes: 1234,
      kind: "raw_h264",
      sha256: createHash("sha256").update(`test data ${id}`).digest("hex"),
      storageKey: `test-data/not-a-file/${id}`,
      state: "ready",
      durationSec: 20,
    })
    .returning();
  const frames = intervals.reduce((n, iv) => n + iv.endFrame - iv.startFrame + 1, 0);
  const count = (st: TraceInterval["state"]) => intervals.filter((iv) => iv.state === st).reduce((n, iv) => n + iv.endFrame - iv.startFrame + 1, 0);
  await db()
    .insert(s.signalTraces)
    .values({
      recordingId: recording.id,
      organisationId,
      fps: TEST_TRACE_FPS,
      intervals,
      summary: {
        frameCount: frames,
        intactFrames: count("intact"),
        damagedFrames: count("damaged"),
        lostFrames: count("lost"),
        intactShare: count("intact") / frames,
        firstDegradationSec: intervals.find((iv) => iv.state !== "intact")?.startSec ?? null,
        longestLossSec: Math.max(0, ...intervals.filter((iv) => iv.state === "lost").map((iv) => iv.endSec - iv.startSec)),
      },
    });
  return recording;
}
