// Failure is a state, not a crash: files the worker cannot process end as "failed" with a reason a
// pilot can read, the original stays byte for byte what was uploaded (and read-only), and the worker
// goes on to serve the next job. A retry through the reprocess route runs the job again.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { copyFile, mkdir, rm, stat, truncate, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { eq, inArray } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { recordings, renditions } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, enqueue, queue } from "@/lib/queue/jobs";
import { diskPath, onDiskStore, storedSha256 } from "@/tests/support/stored-files";
import { startWorker, type RunningWorker } from "@/worker/start-worker";
import * as reprocessRoute from "@/app/api/recordings/[id]/reprocess/route";
import { makeRawH264, runTool } from "@/tests/support/media/make-h264";
import { demoActors, demoOrganisationId, req, route } from "@/tests/support/session";
import { waitForRecordings, waitJobs } from "@/tests/support/wait-jobs";
import { makeRecordingWithOriginal } from "@/tests/support/factories";

const dir = path.join(os.tmpdir(), `cairn-test-3-bad-${process.pid}`);
let worker: RunningWorker;
let orgId: string;

/** Deterministic bytes (xorshift32), so the garbage is the same on every run. */
function pseudoRandomBytes(length: number, seed = 0x2545f491): Buffer {
  const out = Buffer.alloc(length);
  let x = seed >>> 0;
  for (let i = 0; i < length; i++) {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    out[i] = x & 0xff;
  }
  return out;
}

async function makeBadFiles() {
  await mkdir(dir, { recursive: true });
  const files: Record<string, { file: string; kind: "raw_h264" | "mp4" }> = {};

  // An MP4 cut short before its index: ffmpeg writes the moov box at the end without +faststart.
  const whole = path.join(dir, "whole.mp4");
  await runTool("ffmpeg", ["-v", "error", "-y", "-f", "lavfi", "-i", "testsrc2=size=320x240:rate=30", "-t", "2", "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", whole]);
  const truncated = path.join(dir, "truncated.mp4");
  await copyFile(whole, truncated);
  await truncate(truncated, Math.floor((await stat(whole)).size * 0.6));
  files.truncated = { file: truncated, kind: "mp4" };

  // A start code, then noise: what a recorder leaves when it dies right after opening a file.
  const garbage = path.join(dir, "garbage.264");
  await writeFile(garbage, Buffer.concat([Buffer.from([0, 0, 0, 1]), pseudoRandomBytes(64 * 1024)]));
  files.garbage = { file: garbage, kind: "raw_h264" };

  const empty = path.join(dir, "empty.264");
  await writeFile(empty, Buffer.alloc(0));
  files.empty = { file: empty, kind: "raw_h264" };

  // A valid MP4 holding only an audio track.
  const audioOnly = path.join(dir, "audio-only.mp4");
  await runTool("ffmpeg", ["-v", "error", "-y", "-f", "lavfi", "-i", "sine=frequency=440:duration=1", "-c:a", "aac", audioOnly]);
  files.audioOnly = { file: audioOnly, kind: "mp4" };

  // Not a video at all, named like one.
  const text = path.join(dir, "notes.mp4");
  await writeFile(text, "Battery 2 swapped at 10:42, wind 12 kt from the west.\n".repeat(50));
  files.text = { file: text, kind: "mp4" };
  return files;
}

beforeAll(async () => {
  orgId = await demoOrganisationId();
  worker = await startWorker({ only: ["process-recording"], log: () => {} });
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
  await worker?.stop();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("files that cannot be processed", () => {
  it("each end as failed with a readable reason, the original untouched, and the worker serves the next job", async () => {
    const bad = await makeBadFiles();
    const good = await makeRawH264({ width: 432, height: 240, fps: 30, seconds: 2 });
    const rows: Record<string, Awaited<ReturnType<typeof makeRecordingWithOriginal>>> = {};
    for (const [name, { file, kind }] of Object.entries(bad)) rows[name] = await makeRecordingWithOriginal(orgId, file, { kind });
    rows.good = await makeRecordingWithOriginal(orgId, good);
    // Bad jobs first, the good one last: it only runs once the worker has been through every failure.
    for (const name of [...Object.keys(bad), "good"]) await enqueue("process-recording", { recordingId: rows[name].id });
    await waitJobs({ names: ["process-recording"] });
    const ids = Object.values(rows).map((r) => r.id);
    await waitForRecordings(ids);

    const now = Object.fromEntries(
      (await db().select().from(recordings).where(inArray(recordings.id, ids))).map((r) => [r.id, r]),
    );
    const expected: Record<string, RegExp> = {
      truncated: /incomplete or truncated/i,
      garbage: /No H\.264 video found/i,
      empty: /empty \(0 bytes\)/i,
      audioOnly: /No video track: the file holds only audio/i,
      text: /not a video format/i,
    };
    for (const [name, reason] of Object.entries(expected)) {
      const row = now[rows[name].id];
      expect(row.state, name).toBe("failed");
      expect(row.failureReason, name).toMatch(reason);
      expect(row.failureReason!.length, name).toBeLessThan(200);
      const r = await db().select().from(renditions).where(eq(renditions.recordingId, row.id));
      expect(r, name).toEqual([]);
      // Byte for byte what was uploaded (SHA-256 by Node's crypto), still read-only.
      const key = row.storageKey!;
      expect(await storedSha256(key), name).toBe(row.sha256);
      if (onDiskStore()) expect((await stat(diskPath(key))).mode & 0o777, name).toBe(0o444);
    }
    expect(now[rows.good.id].state).toBe("ready");

    // Refusals are final on the first attempt: retrying cannot change a file's content.
    const job = await queue("process-recording").getJob(`process-recording.${rows.garbage.id}`);
    expect(job?.attemptsMade).toBe(1);
    expect(await job?.getState()).toBe("failed");
  });

  it("a retry through the reprocess route runs the job again and fails again with the same reason", async () => {
    const actors = await demoActors();
    const [row] = await db()
      .select()
      .from(recordings)
      .where(eq(recordings.failureReason, "The file is empty (0 bytes)"))
      .limit(1);
    const res = await reprocessRoute.POST(await req(actors.pilot, "POST", "/x"), route({ id: row.id }));
    expect(res.status).toBe(202);
    expect((await res.json()).state).toBe("waiting");
    await waitJobs({ names: ["process-recording"] });
    const [again] = await waitForRecordings([row.id]).then(() => db().select().from(recordings).where(eq(recordings.id, row.id)));
    expect(again.state).toBe("failed");
    expect(again.failureReason).toBe("The file is empty (0 bytes)");
  });
});
