// Faults, with the worker as a real separate process (worker/main.ts):
// 1. killed with SIGKILL in the middle of a job: after a restart the job completes, with exactly one
//    set of renditions and no work folder left behind;
// 2. SIGTERM while a job runs: the worker stops within its bound and hands the job back to the queue;
// 3. Redis loses its data while jobs wait: the reconciler queues them again from Postgres.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readdir } from "node:fs/promises";
import { and, eq, inArray } from "drizzle-orm";
import IORedis from "ioredis";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings, renditions } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, enqueue, queue } from "@/lib/queue/jobs";
import { storedSha256 } from "@/tests/support/stored-files";
import { removeDeadScratch } from "@/lib/storage/scratch";
import { env } from "@/lib/config/env";
import { makeRawH264 } from "@/tests/support/media/make-h264";
import { demoOrganisationId } from "@/tests/support/session";
import { TEST_ENV } from "@/tests/support/test-env";
import { pendingJobs, waitForRecordings } from "@/tests/support/wait-jobs";
import { makeRecordingWithOriginal } from "@/tests/support/factories";
import { spawnWorker, type WorkerProcess } from "./support/spawn-worker";
import { FAST_TAKEOVER_WORKER_ENV, quietQueue } from "./support/quiet-queue";

const WORKER_ENV = FAST_TAKEOVER_WORKER_ENV;

let orgId: string;
let stream: string; // 20 s at 432x240: long enough to be caught mid-job
let shortStream: string; // 2 s
const spawned: WorkerProcess[] = [];

function start(): WorkerProcess {
  const w = spawnWorker(WORKER_ENV);
  spawned.push(w);
  return w;
}

async function waitUntilProcessing(id: string, worker: WorkerProcess, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const [row] = await db().select({ state: recordings.state, progress: recordings.progress }).from(recordings).where(eq(recordings.id, id));
    if (row.state === "processing") return row;
    if (row.state === "ready" || row.state === "failed") throw new Error(`recording ${id} finished before it could be interrupted`);
    if (Date.now() > deadline) throw new Error(`recording ${id} never started processing; worker output:\n${worker.output()}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

async function renditionRows(id: string) {
  return db().select().from(renditions).where(eq(renditions.recordingId, id));
}

beforeAll(async () => {
  await quietQueue();
  orgId = await demoOrganisationId();
  stream = await makeRawH264({ width: 432, height: 240, fps: 30, seconds: 20, gop: 30 });
  shortStream = await makeRawH264({ width: 432, height: 240, fps: 30, seconds: 2 });
});
afterAll(async () => {
  for (const w of spawned) w.killHard();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("the worker as a process", () => {
  let survivor: WorkerProcess;

  it("killed with SIGKILL mid-job: after a restart the job completes with exactly one set of renditions", async () => {
    const rec = await makeRecordingWithOriginal(orgId, stream);
    const first = start();
    await first.waitForLine(/\[worker\] ready/);
    await enqueue("process-recording", { recordingId: rec.id });
    await waitUntilProcessing(rec.id, first);
    first.killHard();
    expect((await first.exited).signal).toBe("SIGKILL");
    // Really mid-job: nothing was committed.
    expect(await renditionRows(rec.id)).toEqual([]);
    expect((await db().select().from(recordings).where(eq(recordings.id, rec.id)))[0].state).toBe("processing");

    // The job's lock expires; the new worker's stalled-job check puts it back in the queue and runs it.
    survivor = start();
    await waitForRecordings([rec.id], { timeoutMs: 90_000 }).catch((e) => {
      throw new Error(`${(e as Error).message}\nworker output:\n${survivor.output()}`);
    });
    const [row] = await db().select().from(recordings).where(eq(recordings.id, rec.id));
    expect(row.state, survivor.output()).toBe("ready");
    const rows = await renditionRows(rec.id);
    expect(rows.map((r) => r.kind).sort()).toEqual(["playable", "poster", "sprite", "thumbnails_vtt"]);
    for (const r of rows) {
      expect(await storedSha256(r.storageKey)).toBe(r.sha256);
    }
    const runs = await db()
      .select()
      .from(custodyEvents)
      .where(and(eq(custodyEvents.evidenceId, rec.id), eq(custodyEvents.eventType, "processing")));
    expect(runs).toHaveLength(1);
    // the killed worker's scratch folder is removed as that of a stopped process (the survivor removed its own work)
    await removeDeadScratch();
    const leftovers = (await readdir(env().scratchDir, { recursive: true }).catch(() => [] as string[])).filter((n) => n.includes(rec.id));
    expect(leftovers).toEqual([]);
    expect(survivor.output()).toMatch(/stalled/);
  });

  let handedBack: string;
  it("SIGTERM mid-job: stops within its bound and the job goes back to the queue, not to failed", async () => {
    const rec = await makeRecordingWithOriginal(orgId, stream);
    handedBack = rec.id;
    await enqueue("process-recording", { recordingId: rec.id });
    await waitUntilProcessing(rec.id, survivor);
    const t0 = Date.now();
    survivor.child.kill("SIGTERM");
    const exit = await survivor.exited;
    expect(exit.code, survivor.output()).toBe(0);
    expect(Date.now() - t0).toBeLessThan(10_000);
    expect(survivor.output()).toMatch(/cancelling them/);
    const job = await queue("process-recording").getJob(`process-recording.${rec.id}`);
    expect(await job!.getState()).toBe("waiting");
    expect(await renditionRows(rec.id)).toEqual([]);
  });

  it("Redis loses its data while jobs wait: the reconciler queues them again from Postgres and none is lost", async () => {
    const a = await makeRecordingWithOriginal(orgId, shortStream);
    const b = await makeRecordingWithOriginal(orgId, shortStream);
    await enqueue("process-recording", { recordingId: a.id });
    await enqueue("process-recording", { recordingId: b.id });
    expect(await pendingJobs(["process-recording"])).toBe(3); // a, b and the job handed back above

    // A Redis restart without its data, simulated on this test slot's own Redis database only
    // (FLUSHDB on the slot's index; the Redis server is shared with other test slots and must stay up).
    const redis = new IORedis(TEST_ENV.REDIS_URL);
    await redis.flushdb();
    await redis.quit();
    expect(await pendingJobs(["process-recording"])).toBe(0);

    // Postgres still says "waiting"/"processing": a starting worker reconciles and processes them all.
    const ids = [handedBack, a.id, b.id];
    const worker = start();
    await worker.waitForLine(/reconciler: queued 3 recording/);
    await waitForRecordings(ids, { timeoutMs: 120_000 }).catch((e) => {
      throw new Error(`${(e as Error).message}\nworker output:\n${worker.output()}`);
    });
    const rows = await db().select().from(recordings).where(inArray(recordings.id, ids));
    expect(rows.map((r) => r.state)).toEqual(["ready", "ready", "ready"]);
    for (const id of ids) expect(await renditionRows(id)).toHaveLength(4);

    worker.child.kill("SIGTERM");
    expect((await worker.exited).code).toBe(0);
  });
});
