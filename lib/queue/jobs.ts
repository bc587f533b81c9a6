// Every background job is one member of this map: name -> payload (ids only). The worker's handler
// table is typed against it, so a job type without a handler does not compile.
import "server-only";
import { Queue, type JobsOptions } from "bullmq";
import type IORedis from "ioredis";
import { newRedis } from "./redis";
import { env } from "@/lib/config/env";

export type JobPayloads = {
  "process-recording": { recordingId: string };
  "extract-still": { stillId: string };
  "build-report": { reportId: string };
  "purge-uploads": Record<string, never>;
  "custody-checkpoints": Record<string, never>;
  "build-evidence-package": { packageId: string };
  "retention-sweep": Record<string, never>;
};
export type JobName = keyof JobPayloads;

export type JobSettings = { attempts: number; backoffMs: number; timeoutMs: number; concurrency: number };

// Attempts, backoff, timeout and concurrency per job type, in one table.
export const JOB_SETTINGS: Record<JobName, JobSettings> = {
  "process-recording": { attempts: 3, backoffMs: 10_000, timeoutMs: 3 * 3600_000, concurrency: 1 }, // 3 h: a 60-minute stream on 2 cores
  "extract-still": { attempts: 3, backoffMs: 2_000, timeoutMs: 5 * 60_000, concurrency: 2 },
  "build-report": { attempts: 2, backoffMs: 5_000, timeoutMs: 10 * 60_000, concurrency: 1 },
  "purge-uploads": { attempts: 1, backoffMs: 0, timeoutMs: 10 * 60_000, concurrency: 1 },
  "custody-checkpoints": { attempts: 3, backoffMs: 30_000, timeoutMs: 10 * 60_000, concurrency: 1 },
  "build-evidence-package": { attempts: 2, backoffMs: 10_000, timeoutMs: 3 * 3600_000, concurrency: 1 }, // 3 h: hundreds of GB at disk speed
  "retention-sweep": { attempts: 3, backoffMs: 60_000, timeoutMs: 10 * 60_000, concurrency: 1 },
};

/** Deterministic job id: dedupes while the job exists; BullMQ ids may not contain ':' nor be all digits. */
export function jobIdFor<N extends JobName>(name: N, data: JobPayloads[N]): string {
  const id = Object.values(data as Record<string, string>).join(".") || "singleton";
  return `${name}.${id}`;
}

// A Queue given a ready-made IORedis instance treats it as shared and leaves it open in close()
// (BullMQ's connection docs), so each queue's connection is kept beside it and closed with it.
type OpenQueue = { queue: Queue; connection: IORedis };
const g = globalThis as unknown as { __cairnQueues?: Map<JobName, OpenQueue> };

export function queue(name: JobName): Queue {
  g.__cairnQueues ??= new Map();
  let open = g.__cairnQueues.get(name);
  if (!open) {
    const connection = newRedis("producer");
    connection.on("error", () => {});
    const q = new Queue(name, { connection, prefix: env().QUEUE_PREFIX });
    q.on("error", () => {});
    open = { queue: q, connection };
    g.__cairnQueues.set(name, open);
  }
  return open.queue;
}

export async function enqueue<N extends JobName>(name: N, data: JobPayloads[N], extra: JobsOptions = {}): Promise<string> {
  const s = JOB_SETTINGS[name];
  const jobId = extra.jobId ?? jobIdFor(name, data);
  await queue(name).add(name, data, {
    jobId,
    attempts: s.attempts,
    backoff: { type: "exponential", delay: s.backoffMs },
    removeOnComplete: { age: 24 * 3600, count: 1000 }, // keep a day of history
    removeOnFail: { age: 7 * 24 * 3600 },
    ...extra,
  });
  return jobId;
}

/** Closes every queue of this process and its Redis connection, so a script can exit on its own. */
export async function closeQueues(): Promise<void> {
  for (const { queue: q, connection } of g.__cairnQueues?.values() ?? []) {
    await q.close().catch(() => {});
    await connection.quit().catch(() => connection.disconnect());
  }
  g.__cairnQueues?.clear();
}
