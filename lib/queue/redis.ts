// Redis connections. Producers fail fast when Redis is away (enableOfflineQueue: false);
// BullMQ workers need maxRetriesPerRequest: null (docs.bullmq.io, "Connections"; docs/library-notes.md).
import "server-only";
import IORedis, { type RedisOptions } from "ioredis";
import { env } from "@/lib/config/env";

const g = globalThis as unknown as { __cairnRedis?: IORedis };

export function redisOptions(kind: "producer" | "worker"): RedisOptions {
  return kind === "worker"
    ? { maxRetriesPerRequest: null }
    : { maxRetriesPerRequest: 1, enableOfflineQueue: false, connectTimeout: 3000 };
}

export function newRedis(kind: "producer" | "worker"): IORedis {
  return new IORedis(env().REDIS_URL, redisOptions(kind));
}

/** The shared producer connection of this process (queues, rate limits). */
export function redis(): IORedis {
  if (!g.__cairnRedis) {
    // The offline queue stays on for the shared connection until it is ready, so the first
    // command after start-up does not fail; later outages fail fast.
    g.__cairnRedis = new IORedis(env().REDIS_URL, { maxRetriesPerRequest: 1, connectTimeout: 3000 });
    g.__cairnRedis.on("error", () => {});
  }
  return g.__cairnRedis;
}

export async function closeRedis(): Promise<void> {
  if (g.__cairnRedis) await g.__cairnRedis.quit().catch(() => {});
  g.__cairnRedis = undefined;
}
