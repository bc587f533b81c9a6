// Redis restarted without its data (SHUTDOWN NOSAVE on the suite's own Redis, which keeps no files)
// while the worker is processing recordings, stills and report builds: the reconciler queues again
// from PostgreSQL whatever Redis lost, and every job completes exactly once: each recording, still and
// report ends ready with exactly one completion event in the custody log. The repeatable schedules
// come back too.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings, reports, stills } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, enqueue, queue } from "@/lib/queue/jobs";
import { demoOrganisationId } from "@/tests/support/session";
import { makeFlight, makeJob, makeRecordingWithOriginal } from "@/tests/support/factories";
import { makeRawH264 } from "@/tests/support/media/make-h264";
import { makeProcessedRecording } from "@/tests/support/media/make-processed-recording";
import { spawnWorker, type WorkerProcess } from "@/tests/integration/processing/support/spawn-worker";
import { RELIABILITY_ENV } from "./support/reliability-env";
import { redisCommand, startRedis, stopRedisNoSave } from "./support/throwaway-services";

const RECORDINGS = 3;
const STILLS = 4;
const REPORTS = 2;
let worker: WorkerProcess | undefined;
let orgId: string;

beforeAll(async () => {
  orgId = await demoOrganisationId();
  // a quiet start: nothing left from the seed or earlier files for the worker to do first
  redisCommand("flushall");
  await db().update(recordings).set({ state: "failed", failureReason: "left over" }).where(inArray(recordings.state, ["waiting", "processing"]));
  await db().update(stills).set({ state: "failed" }).where(eq(stills.state, "pending"));
  await db().update(reports).set({ state: "failed" }).where(inArray(reports.state, ["queued", "building"]));
});
afterAll(async () => {
  worker?.killHard();
  await startRedis();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

async function allFinal(recIds: string[], stillIds: string[], reportIds: string[]) {
  const r = await db().select({ state: recordings.state }).from(recordings).where(inArray(recordings.id, recIds));
  const s = await db().select({ state: stills.state }).from(stills).where(inArray(stills.id, stillIds));
  const p = await db().select({ state: reports.state }).from(reports).where(inArray(reports.id, reportIds));
  return { recordings: r.map((x) => x.state), stills: s.map((x) => x.state), reports: p.map((x) => x.state) };
}
const openCount = (f: Awaited<ReturnType<typeof allFinal>>) =>
  f.recordings.filter((x) => x !== "ready" && x !== "failed").length + f.stills.filter((x) => x === "pending").length + f.reports.filter((x) => x === "queued" || x === "building").length;

describe("Redis restarted empty during processing", () => {
  it("every recording, still and report job completes exactly once", async () => {
    const t0 = Date.now();
    const base = await makeProcessedRecording(orgId, await makeFlight(orgId), { seconds: 2, fps: 10, width: 160, height: 96 });
    const stream = await makeRawH264({ width: 320, height: 180, fps: 25, seconds: 6 });
    const recs = [];
    for (let i = 0; i < RECORDINGS; i++) recs.push(await makeRecordingWithOriginal(orgId, stream));
    const stillRows = await db()
      .insert(stills)
      .values(Array.from({ length: STILLS }, (_, i) => ({ organisationId: orgId, recordingId: base.recording.id, frameNumber: 2 + i * 3, timeSec: (2 + i * 3) / 10 })))
      .returning();
    const job = await makeJob(orgId);
    const reportRows = await db()
      .insert(reports)
      .values(Array.from({ length: REPORTS }, (_, i) => ({ organisationId: orgId, jobId: job.id, version: i + 1 })))
      .returning();
    const recIds = recs.map((r) => r.id);
    const stillIds = stillRows.map((s) => s.id);
    const reportIds = reportRows.map((r) => r.id);
    for (const id of recIds) await enqueue("process-recording", { recordingId: id });
    for (const id of stillIds) await enqueue("extract-still", { stillId: id });
    for (const id of reportIds) await enqueue("build-report", { reportId: id });

    worker = spawnWorker({
      ...RELIABILITY_ENV,
      CAIRN_WORKER_LOCK_MS: "8000",
      CAIRN_WORKER_STALLED_CHECK_MS: "2000",
      CAIRN_WORKER_SHUTDOWN_MS: "300",
      CAIRN_WORKER_RECONCILE_MS: "2000",
    });
    await worker.waitForLine(/\[worker\] ready/);
    // the restart lands while work is going on: right after the first job is done
    await worker.waitForLine(/(process-recording|extract-still|build-report) \S+: done/, 120_000);
    const faulted = openCount(await allFinal(recIds, stillIds, reportIds));
    await stopRedisNoSave();
    await new Promise((r) => setTimeout(r, 1000));
    await startRedis();
    expect(Number(redisCommand("dbsize"))).toBeLessThanOrEqual(2); // it came back empty (a reconnecting client may have written already)

    const deadline = Date.now() + 180_000;
    let final = await allFinal(recIds, stillIds, reportIds);
    while (openCount(final) > 0 && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500));
      final = await allFinal(recIds, stillIds, reportIds);
    }
    expect(final, worker.output().slice(-3000)).toEqual({
      recordings: recIds.map(() => "ready"),
      stills: stillIds.map(() => "ready"),
      reports: reportIds.map(() => "ready"),
    });
    // exactly once: one completion event per item in the custody log
    const events = async (type: string, ids: string[]) => {
      const rows = await db().select({ evidenceId: custodyEvents.evidenceId }).from(custodyEvents).where(and(eq(custodyEvents.eventType, type), inArray(custodyEvents.evidenceId, ids)));
      return ids.map((id) => rows.filter((r) => r.evidenceId === id).length);
    };
    // let a duplicate run that might still be going finish before counting
    await new Promise((r) => setTimeout(r, 3000));
    const once = [...(await events("processing", recIds)), ...(await events("derived", stillIds)), ...(await events("report_built", reportIds))];
    expect(once).toEqual(once.map(() => 1));
    // the schedules are back
    expect(await queue("purge-uploads").getJobScheduler("purge-uploads")).toBeTruthy();
    expect(await queue("custody-checkpoints").getJobScheduler("custody-checkpoints")).toBeTruthy();
    console.log(
      `[reliability] Redis restart: ${RECORDINGS + STILLS + REPORTS} jobs (${RECORDINGS} recordings, ${STILLS} stills, ${REPORTS} reports), ` +
        `${faulted} not finished when Redis lost its data; ${once.filter((n) => n === 1).length} completed exactly once; ${((Date.now() - t0) / 1000).toFixed(1)} s`,
    );
    worker.child.kill("SIGTERM");
    await worker.exited;
  });
});
