// The worker process: serves every job type from Redis, reconciles the queue with Postgres, and shuts
// down within a bound on SIGTERM/SIGINT (running jobs return to the queue if they cannot finish).
import { env, requireSecrets } from "@/lib/config/env";
import { closeDb } from "@/db/client";
import { warnAboutDurability } from "@/lib/config/check-durability";
import { startWorker } from "./start-worker";
import { workerTimings } from "./worker-options";

async function main() {
  requireSecrets();
  const timings = workerTimings();
  const running = await startWorker({ timings });
  console.log(`[worker] ready: Redis ${new URL(env().REDIS_URL).host}, pid ${process.pid}`);
  // settings that lose acknowledged work in a crash are printed, never fatal (lib/config/check-durability.ts)
  void warnAboutDurability().catch(() => {});

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`[worker] ${signal}: shutting down`);
    // The last resort if even cancelling hangs (a stuck Redis connection): exit anyway.
    const hardStop = setTimeout(() => {
      console.error("[worker] shutdown took too long; exiting");
      process.exit(1);
    }, timings.shutdownGraceMs + 15_000);
    hardStop.unref();
    const { forced } = await running.stop();
    await closeDb().catch(() => {});
    console.log(`[worker] stopped${forced ? " (running jobs were returned to the queue)" : ""}`);
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop("SIGTERM"));
  process.on("SIGINT", () => void stop("SIGINT"));
}

main().catch((err) => {
  console.error("[worker] failed to start:", err);
  process.exit(1);
});
