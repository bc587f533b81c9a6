// The database's record of the uploads admitted and not yet settled (table upload_reservations):
//   - the quota: an upload's declared length is reserved in the same transaction as the quota check,
//     under a transaction-level lock per organisation, so web processes anywhere cannot together
//     overrun it (lib/uploads/check-upload-quota.ts);
//   - the placement: just before an original is placed in the store its row is marked, and the row
//     goes in the transaction that files the recording, so an original placed by a commit that died
//     before its transaction is found from database state, with no listing of the store
//     (lib/uploads/purge-abandoned-uploads.ts).
import "server-only";
import { and, eq, isNotNull, isNull, lt, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { recordings, uploadReservations } from "@/db/schema";



/** Takes the organisation's quota lock for the rest of the transaction. */
export async function lockOrganisationQuota(tx: DbOrTx, organisationId: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`cairn-quota:${organisationId}`}, 0))`);
}

export async function reservedBytes(tx: DbOrTx, organisationId: string): Promise<number> {
  const [row] = await tx
    .select({ bytes: sql<string>`coalesce(sum(${uploadReservations.bytes}), 0)` })
    .from(uploadReservations)
    .where(eq(uploadReservations.organisationId, organisationId));
  return Number(row.bytes);
}

export async function insertReservation(tx: DbOrTx, row: { uploadId: string; organisationId: string; bytes: number; originalKey: string }): Promise<void> {
  await tx.insert(uploadReservations).values(row);
}

/** The upload is settled (stored, linked, refused) or gone: its bytes no longer count as reserved. */
export async function releaseReservation(uploadId: string, tx: DbOrTx = db()): Promise<void> {
  await tx.delete(uploadReservations).where(eq(uploadReservations.uploadId, uploadId));
}

/**
 * Marks that the original is about to be placed at `originalKey` (a row is made for an upload admitted
 * before reservations existed).
 */
export async function markPlacing(row: { uploadId: string; organisationId: string; bytes: number; originalKey: string }): Promise<void> {
  await db()
    .insert(uploadReservations)
    .values({ ...row, placingSince: new Date() })
    .onConflictDoUpdate({ target: uploadReservations.uploadId, set: { placingSince: new Date(), originalKey: row.originalKey } });
}

/** The placement was undone (its original went back to staging): the upload is an ordinary reservation again. */
export async function markNotPlaced(uploadId: string): Promise<void> {
  await db().update(uploadReservations).set({ placingSince: null }).where(eq(uploadReservations.uploadId, uploadId));
}

/** Reservations marked as placing before `before` whose upload filed no recording. */
export async function strandedPlacements(before: Date) {
  return db()
    .select({ uploadId: uploadReservations.uploadId, originalKey: uploadReservations.originalKey, organisationId: uploadReservations.organisationId })
    .from(uploadReservations)
    .leftJoin(recordings, eq(recordings.uploadId, uploadReservations.uploadId))
    .where(and(isNotNull(uploadReservations.placingSince), lt(uploadReservations.placingSince, before), isNull(recordings.id)));
}

/** Reservations never placed, made before `before` (an upload whose info file is gone is abandoned). */
export async function unplacedReservations(before: Date) {
  return db()
    .select({ uploadId: uploadReservations.uploadId })
    .from(uploadReservations)
    .where(and(isNull(uploadReservations.placingSince), lt(uploadReservations.createdAt, before)));
}

/** Drops the reservations of uploads that filed a recording (a release lost with its process). */
export async function releaseFiledReservations(): Promise<void> {
  await db().execute(sql`delete from upload_reservations r using recordings rec where rec.upload_id = r.upload_id`);
}

/** Whether some recording keeps its original at `key` (an original is never removed from under one). */
export async function keyInUse(key: string): Promise<boolean> {
  return (await db().$count(recordings, eq(recordings.storageKey, key))) > 0;
}
