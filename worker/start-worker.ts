// Starts one BullMQ Worker per job type (concurrency, timeout and attempts from JOB_SETTINGS), the
// reconciler that rebuilds the queue from Postgres, and the schedule of repeatable jobs. Returns a
// handle whose stop() shuts everything down within a bound: running jobs get a grace period, then
// their ffmpeg children are killed and the jobs go back to the queue for the next worker.
import { describeErrorForLog } from "@/lib/api/describe-error-for-log";
import { Worker, WaitingError, UnrecoverableError, type Job } from "bullmq";
import type IORedis from "ioredis";
import { env } from "@/lib/config/env";
import { newRedis } from "@/lib/queue/redis";
import { JOB_SETTINGS, closeQueues, queue, type JobName } from "@/lib/queue/jobs";
import { handlers } from "./handlers";
import { runWithTimeout } from "./run-with-timeout";
import { reconcileJobs } from "./reconcile-jobs";
import { removeDeadScratch } from "@/lib/storage/scratch";
import { finalFailureReason, markRecordingFailed, markRecordingRetrying } from "./mark-recording-failed";
import { workerTimings, type WorkerTimings } from "./worker-options";
import { checkpointSettings } from "@/lib/custody/checkpoint-settings";

const PURGE_EVERY_MS = 60 * 60_000; // hourly
const RETENTION_SWEEP_EVERY_MS = 60 * 60_000; // hourly: reminders are per day, package keep dates per day
const FORCED_STOP_WAIT_MS = 5_000; // 5 s for cancelled jobs to hand themselves back

class ShutdownAbort extends Error {
  constructor() {
    super("the worker is shutting down");
    this.name = "ShutdownAbort";
  }
}

export interface RunningWorker {
  workers: Worker[];
  /** Runs the reconciler now (also runs at start and periodically). */
  reconcile(): Promise<{ checked: number; requeued: string[] }>;
  stop(): Promise<{ forced: boolean }>;
}

export interface StartOptions {
  timings?: Partial<WorkerTimings>;
  /** Only these job types (tests); default all. */
  only?: JobName[];
  log?: (line: string) => void;
}

