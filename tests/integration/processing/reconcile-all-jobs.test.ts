// The reconciler after Redis lost its data: every job type that works on a row is queued again from
// PostgreSQL (a recording "waiting", a still "pending", a report version "queued"), not only the
// recordings. And a job that runs twice at once (the reconciler queued it again while the first run,
// whose Redis entry was lost, was still going) completes once: one still, one custody event.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import IORedis from "ioredis";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings, reports, stills } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, queue } from "@/lib/queue/jobs";
import { reconcileJobs } from "@/worker/reconcile-jobs";
import { extractStill } from "@/worker/handlers/extract-still";
import { demoOrganisationId } from "@/tests/support/session";
import { makeJob, makeFlight, makeRecordingWithOriginal } from "@/tests/support/factories";
import { makeRawH264 } from "@/tests/support/media/make-h264";
import { makeProcessedRecording } from "@/tests/support/media/make-processed-recording";
import { TEST_ENV } from "@/tests/support/test-env";

let orgId: string;
beforeAll(async () => {
  orgId = await demoOrganisationId();
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("the reconciler", () => {
  it("queues again the recording, the still and the report build whose jobs Redis lost", async () => {
    const rec = await makeRecordingWithOriginal(orgId, await makeRawH264({ width: 160, height: 96, fps: 10, seconds: 1 }));
    const [still] = await db().insert(stills).values({ organisationId: orgId, recordingId: rec.id, frameNumber: 3, timeSec: 0.3 }).returning();
    const job = await makeJob(orgId);
    const [report] = await db().insert(reports).values({ organisationId: orgId, jobId: job.id, version: 1 }).returning();
    // Redis restarted without its data, on this test slot's own Redis database only
    const redis = new IORedis(TEST_ENV.REDIS_URL);
    await redis.flushdb();
    await redis.quit();

    const first = await reconcileJobs();
    expect(first.requeued.recordings).toContain(rec.id);
    expect(first.requeued.stills).toContain(still.id);
    expect(first.requeued.reports).toContain(report.id);
    expect(await (await queue("extract-still").getJob(`extract-still.${still.id}`))?.getState()).toBe("waiting");
    expect(await (await queue("build-report").getJob(`build-report.${report.id}`))?.getState()).toBe("waiting");
    // a second pass finds them queued and adds nothing
    const second = await reconcileJobs();
    expect([...second.requeued.recordings, ...second.requeued.stills, ...second.requeued.reports]).toEqual([]);
    // a worker serving only recordings does not queue what it would not run
    await queue("extract-still").obliterate({ force: true });
    expect((await reconcileJobs({ only: ["process-recording"] })).requeued.stills).toEqual([]);

    // leave nothing waiting for later test files
    await queue("process-recording").obliterate({ force: true });
    await queue("build-report").obliterate({ force: true });
    await db().update(recordings).set({ state: "failed", failureReason: "reconciler test" }).where(eq(recordings.id, rec.id));
    await db().update(stills).set({ state: "failed" }).where(eq(stills.id, still.id));
    await db().update(reports).set({ state: "failed" }).where(eq(reports.id, report.id));
  });
});

describe("a still job run twice at once", () => {
  it("makes the still once, with one custody event", async () => {
    const rec = await makeProcessedRecording(orgId, await makeFlight(orgId), { seconds: 1, fps: 10, width: 160, height: 96 });
    const [still] = await db().insert(stills).values({ organisationId: orgId, recordingId: rec.recording.id, frameNumber: 4, timeSec: 0.4 }).returning();
    const outcomes = await Promise.all([extractStill({ stillId: still.id }), extractStill({ stillId: still.id })]);
    expect(outcomes).toContain("made");
    const events = await db()
      .select()
      .from(custodyEvents)
      .where(and(eq(custodyEvents.evidenceId, still.id), eq(custodyEvents.eventType, "derived")));
    expect(events).toHaveLength(1);
    const [row] = await db().select().from(stills).where(eq(stills.id, still.id));
    expect(row.state).toBe("ready");
    expect(events[0].outputSha256).toBe(row.sha256);
  });
});
