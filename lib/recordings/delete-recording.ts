// Deletes a recording's files: the original, its derived files and its stills. Only an owner may,
// and never while the recording's job is under legal hold. The recording row stays (marked
// deleted), and so does its whole custody trail; the deletion is itself a custody event naming
// every file removed. A refused attempt is recorded too (deletion_refused), then refused.
import "server-only";
import { and, eq, isNull, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { jobs, recordings, renditions, stills } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { can } from "@/lib/auth/permissions";
import { removeKey } from "@/lib/storage/store";
import { assertStoreKey, derivedFolderKey } from "@/lib/storage/storage-keys";
import { recordCustodyEvent, type RequestFacts } from "../custody/record-custody-event";

type Facts = RequestFacts;

export type DeletionResult = { recordingId: string; deletedAt: Date; removed: string[] };

async function refuse(member: Member, rec: { id: string; jobId: string; sha256: string; sizeBytes: number; storageKey: string | null }, facts: Facts, why: "role" | "legal_hold", reason: string | null): Promise<never> {
  // its own transaction: the refusal stays on record although the request fails
  await recordCustodyEvent({
    organisationId: member.organisationId,
    eventType: "deletion_refused",
    evidenceType: "recording",
    evidenceId: rec.id,
    jobId: rec.jobId,
    originalSha256: rec.sha256,
    originalSize: rec.sizeBytes,
    actor: { userId: member.userId, role: member.role },
    ...facts,
    storageLocation: rec.storageKey,
    purpose: why === "legal_hold" ? `Deletion refused: the job is under legal hold (${reason ?? "no reason given"})` : "Deletion refused: only an owner may delete recordings",
    details: { refusedBecause: why },
  });
  if (why === "legal_hold") throw new ApiError("locked", "This recording's job is under legal hold: nothing in it can be deleted until the hold is released.");
  throw new ApiError("forbidden", "Only an owner may delete recordings");
}

export async function deleteRecording(member: Member, recordingId: string, input: { reason?: string | null }, facts: Facts): Promise<DeletionResult> {
  const [found] = await db()
    .select({ id: recordings.id, jobId: recordings.jobId, sha256: recordings.sha256, sizeBytes: recordings.sizeBytes, storageKey: recordings.storageKey, deletedAt: recordings.deletedAt })
    .from(recordings)
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, member.organisationId)));
  if (!found || found.deletedAt) throw notFound("Recording not found");
  if (!can(member.role, "recordings.delete")) return refuse(member, found, facts, "role", null);

  const outcome = await db().transaction(async (tx) => {
    // lock the job row: a hold set at the same moment either lands first (and refuses) or waits
    const [job] = await tx
      .select({ legalHold: jobs.legalHold, legalHoldReason: jobs.legalHoldReason })
      .from(jobs)
      .where(and(eq(jobs.id, found.jobId), eq(jobs.organisationId, member.organisationId)))
      .for("update");
    if (job?.legalHold) return { held: true as const, reason: job.legalHoldReason };
    const [rec] = await tx
      .update(recordings)
      .set({ deletedAt: new Date(), deletedBy: member.userId, updatedAt: new Date() })
      .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, member.organisationId), isNull(recordings.deletedAt)))
      .returning({ id: recordings.id, deletedAt: recordings.deletedAt, storageKey: recordings.storageKey });
    if (!rec) throw notFound("Recording not found");

    const derived = await tx
      .select({ storageKey: renditions.storageKey })
      .from(renditions)
      .where(and(eq(renditions.recordingId, recordingId), eq(renditions.organisationId, member.organisationId)));
    const stillKeys = await tx
      .select({ storageKey: stills.storageKey })
      .from(stills)
      .where(and(eq(stills.recordingId, recordingId), eq(stills.organisationId, member.organisationId)));
    // the original's bytes may also serve a later duplicate upload of the same file: keep them then
    let originalKey: string | null = rec.storageKey;
    if (originalKey) {
      const [sharer] = await tx
        .select({ id: recordings.id })
        .from(recordings)
        .where(and(eq(recordings.organisationId, member.organisationId), eq(recordings.duplicateOfId, recordingId), isNull(recordings.deletedAt), ne(recordings.id, recordingId)))
        .limit(1);
      if (sharer) originalKey = null;
    }
    const folder = derivedFolderKey(member.organisationId, recordingId);
    const keys = [
      ...(originalKey ? [originalKey] : []),
      folder,
      ...[...derived, ...stillKeys].map((r) => r.storageKey).filter((k): k is string => Boolean(k) && !k!.startsWith(`${folder}/`)),
    ];
    await recordCustodyEvent(
      {
        organisationId: member.organisationId,
        eventType: "deletion",
        evidenceType: "recording",
        evidenceId: recordingId,
        jobId: found.jobId,
        originalSha256: found.sha256,
        originalSize: found.sizeBytes,
        actor: { userId: member.userId, role: member.role },
        ...facts,
        storageLocation: found.storageKey,
        purpose: input.reason?.trim() ? `Recording deleted: ${input.reason.trim()}` : "Recording deleted",
        details: { removedKeys: keys, originalKept: Boolean(found.storageKey) && !originalKey },
      },
      tx,
    );
    return { held: false as const, deletedAt: rec.deletedAt!, keys };
  });
  if (outcome.held) return refuse(member, found, facts, "legal_hold", outcome.reason);

  // files go after the commit: a failed transaction never leaves evidence half-deleted
  const removed: string[] = [];
  for (const key of outcome.keys) {
    assertStoreKey(key); // refuses a key outside the store before anything is touched
    await removeKey(key);
    removed.push(key);
  }
  return { recordingId, deletedAt: outcome.deletedAt, removed };
}
