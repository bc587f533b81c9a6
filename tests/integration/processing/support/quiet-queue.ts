// For the tests that run the worker as processes of its own (faults.test.ts, two-workers.test.ts).
import { inArray } from "drizzle-orm";
import IORedis from "ioredis";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { TEST_ENV } from "@/tests/support/test-env";

// Short lock and stall checks so a dead worker's job is taken over in seconds, not a minute (yet long
// enough that a live worker on a loaded 2-core machine keeps renewing its lock in time).
export const FAST_TAKEOVER_WORKER_ENV = {
  CAIRN_WORKER_LOCK_MS: "8000",
  CAIRN_WORKER_STALLED_CHECK_MS: "2000",
  CAIRN_WORKER_SHUTDOWN_MS: "300",
  CAIRN_WORKER_RECONCILE_MS: "600000",
};

/**
 * Starts from a quiet queue: earlier test files in the same run leave jobs in Redis and rows in
 * "waiting" (with fake originals) that a spawned worker would process first, and its reconciler would
 * queue again, so the jobs under test could wait behind them past their deadline.
 */
export async function quietQueue(): Promise<void> {
  const redis = new IORedis(TEST_ENV.REDIS_URL);
  await redis.flushdb();
  await redis.quit();
  await db()
    .update(recordings)
    .set({ state: "failed", failureReason: "left over by an earlier test file" })
    .where(inArray(recordings.state, ["waiting", "processing"]));
}
