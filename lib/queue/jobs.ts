// Every background job is one member of this map: name -> payload (ids only). The worker's handler
// table is typed against it, so a job type without a handler does not compile.
import { Queue, type JobsOptions } from "bullmq";
import { newRedis } from "./redis";
import { env } from "@/lib/config/env";

export type JobPayloads = {
  "process-recording": { recordingId: string };
  "extract-still": { stillId: string };
  "build-report": { reportId: string };
  "purge-uploads": Record<string, never>;
};
export type JobName = keyof JobPayloads;

export type JobSettings = { attempts: number; backoffMs: number; timeoutMs: number; concurrency: number };

// Attempts, backoff, timeout and concurrency per job type, in one table.
export const JOB_SETTINGS: Record<JobName, JobSettings> = {
  "process-recording": { attempts: 3, backoffMs: 10_000, timeoutMs: 3 * 3600_000, concurrency: 1 }, // 3 h: a 60-minute stream on 2 cores
  "extract-still": { attempts: 3, backoffMs: 2_000, timeoutMs: 5 * 60_000, concurrency: 2 },
  "build-report": { attempts: 2, backoffMs: 5_000, timeoutMs: 10 * 60_000, concurrency: 1 },
  "purge-uploads": { attempts: 1, backoffMs: 0, timeoutMs: 10 * 60_000, concurrency: 1 },
};

/** Deterministic job id: dedupes while the job exists; BullMQ ids may not contain ':' nor be all digits. */
export function jobIdFor<N extends JobName>(name: N, data: JobPayloads[N]): string {
  const id = Object.values(data as Record<string, string>).join(".") || "singleton";
  return `${name}.${id}`;
}

const g = globalThis as unknown as { __cairnQueues?: Map<JobName, Queue> };

export function queue(name: JobName): Queue {
  g.__cairnQueues ??= new Map();
  let q = g.__cairnQueues.get(name);
  if (!q) {
    q = new Queue(name, { connection: newRedis("producer"), prefix: env().QUEUE_PREFIX });
    q.on("error", () => {});
    g.__cairnQueues.set(name, q);
  }
  return q;
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

export async function closeQueues(): Promise<void> {
  for (const q of g.__cairnQueues?.values() ?? []) await q.close().catch(() => {});
  g.__cairnQueues?.clear();
}
