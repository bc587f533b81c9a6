// The reconciler covers the evidence package builds too: a package row "queued" or "building" whose
// job Redis lost (restart without persistence, failover) is queued again from PostgreSQL, exactly
// once; a second pass adds nothing; a package already built or failed is left alone.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import IORedis from "ioredis";
import { inArray } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { evidencePackages } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues, queue } from "@/lib/queue/jobs";
import { reconcileJobs } from "@/worker/reconcile-jobs";
import { demoOrganisationId } from "@/tests/support/session";
import { makeJob } from "@/tests/support/factories";
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

describe("the reconciler and evidence packages", () => {
  it("queues again a queued or building package whose job Redis lost, once", async () => {
    const job = await makeJob(orgId);
    const expiresAt = new Date(Date.now() + 7 * 86_400_000);
    const rows = await db()
      .insert(evidencePackages)
      .values([
        { organisationId: orgId, jobId: job.id, state: "queued" as const, estimatedBytes: 1000, expiresAt },
        { organisationId: orgId, jobId: job.id, state: "building" as const, estimatedBytes: 1000, expiresAt },
        { organisationId: orgId, jobId: job.id, state: "failed" as const, estimatedBytes: 1000, expiresAt, failureReason: "reconciler test" },
      ])
      .returning({ id: evidencePackages.id });
    const [queued, building, failed] = rows.map((r) => r.id);
    // Redis restarted without its data, on this test slot's own Redis database only
    const redis = new IORedis(TEST_ENV.REDIS_URL);
    await redis.flushdb();
    await redis.quit();

    const first = await reconcileJobs({ only: ["build-evidence-package"] });
    expect(first.requeued.evidencePackages).toEqual(expect.arrayContaining([queued, building]));
    expect(first.requeued.evidencePackages).not.toContain(failed);
    expect(await (await queue("build-evidence-package").getJob(`build-evidence-package.${queued}`))?.getState()).toBe("waiting");
    expect(await queue("build-evidence-package").getJob(`build-evidence-package.${failed}`)).toBeUndefined();
    const second = await reconcileJobs({ only: ["build-evidence-package"] });
    expect(second.requeued.evidencePackages).toEqual([]);
    expect(await queue("build-evidence-package").getJobCountByTypes("waiting")).toBe(first.requeued.evidencePackages.length);

    // leave nothing waiting for later test files
    await queue("build-evidence-package").obliterate({ force: true });
    await db().update(evidencePackages).set({ state: "failed", failureReason: "reconciler test" }).where(inArray(evidencePackages.id, [queued, building]));
  });
});
