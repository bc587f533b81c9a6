// The organisation's storage quota: originals already stored (a duplicate stores no second copy,
// so it does not count) plus the full declared length of every upload admitted and not yet settled
// (its row in upload_reservations; one being committed counts until its transaction files the
// recording, in which its reservation goes, so it never counts twice or zero times). The check and the
// reservation are one transaction under a lock per organisation (lib/uploads/upload-reservations.ts),
// so parallel creations on any number of web processes cannot together overrun the quota.
import "server-only";
import { and, eq, isNull, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { organisations, recordings } from "@/db/schema";
import { env } from "@/lib/config/env";
import { originalKey } from "@/lib/storage/storage-keys";
import { UploadRefusal } from "./upload-refusal";
import { formatBytes } from "./format-bytes";
import { recordingIdForUpload } from "./recording-id-for-upload";
import { insertReservation, lockOrganisationQuota, reservedBytes } from "./upload-reservations";

export type StorageUse = { storedBytes: number; reservedBytes: number; quotaBytes: number };



export async function storageUse(organisationId: string, tx: DbOrTx = db()): Promise<StorageUse> {
  const [org] = await tx.select({ quota: organisations.storageQuotaBytes }).from(organisations).where(eq(organisations.id, organisationId));
  const [stored] = await tx
    .select({ bytes: sql<string>`coalesce(sum(${recordings.sizeBytes}), 0)` })
    .from(recordings)
    .where(and(eq(recordings.organisationId, organisationId), isNull(recordings.duplicateOfId), isNull(recordings.deletedAt)));
  return { storedBytes: Number(stored.bytes), reservedBytes: await reservedBytes(tx, organisationId), quotaBytes: org?.quota ?? env().ORG_QUOTA_BYTES };
}

/**
 * Checks that an upload of `bytes` fits and reserves them, in one transaction: refuses (413) one that
 * would take the organisation past its quota.
 */
export async function reserveWithinQuota(input: { organisationId: string; uploadId: string; bytes: number; fileName: string }): Promise<void> {
  await db().transaction(async (tx) => {
    await lockOrganisationQuota(tx, input.organisationId);
    const use = await storageUse(input.organisationId, tx);
    const free = Math.max(0, use.quotaBytes - use.storedBytes - use.reservedBytes);
    if (input.bytes > free) {
      throw new UploadRefusal(
        "payload_too_large",
        `“${input.fileName}” (${formatBytes(input.bytes)}) does not fit in the organisation's storage quota: ${formatBytes(free)} of ${formatBytes(use.quotaBytes)} is free (uploads in progress count in full). Ask the owner to free space or raise the quota.`,
      );
    }
    await insertReservation(tx, {
      uploadId: input.uploadId,
      organisationId: input.organisationId,
      bytes: input.bytes,
      originalKey: originalKey(input.organisationId, recordingIdForUpload(input.uploadId)),
    });
  });
}
