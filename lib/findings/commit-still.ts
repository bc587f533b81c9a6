// The commit of an "extract-still" job's result, in one transaction: the still's row becomes "ready"
// with its stored JPEG's key, size in pixels and SHA-256, and one "derived" custody event. Only one run
// makes the still: a second run of the same job (queued again by the reconciler while the first was
// still going) waits on the row lock, then finds it ready and records nothing. False then.
import "server-only";
import { and, eq, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { stills } from "@/db/schema";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import type { ExtractedFrame } from "./extract-frame";

export interface MadeStill {
  still: { id: string; organisationId: string; findingId: string | null; frameNumber: number };
  /** The recording the still was taken from (its original's hash and size go into the custody event). */
  recording: { id: string; jobId: string; sha256: string; sizeBytes: number };
  /** Where the JPEG was placed (lib/storage/storage-keys.ts stillKey). */
  storageKey: string;
  frame: ExtractedFrame;
  sha256: string;
}

export async function commitStill(made: MadeStill): Promise<boolean> {
  const { still, recording: rec, storageKey: key, frame } = made;
  return db().transaction(async (tx) => {
    const [won] = await tx
      .update(stills)
      .set({ state: "ready", storageKey: key, width: frame.width, height: frame.height, sha256: made.sha256, failureReason: null, updatedAt: new Date() })
      .where(and(eq(stills.id, still.id), ne(stills.state, "ready")))
      .returning({ id: stills.id });
    if (!won) return false;
    await recordCustodyEvent(
      {
        organisationId: still.organisationId,
        eventType: "derived",
        evidenceType: "still",
        evidenceId: still.id,
        jobId: rec.jobId,
        originalSha256: rec.sha256,
        originalSize: rec.sizeBytes,
        storageLocation: key,
        purpose: "finding still",
        tool: frame.tool,
        toolArgs: frame.args,
        outputSha256: made.sha256,
        details: { recordingId: rec.id, findingId: still.findingId, frameNumber: still.frameNumber, ptsTime: frame.ptsTime },
      },
      tx,
    );
    return true;
  });
}
