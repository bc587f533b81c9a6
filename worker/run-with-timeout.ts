// BullMQ has no job timeout: each handler runs against a timer. When the timer fires, the AbortSignal
// handed to the handler is aborted (ffmpeg children are killed through it) and the job fails with a
// timeout error, so BullMQ retries it like any other failure. The same signal is aborted when the
// worker shuts down and running jobs must stop.

export class JobTimeoutError extends Error {
  constructor(readonly timeoutMs: number) {
    super(`timed out after ${formatDuration(timeoutMs)}`);
    this.name = "JobTimeoutError";
  }
}

function formatDuration(ms: number): string {
  if (ms % 3_600_000 === 0) return `${ms / 3_600_000} h`;
  if (ms % 60_000 === 0) return `${ms / 60_000} min`;
  return `${ms / 1000} s`;
}

export async function runWithTimeout<T>(
  timeoutMs: number,
  run: (signal: AbortSignal) => Promise<T>,
  outer?: AbortSignal,
): Promise<T> {
  const controller = new AbortController();
  const timeout = new JobTimeoutError(timeoutMs);
  let timer: NodeJS.Timeout | undefined;
  const timedOut = new Promise<never>((_, reject) => {
    timer = setTimeout(() => {
      controller.abort(timeout);
      reject(timeout);
    }, timeoutMs);
  });
  const onOuterAbort = () => controller.abort(outer?.reason ?? new Error("the worker is shutting down"));
  if (outer?.aborted) onOuterAbort();
  else outer?.addEventListener("abort", onOuterAbort, { once: true });
  const work = run(controller.signal);
  // A handler that ignores its signal still loses the race; its late rejection must not go unhandled.
  work.catch(() => {});
  try {
    return await Promise.race([work, timedOut]);
  } finally {
    clearTimeout(timer);
    outer?.removeEventListener("abort", onOuterAbort);
  }
}