export async function startWorker(options: StartOptions = {}): Promise<RunningWorker> {
  const timings = { ...workerTimings(), ...options.timings };
  const log = options.log ?? ((line: string) => console.log(`[worker] ${line}`));
  const shutdown = new AbortController();
  const connections: IORedis[] = [];
  const names = (Object.keys(JOB_SETTINGS) as JobName[]).filter((n) => !options.only || options.only.includes(n));
  // a worker killed mid-job on this machine left its scratch folder behind: its jobs go to another
  // worker (BullMQ's stalled-job check), its files are removed here
  const deadScratch = await removeDeadScratch().catch(() => 0);
  if (deadScratch) log(`removed the scratch folders of ${deadScratch} stopped process(es)`);

  const workers = names.map((name) => {
    const settings = JOB_SETTINGS[name];
    const connection = newRedis("worker");
    connections.push(connection);
    const handler = handlers[name] as (job: Job, signal: AbortSignal) => Promise<void>;
    const worker = new Worker(
      name,
      async (job: Job, token?: string) => {
        try {
          await runWithTimeout(settings.timeoutMs, (signal) => handler(job, signal), shutdown.signal);
        } catch (err) {
          if (shutdown.signal.aborted && !(err instanceof UnrecoverableError)) {
            // Cancelled by the shutdown, not failed: back to the queue without using up an attempt.
            await job.moveToWait(token);
            throw new WaitingError();
          }
          throw err;
        }
      },
      {
        connection,
        prefix: env().QUEUE_PREFIX,
        // WORKER_CONCURRENCY (.env.example) lets a bigger machine process several recordings at once.
        concurrency: name === "process-recording" ? Math.max(settings.concurrency, env().WORKER_CONCURRENCY) : settings.concurrency,
        lockDuration: timings.lockDurationMs,
        stalledInterval: timings.stalledIntervalMs,
        // A job whose worker died under it more than twice is given up (failed with a reason), not retried forever.
        maxStalledCount: 2,
      },
    );
    worker.on("error", (err) => console.error(`[worker] ${name}: ${describeErrorForLog(err)}`));
    worker.on("stalled", (jobId) => log(`${name} ${jobId}: stalled (its worker stopped renewing the lock); queued again`));
    worker.on("failed", (job, err) => {
      if (!job) return;
      void onFailed(name, job, err).catch((e) => console.error(`[worker] could not record the failure of ${job.id}: ${describeErrorForLog(e)}`));
    });
    worker.on("completed", (job) => log(`${name} ${job.id}: done`));
    return worker;
  });

  async function onFailed(name: JobName, job: Job, err: Error) {
    if (err instanceof WaitingError || err.name === "WaitingError") return;
    const attempts = job.opts.attempts ?? 1;
    // Final when BullMQ will not run it again: its state says so (a retry is "delayed" or "waiting"),
    // which also covers a job failed for stalling too often, whatever its attempts count says.
    const state = await job.getState().catch(() => "unknown");
    const final = err instanceof UnrecoverableError || err.name === "UnrecoverableError" || state === "failed" || (state === "unknown" && job.attemptsMade >= attempts);
    log(`${name} ${job.id}: attempt ${job.attemptsMade} of ${attempts} failed${final ? " (final)" : ""}: ${err.message.split("\n")[0]}`);
    if (name !== "process-recording") return;
    const recordingId = (job.data as { recordingId: string }).recordingId;
    if (!final) await markRecordingRetrying(recordingId);
    else await markRecordingFailed(recordingId, finalFailureReason(err, job.attemptsMade));
  }

  const reconcile = async () => {
    const { checked, requeued } = await reconcileJobs({ only: names });
    if (requeued.recordings.length) log(`reconciler: queued ${requeued.recordings.length} recording(s) again that Redis had lost`);
    if (requeued.stills.length) log(`reconciler: queued ${requeued.stills.length} still(s) again that Redis had lost`);
    if (requeued.reports.length) log(`reconciler: queued ${requeued.reports.length} report build(s) again that Redis had lost`);
    return { checked, requeued: [...requeued.recordings, ...requeued.stills, ...requeued.reports] };
  };
  // Repeatable jobs: one schedule in Redis however many workers start (same key). Set at start and
  // again on every reconciler tick: a Redis that lost its data has lost the schedules too.
  const ensureSchedules = async () => {
    if (names.includes("purge-uploads")) {
      const s = JOB_SETTINGS["purge-uploads"];
      await queue("purge-uploads").upsertJobScheduler(
        "purge-uploads",
        { every: PURGE_EVERY_MS },
        { name: "purge-uploads", data: {}, opts: { attempts: s.attempts, removeOnComplete: { count: 24 }, removeOnFail: { count: 100 } } },
      );
    }
    if (names.includes("custody-checkpoints")) {
      // signed, time-stamped checkpoints of every organisation's custody chain (lib/custody/make-checkpoint.ts)
      const s = JOB_SETTINGS["custody-checkpoints"];
      await queue("custody-checkpoints").upsertJobScheduler(
        "custody-checkpoints",
        { every: checkpointSettings().everyMs },
        { name: "custody-checkpoints", data: {}, opts: { attempts: s.attempts, backoff: { type: "exponential", delay: s.backoffMs }, removeOnComplete: { count: 24 }, removeOnFail: { count: 100 } } },
      );
    }
    if (names.includes("retention-sweep")) {
      // disposal reminders and expired evidence packages (lib/retention/run-retention-sweep.ts)
      const s = JOB_SETTINGS["retention-sweep"];
      await queue("retention-sweep").upsertJobScheduler(
        "retention-sweep",
        { every: RETENTION_SWEEP_EVERY_MS },
        { name: "retention-sweep", data: {}, opts: { attempts: s.attempts, backoff: { type: "exponential", delay: s.backoffMs }, removeOnComplete: { count: 24 }, removeOnFail: { count: 100 } } },
      );
    }
  };
  await ensureSchedules();

  const reconciles = names.includes("process-recording") || names.includes("extract-still") || names.includes("build-report");
  if (reconciles) await reconcile().catch((err) => console.error(`[worker] reconciler: ${describeErrorForLog(err)}`));
  const reconcileTimer = setInterval(() => {
    if (reconciles) reconcile().catch((err) => console.error(`[worker] reconciler: ${describeErrorForLog(err)}`));
    ensureSchedules().catch((err) => console.error(`[worker] schedules: ${describeErrorForLog(err)}`));
  }, timings.reconcileEveryMs);
  reconcileTimer.unref();

  let stopping: Promise<{ forced: boolean }> | null = null;
  const stop = () =>
    (stopping ??= (async () => {
      clearInterval(reconcileTimer);
      const closing = Promise.all(workers.map((w) => w.close()));
      let forced = false;
      const graceful = await Promise.race([closing.then(() => true), sleep(timings.shutdownGraceMs).then(() => false)]);
      if (!graceful) {
        forced = true;
        log(`jobs still running after ${timings.shutdownGraceMs} ms: cancelling them (they return to the queue)`);
        shutdown.abort(new ShutdownAbort());
        await Promise.race([closing, sleep(FORCED_STOP_WAIT_MS)]);
        await Promise.all(workers.map((w) => w.close(true).catch(() => {})));
      }
      await closeQueues();
      await Promise.all(connections.map((c) => c.quit().catch(() => c.disconnect())));
      return { forced };
    })());

  log(`serving ${names.join(", ")} (prefix ${env().QUEUE_PREFIX}, lock ${timings.lockDurationMs} ms)`);
  return { workers, reconcile, stop };
}

function sleep(ms: number) {
  return new Promise<void>((resolve) => setTimeout(resolve, ms).unref());
}
