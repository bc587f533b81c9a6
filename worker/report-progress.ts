// Progress of a recording's processing, to two places: the BullMQ job (job.updateProgress, for
// queue tools) and recordings.progress in Postgres (what the pages read). Both are throttled: ffmpeg
// reports many times a second, and a row update per report would load the database for nothing.
import { eq } from "drizzle-orm";
import type { Job } from "bullmq";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { clampPercent } from "@/lib/processing/progress-from-timemark";

const MIN_INTERVAL_MS = 1500; // 1.5 s between writes

export function recordingProgressReporter(job: Pick<Job, "updateProgress">, recordingId: string, now: () => number = Date.now) {
  let lastWritten = -1;
  let lastAt = 0;
  let pending: Promise<unknown> = Promise.resolve();

  const write = (percent: number) => {
    lastWritten = percent;
    lastAt = now();
    // Writes are chained so they land in order; a failed progress write never fails the job.
    pending = pending
      .then(() =>
        Promise.all([
          job.updateProgress(percent),
          db().update(recordings).set({ progress: percent }).where(eq(recordings.id, recordingId)),
        ]),
      )
      .catch((err) => console.warn(`[worker] progress write failed for ${recordingId}: ${(err as Error).message}`));
  };

  return {
    report(percent: number) {
      // Whole percents only, never backwards, and 100 only when the job commits.
      const p = Math.min(99, Math.floor(clampPercent(percent)));
      if (p <= lastWritten) return;
      if (now() - lastAt < MIN_INTERVAL_MS) return;
      write(p);
    },
    /** Waits for writes in flight (before the final transaction sets 100 and the state). */
    flush: () => pending,
  };
}
