// Notifications are sent once per fact, even when the caller runs twice (a worker job retried after
// a crash): a Redis key claims the fact before sending and is released if sending fails, so a later
// call can try again. Without Redis, sending goes ahead: a repeated mail beats a lost one.
import "server-only";
import { env } from "@/lib/config/env";
import { redis } from "@/lib/queue/redis";

const CLAIM_TTL_S = 7 * 24 * 3600; // 7 days: far longer than any retry backoff

export async function sendOnce(fact: string, send: () => Promise<void>): Promise<"sent" | "already-sent"> {
  const key = `${env().QUEUE_PREFIX}:notified:${fact}`;
  let claimed = true;
  try {
    claimed = (await redis().set(key, "1", "EX", CLAIM_TTL_S, "NX")) === "OK";
  } catch {
    claimed = true;
  }
  if (!claimed) return "already-sent";
  try {
    await send();
    return "sent";
  } catch (err) {
    await redis()
      .del(key)
      .catch(() => {});
    throw err;
  }
}
