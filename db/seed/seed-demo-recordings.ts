// Demo recordings for `npm start`: short controller-like raw H.264 streams made by ffmpeg from test
// patterns (never real footage), stored as originals the way the ingest path stores them, and queued
// for the worker. Idempotent: skipped once the organisation has recordings.
//
// The first tower flight's note says the link faded behind the tower, and its two files show it (see
// TOWER_FADE): scattered lost frames, a run lost at the end of a group of pictures, scrambled slices
// in an IDR and in P pictures, the video lost over a whole group and back at a later IDR, and the
// recorder splitting the flight into two files across an outage of about 6 s. The other demo files
// are clean. Every stream is 432x240 at 30 fps with a burned-in frame counter, a few seconds long, so
// the seed and the worker stay quick on a fresh machine.
import { createReadStream, existsSync } from "node:fs";
import { mkdtemp, rename, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { and, asc, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";
import { sha256OfStream } from "@/lib/custody/sha256-stream";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { insertRecordingRow } from "@/lib/recordings/insert-recording-row";
import { placeOriginal } from "@/lib/storage/store";
import { originalKey } from "@/lib/storage/storage-keys";
import { enqueue } from "@/lib/queue/jobs";
import { runFfmpeg } from "@/lib/processing/ffmpeg";
import { damageDemoStream, frames, type DemoDamage } from "./damage-demo-stream";

export type DemoFile = {
  flightKeyIndex: number;
  name: string;
  pattern: string;
  seconds: number;
  /** When the recorder started the file, seconds after 10:00:00 on the flight's day. */
  startSec: number;
  damage?: DemoDamage;
};

// The fading link behind the tower (30 fps, an IDR every 30 frames, so groups start at 0, 30, 60 ...).
export const TOWER_FADE: DemoDamage = {
  remove: [
    97, 143, 188, 221, // scattered single frames
    ...frames(265, 270), // the end of a group, just before the IDR at 270
    ...frames(400, 413), // 13 frames mid-group
    ...frames(455, 510), // the rest of the group at 450 and the whole group at 480: back at the IDR at 510
  ],
  scramble: [300, 333, 347, 560], // the IDR at 300 and P pictures
};

// 432x240 Constrained Baseline at ~560 kbit/s, 30 fps: the shape of a controller recording
export const DEMO_FILES: DemoFile[] = [
  { flightKeyIndex: 0, name: "VID_0001.h264", pattern: "testsrc2", seconds: 20, startSec: 0, damage: TOWER_FADE },
  // the recorder closed the first file when the video was lost, and opened this one about 6 s later
  { flightKeyIndex: 0, name: "VID_0002.h264", pattern: "testsrc2", seconds: 8, startSec: 26, damage: { remove: [40, 41, 42, 130], scramble: [75] } },
  { flightKeyIndex: 1, name: "VID_0003.h264", pattern: "smptebars", seconds: 10, startSec: 0 },
];

const COUNTER_FONT = "/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf";

/** The demo file's raw H.264 stream, damaged as the file says, written into `dir`. */
export async function generateDemoStream(f: DemoFile, dir: string): Promise<string> {
  const clean = path.join(dir, `clean-${f.name}`);
  // the frame counter needs Debian's DejaVu font (ffmpeg's fontconfig pulls it in); without it, no counter
  const counter = existsSync(COUNTER_FONT) ? ["-vf", `drawtext=fontfile=${COUNTER_FONT}:text=%{frame_num}:fontsize=40:x=8:y=8:fontcolor=white:box=1:boxcolor=black`] : [];
  await runFfmpeg({
    label: "demo stream",
    input: { source: `${f.pattern}=size=432x240:rate=30`, options: ["-f", "lavfi"], name: "pattern" },
    output: {
      path: clean,
      name: "clean",
      options: [
        "-t", String(f.seconds),
        ...counter,
        "-c:v", "libx264", "-profile:v", "baseline", "-preset", "veryfast", "-b:v", "560k",
        "-g", "30", "-keyint_min", "30", "-sc_threshold", "0", "-bf", "0", "-pix_fmt", "yuv420p", "-f", "h264",
      ],
    },
  });
  const file = path.join(dir, f.name);
  if (f.damage) {
    await damageDemoStream(clean, file, f.damage);
    await rm(clean, { force: true });
  } else {
    await rename(clean, file);
  }
  return file;
}

export async function seedDemoRecordings(database: Db, organisationId: string): Promise<number> {
  const existing = await database.$count(s.recordings, eq(s.recordings.organisationId, organisationId));
  if (existing > 0) return 0;
  const [job] = await database.select().from(s.jobs).where(and(eq(s.jobs.organisationId, organisationId), eq(s.jobs.status, "review"))).limit(1);
  if (!job) return 0;
  const flights = await database.select().from(s.flights).where(eq(s.flights.jobId, job.id)).orderBy(asc(s.flights.createdAt));
  const [pilot] = await database
    .select({ id: s.users.id })
    .from(s.memberships)
    .innerJoin(s.users, eq(s.users.id, s.memberships.userId))
    .where(and(eq(s.memberships.organisationId, organisationId), eq(s.memberships.role, "pilot")))
    .limit(1);
  const dir = await mkdtemp(path.join(os.tmpdir(), "cairn-demo-"));
  let count = 0;
  try {
    for (const f of DEMO_FILES) {
      const flight = flights[f.flightKeyIndex];
      if (!flight) continue;
      const file = await generateDemoStream(f, dir);
      const { hex: sha256, bytes } = await sha256OfStream(createReadStream(file));
      const id = randomUUID();
      const key = originalKey(organisationId, id);
      await placeOriginal(file, key);
      // the file's time is when the recorder closed it: its start plus its length
      const recorded = new Date(Date.parse(`${flight.flownOn}T10:00:00Z`) + (f.startSec + f.seconds) * 1000);
      await database.transaction(async (tx) => {
        await insertRecordingRow(tx, {
          id,
          organisationId,
          jobId: job.id,
          flightId: flight.id,
          originalName: f.name,
          relativePath: `DCIM/${f.name}`,
          sizeBytes: bytes,
          kind: "raw_h264",
          sha256,
          storageKey: key,
          uploadedBy: pilot?.id ?? null,
          recorderModifiedAt: recorded,
        });
        await recordCustodyEvent(
          {
            organisationId,
            eventType: "upload",
            evidenceType: "recording",
            evidenceId: id,
            jobId: job.id,
            originalSha256: sha256,
            originalSize: bytes,
            actor: { userId: pilot?.id ?? null, role: "pilot" },
            storageLocation: key,
            purpose: "demo scenario: generated test-pattern recording",
          },
          tx,
        );
      });
      // if Redis is away, the worker's reconciler queues rows still "waiting"
      await enqueue("process-recording", { recordingId: id }).catch(() => {});
      count++;
    }
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
  return count;
}

