// The worker process: connects to Redis, serves the processing queues, shuts down cleanly on SIGTERM.
import { newRedis } from "@/lib/queue/redis";
import { env } from "@/lib/config/env";

const SHUTDOWN_GRACE_MS = 20_000; // 20 s: bounded, BullMQ's close() alone can wait forever

async function main() {
  const connection = newRedis("worker");
  await connection.ping();
  console.log(`[worker] ready: Redis ${new URL(env().REDIS_URL).host}, prefix ${env().QUEUE_PREFIX}`);

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`[worker] ${signal}: shutting down`);
    const timer = setTimeout(() => {
      console.error("[worker] shutdown took too long; exiting");
      process.exit(1);
    }, SHUTDOWN_GRACE_MS);
    await connection.quit().catch(() => {});
    clearTimeout(timer);
    console.log("[worker] stopped");
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop("SIGTERM"));
  process.on("SIGINT", () => void stop("SIGINT"));
}

main().catch((err) => {
  console.error("[worker] failed to start:", err);
  process.exit(1);
});
