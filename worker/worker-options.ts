// Timings of the worker process. Production values are the defaults; tests shorten them through the
// environment (a killed worker's job is found stalled after lockDuration, not after a minute).
import { z } from "zod";

const schema = z.object({
  // A job's lock is renewed every lockDuration / 2 while it runs; a worker that dies stops renewing,
  // and after lockDuration the stalled-job check hands the job to another worker.
  CAIRN_WORKER_LOCK_MS: z.coerce.number().int().min(1000).default(60_000), // 60 s
  CAIRN_WORKER_STALLED_CHECK_MS: z.coerce.number().int().min(500).default(30_000), // 30 s
  // How often Postgres is compared with the queue (after start-up), in case Redis lost jobs.
  CAIRN_WORKER_RECONCILE_MS: z.coerce.number().int().min(1000).default(5 * 60_000), // 5 min
  // SIGTERM: how long running jobs get to finish before they are cancelled.
  CAIRN_WORKER_SHUTDOWN_MS: z.coerce.number().int().min(100).default(20_000), // 20 s
});

export type WorkerTimings = {
  lockDurationMs: number;
  stalledIntervalMs: number;
  reconcileEveryMs: number;
  shutdownGraceMs: number;
};

export function workerTimings(source: Record<string, string | undefined> = process.env): WorkerTimings {
  const e = schema.parse(Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined && v !== "")));
  return {
    lockDurationMs: e.CAIRN_WORKER_LOCK_MS,
    stalledIntervalMs: e.CAIRN_WORKER_STALLED_CHECK_MS,
    reconcileEveryMs: e.CAIRN_WORKER_RECONCILE_MS,
    shutdownGraceMs: e.CAIRN_WORKER_SHUTDOWN_MS,
  };
}
