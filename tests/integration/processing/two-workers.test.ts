// Several workers share the queues: two worker processes (worker/main.ts, each with its own scratch
// folder) process a batch of 50 recordings; one is killed with SIGKILL in the middle of the batch.
// Nothing is lost and nothing is done twice: every recording ends ready with exactly one set of
// renditions (rows and stored files), exactly one "processing" custody event, and files whose SHA-256
// (Node's crypto) matches their row. Runs on the disk store and, in npm test's second pass, on S3.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings, renditions } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, enqueue } from "@/lib/queue/jobs";
import { derivedFolderKey } from "@/lib/storage/storage-keys";
import { storedKeysUnder, storedSha256 } from "@/tests/support/stored-files";
import { makeRawH264 } from "@/tests/support/media/make-h264";
import { demoOrganisationId } from "@/tests/support/session";
import { waitForRecordings } from "@/tests/support/wait-jobs";
import { makeRecordingWithOriginal } from "@/tests/support/factories";
import { spawnWorker, type WorkerProcess } from "./support/spawn-worker";
import { FAST_TAKEOVER_WORKER_ENV, quietQueue } from "./support/quiet-queue";

const BATCH = 50;
const WORKER_ENV = { ...FAST_TAKEOVER_WORKER_ENV, WORKER_CONCURRENCY: "1" };
const spawned: WorkerProcess[] = [];
let orgId: string;
let ids: string[] = [];

async function readyCount(): Promise<number> {
  return db().$count(recordings, and(inArray(recordings.id, ids), eq(recordings.state, "ready")));
}

beforeAll(async () => {
  await quietQueue();
  orgId = await demoOrganisationId();
  const stream = await makeRawH264({ width: 320, height: 180, fps: 30, seconds: 3, gop: 30 });
  ids = [];
  for (let i = 0; i < BATCH; i++) ids.push((await makeRecordingWithOriginal(orgId, stream)).id);
});
afterAll(async () => {
  for (const w of spawned) w.killHard();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("two workers on one batch", () => {
  it(`process ${BATCH} recordings, one killed mid-batch: every recording once, nothing lost`, async () => {
    const a = spawnWorker(WORKER_ENV);
    const b = spawnWorker(WORKER_ENV);
    spawned.push(a, b);
    await Promise.all([a.waitForLine(/\[worker\] ready/), b.waitForLine(/\[worker\] ready/)]);
    for (const id of ids) await enqueue("process-recording", { recordingId: id });

    // kill the first worker while the batch is under way (both are busy: the queue is far from empty)
    const deadline = Date.now() + 240_000;
    while ((await readyCount()) < 10) {
      if (Date.now() > deadline) throw new Error(`the batch did not get going\nA:\n${a.output()}\nB:\n${b.output()}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    const processingAtKill = await db().$count(recordings, and(inArray(recordings.id, ids), eq(recordings.state, "processing")));
    a.killHard();
    expect((await a.exited).signal).toBe("SIGKILL");
    const doneByA = (a.output().match(/process-recording [^\n]*: done/g) ?? []).length;

    await waitForRecordings(ids, { timeoutMs: 600_000 }).catch((e) => {
      throw new Error(`${(e as Error).message}\nB:\n${b.output()}`);
    });
    const rows = await db().select({ id: recordings.id, state: recordings.state }).from(recordings).where(inArray(recordings.id, ids));
    expect(rows.filter((r) => r.state !== "ready")).toEqual([]);

    const doneByB = (b.output().match(/process-recording [^\n]*: done/g) ?? []).length;
    console.info(`[two-workers] ${doneByA} done by the killed worker before SIGKILL, ${processingAtKill} in hand at the kill, ${doneByB} done by the survivor; survivor saw a stalled job: ${/stalled/.test(b.output())}`);
    // both workers took part, and the survivor finished what the killed one had in hand
    expect(doneByA).toBeGreaterThan(0);
    expect(doneByB).toBeGreaterThan(0);
    expect(processingAtKill).toBeGreaterThan(0);

    const rend = await db().select().from(renditions).where(inArray(renditions.recordingId, ids));
    const events = await db()
      .select({ evidenceId: custodyEvents.evidenceId })
      .from(custodyEvents)
      .where(and(inArray(custodyEvents.evidenceId, ids), eq(custodyEvents.eventType, "processing")));
    for (const id of ids) {
      const mine = rend.filter((r) => r.recordingId === id);
      expect(mine.map((r) => r.kind).sort(), id).toEqual(["playable", "poster", "sprite", "thumbnails_vtt"]);
      expect(events.filter((e) => e.evidenceId === id), id).toHaveLength(1);
      // the store holds exactly the files the rows name: no second set, no leftovers of a killed run
      expect(await storedKeysUnder(derivedFolderKey(orgId, id)), id).toEqual(mine.map((r) => r.storageKey).sort());
    }
    // every stored file is the one its row describes (a sample of ten recordings: hashing all 200 files adds little)
    for (const r of rend.filter((x) => ids.slice(0, 10).includes(x.recordingId))) expect(await storedSha256(r.storageKey)).toBe(r.sha256);
  }, 900_000);
});
