// Fixed-window rate limits kept in Redis, so several web processes share one count.
import { createHash } from "node:crypto";
import { redis } from "@/lib/queue/redis";
import { env } from "@/lib/config/env";

export type Limit = { max: number; windowSec: number };

export const SIGN_IN_LIMITS = {
  perAccount: { max: 5, windowSec: 15 * 60 }, // 5 tries per 15 min per e-mail
  perAddress: { max: 30, windowSec: 15 * 60 }, // 30 tries per 15 min per client address
} satisfies Record<string, Limit>;

const key = (bucket: string, subject: string) =>
  `${env().QUEUE_PREFIX}:rl:${bucket}:${createHash("sha256").update(subject.toLowerCase()).digest("hex").slice(0, 32)}`;

/** Counts one attempt; returns false when the subject is over its limit. */
export async function hit(bucket: string, subject: string, limit: Limit): Promise<boolean> {
  const k = key(bucket, subject);
  const n = await redis().incr(k);
  if (n === 1) await redis().expire(k, limit.windowSec);
  return n <= limit.max;
}

export async function reset(bucket: string, subject: string): Promise<void> {
  await redis().del(key(bucket, subject));
}
