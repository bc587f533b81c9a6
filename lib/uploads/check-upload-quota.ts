// The organisation's storage quota: originals already stored (a duplicate stores no second copy,
// so it does not count) plus the full declared length of every upload not yet settled (reserved at
// creation; one being committed counts until its outcome is written, so for a moment it may count
// twice, never zero times). Checked as an upload is recorded, one organisation's uploads at a time
// (StagingStore's admit), so parallel creations cannot together overrun the quota.
import "server-only";
import { readdir } from "node:fs/promises";
import { and, eq, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { organisations, recordings } from "@/db/schema";
import { env } from "@/lib/config/env";
import type { StagingStore } from "./staging-store";
import { UploadRefusal } from "./upload-refusal";
import { formatBytes } from "./format-bytes";

export type StorageUse = { storedBytes: number; reservedBytes: number; quotaBytes: number };

export async function storageUse(organisationId: string, store: StagingStore): Promise<StorageUse> {
  const [org] = await db().select({ quota: organisations.storageQuotaBytes }).from(organisations).where(eq(organisations.id, organisationId));
  const [stored] = await db()
    .select({ bytes: sql<string>`coalesce(sum(${recordings.sizeBytes}), 0)` })
    .from(recordings)
    .where(and(eq(recordings.organisationId, organisationId), isNull(recordings.duplicateOfId), isNull(recordings.deletedAt)));
  let reservedBytes = 0;
  for (const name of await readdir(store.directory).catch(() => [] as string[])) {
    if (!name.endsWith(".json")) continue;
    const info = await store.readInfo(name.slice(0, -5));
    if (info?.metadata?.cairnOrg === organisationId && !info.metadata.cairnDone) reservedBytes += info.size ?? 0;
  }
  return { storedBytes: Number(stored.bytes), reservedBytes, quotaBytes: org?.quota ?? env().ORG_QUOTA_BYTES };
}

/** Refuses (413) an upload of `bytes` that would take the organisation past its quota. */
export async function assertWithinQuota(organisationId: string, store: StagingStore, bytes: number, fileName: string): Promise<void> {
  const use = await storageUse(organisationId, store);
  const free = Math.max(0, use.quotaBytes - use.storedBytes - use.reservedBytes);
  if (bytes > free) {
    throw new UploadRefusal(
      "payload_too_large",
      `“${fileName}” (${formatBytes(bytes)}) does not fit in the organisation's storage quota: ${formatBytes(free)} of ${formatBytes(use.quotaBytes)} is free (uploads in progress count in full). Ask the owner to free space or raise the quota.`,
    );
  }
}
