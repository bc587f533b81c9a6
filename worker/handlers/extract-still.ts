// Job "extract-still": the full-resolution picture of a finding's exact frame, taken from the playable
// rendition (the video the reviewer marked it on; same frames, same timing), stored under its own key,
// hashed, and recorded in the custody log (the commit: lib/findings/commit-still.ts). Reloads its row;
// returns quietly when the row is gone or the still is already made; rethrows failures so BullMQ retries.
import { rm } from "node:fs/promises";
import path from "node:path";
import { createReadStream } from "node:fs";
import { and, eq, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { renditions, stills } from "@/db/schema";
import { loadReviewRecording } from "@/lib/recordings/load-review-recording";
import { extractFrame } from "@/lib/findings/extract-frame";
import { stillKey } from "@/lib/storage/storage-keys";
import { putStoredFile, statKey, withLocalCopy } from "@/lib/storage/store";
import { scratchFolder } from "@/lib/storage/scratch";
import { sha256OfStream } from "@/lib/custody/sha256-stream";
import { commitStill } from "@/lib/findings/commit-still";
import type { JobPayloads } from "@/lib/queue/jobs";
import type { JobContext } from "./job-context";

export type ExtractStillOutcome = "made" | "already-made" | "gone";

export async function extractStill(data: JobPayloads["extract-still"], ctx: JobContext = {}): Promise<ExtractStillOutcome> {
  const [still] = await db().select().from(stills).where(eq(stills.id, data.stillId));
  if (!still) return "gone";
  if (still.state === "ready" && still.storageKey && (await statKey(still.storageKey))) return "already-made";

  const work = await scratchFolder("still");
  try {
    const rec = await loadReviewRecording(still.organisationId, still.recordingId).catch(() => null);
    if (!rec) {
      await markFailed(still.id, "The recording was deleted before the still was made");
      return "gone";
    }
    if (!rec.timing) throw new Error("the recording has no frame timing yet (not processed)");
    const [playable] = await db()
      .select({ storageKey: renditions.storageKey })
      .from(renditions)
      .where(and(eq(renditions.recordingId, rec.id), eq(renditions.organisationId, rec.organisationId), eq(renditions.kind, "playable")));
    if (!playable) throw new Error("the recording has no playable rendition to take the still from");
    await ctx.progress?.(10);

    const out = path.join(work, "still.jpg");
    const rate = rec.timing.rate;
    const frame = await withLocalCopy(playable.storageKey, (input) =>
      extractFrame({ input, inputName: "playable.mp4", frame: still.frameNumber, rate, output: out, signal: ctx.signal }),
    );
    await ctx.progress?.(70);
    const digest = await sha256OfStream(createReadStream(out));
    const key = stillKey(still.organisationId, still.recordingId, still.id);
    await putStoredFile(out, key);

    const made = await commitStill({ still, recording: rec, storageKey: key, frame, sha256: digest.hex });
    await ctx.progress?.(100);
    return made ? "made" : "already-made";
  } catch (err) {
    await markFailed(still.id, (err as Error).message.split("\n")[0].slice(0, 300)).catch(() => {});
    throw err;
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}

async function markFailed(stillId: string, reason: string) {
  // never over a still that another run of the same job has made meanwhile
  await db()
    .update(stills)
    .set({ state: "failed", failureReason: reason, updatedAt: new Date() })
    .where(and(eq(stills.id, stillId), ne(stills.state, "ready")));
}
