// Demo recordings for `npm start`: short controller-like raw H.264 streams made by ffmpeg from test
// patterns (never real footage), stored as originals the way the ingest path stores them, and queued
// for the worker. The tower flight's recorder "split" its stream in two, the second file starting
// after a gap, as a recorder does when the link drops. Idempotent: skipped once the organisation
// has recordings.
import { spawn } from "node:child_process";
import { createReadStream } from "node:fs";
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { and, asc, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";
import { sha256OfStream } from "@/lib/custody/sha256-stream";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { insertRecordingRow } from "@/lib/ingest/insert-recording-row";
import { originalKey, placeOriginal } from "@/lib/storage/local-store";
import { enqueue } from "@/lib/queue/jobs";

type DemoFile = { flightKeyIndex: number; name: string; pattern: string; seconds: number; startOffsetMin: number };

// 432x240 Constrained Baseline at ~560 kbit/s, 30 fps: the shape of a controller recording
const FILES: DemoFile[] = [
  { flightKeyIndex: 0, name: "VID_0001.h264", pattern: "testsrc2", seconds: 12, startOffsetMin: 0 },
  { flightKeyIndex: 0, name: "VID_0002.h264", pattern: "testsrc", seconds: 8, startOffsetMin: 1 },
  { flightKeyIndex: 1, name: "VID_0003.h264", pattern: "smptebars", seconds: 10, startOffsetMin: 0 },
];

function ffmpeg(args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const p = spawn("ffmpeg", ["-hide_banner", "-loglevel", "error", "-y", ...args], { stdio: ["ignore", "ignore", "pipe"] });
    let err = "";
    p.stderr.on("data", (d) => (err += d));
    p.on("error", reject);
    p.on("close", (code) => (code === 0 ? resolve() : reject(new Error(`ffmpeg failed (${code}): ${err.slice(-400)}`))));
  });
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
    for (const f of FILES) {
      const flight = flights[f.flightKeyIndex];
      if (!flight) continue;
      const file = path.join(dir, f.name);
      await ffmpeg([
        "-f", "lavfi", "-i", `${f.pattern}=size=432x240:rate=30`, "-t", String(f.seconds),
        "-c:v", "libx264", "-profile:v", "baseline", "-b:v", "560k", "-g", "30", "-pix_fmt", "yuv420p", "-f", "h264", file,
      ]);
      const { hex: sha256, bytes } = await sha256OfStream(createReadStream(file));
      const id = randomUUID();
      const key = originalKey(organisationId, id);
      await placeOriginal(file, key);
      const recorded = new Date(`${flight.flownOn}T10:00:00Z`);
      recorded.setUTCMinutes(recorded.getUTCMinutes() + f.startOffsetMin);
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

