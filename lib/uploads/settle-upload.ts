// The commit of a finished upload, exactly once per upload: check the bytes, hash them, then either
// store the original and file its recording, link the recording to an original the organisation
// already holds, or refuse the file with a reason. Called on the last PATCH, and again by any later
// request for the upload (HEAD, GET of its outcome, the purge) until it has run to the end.
//
// Crash safety comes from the order of the steps and from the recording id being derived from the
// upload id (recording-id-for-upload.ts):
//   1. the original is fsynced and renamed to its final key (the key derives from that id);
//   2. one transaction inserts the row ("waiting") and its custody event;
//   3. the upload's info becomes a tombstone; 4. the processing job is enqueued.
// A crash after 1 leaves the file at a key a retry finds again: the retry hashes it and commits.
// A failed transaction in 2 moves the file back to the staging folder: no file without a row.
// A crash after 2 leaves a row in "waiting": the worker's reconciler enqueues it at start.
// Step 2 is the single point where the upload counts as done; recordings.upload_id is unique.
import "server-only";
import { createReadStream } from "node:fs";
import { and, asc, eq, isNotNull, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { custodyEvents, flights, memberships, recordings } from "@/db/schema";
import type { Role } from "@/db/schema/types";
import { sha256OfStream } from "@/lib/custody/sha256-stream";
import { recordCustodyEvent, requestFacts } from "@/lib/custody/record-custody-event";
import { enqueue } from "@/lib/queue/jobs";
import { placeOriginal, readKey, readStoredBytes, removeKey, statKey, takeBackOriginal } from "@/lib/storage/store";
import { originalKey } from "@/lib/storage/storage-keys";
import { insertRecordingRow } from "../recordings/insert-recording-row";
import { readFileHead } from "./read-file-head";
import { recordingIdForUpload } from "./recording-id-for-upload";
import { refusalMessage, sniffContent } from "./sniff-content";
import type { StagingStore } from "./staging-store";
import { fromTusMetadata, settledMark, type StoredUploadMetadata } from "./upload-metadata";
import { SNIFF_BYTES } from "./upload-limits";
import { outcomeOfRow, outcomeOfUnfiledDuplicate, type UploadOutcome } from "./upload-outcome";
import { UploadRefusal } from "./upload-refusal";
import { withIngestLock } from "./with-ingest-lock";
import { markNotPlaced, markPlacing, releaseReservation } from "./upload-reservations";

export type SettleContext = {
  /** the request that triggered the commit, for the custody event's client address and user agent */
  req?: Request;
  /** the uploader's role when the caller already knows it */
  role?: Role | null;
  /** test seam: runs inside the commit's transaction, just before it commits */
  beforeCommit?: () => Promise<void> | void;
};

type Common = { uploadId: string; fileName: string; relativePath: string | null };

/** Settles the upload, or answers "storing" when another request is settling it right now. */
export async function settleUpload(store: StagingStore, uploadId: string, ctx: SettleContext = {}): Promise<UploadOutcome> {
  const info = await store.readInfo(uploadId);
  const meta = fromTusMetadata(info?.metadata);
  if (!info || !meta || info.size === undefined) throw new UploadRefusal("not_found", "Upload not found");
  const common: Common = { uploadId, fileName: meta.filename, relativePath: meta.relativePath ?? null };
  const mark = settledMark(info.metadata);
  if (mark?.done === "refused") return { ...common, state: "refused", reason: mark.reason ?? "The file was refused" };
  const r = await withIngestLock(uploadId, () => settleLocked(store, uploadId, meta, common, ctx));
  return r.locked ? r.value : { ...common, state: "storing" };
}

async function settleLocked(store: StagingStore, uploadId: string, meta: StoredUploadMetadata, common: Common, ctx: SettleContext): Promise<UploadOutcome> {
  const org = meta.organisationId;

  // Already committed (by an earlier request, or by one that died before writing the tombstone)?
  const committed = await outcomeOfRow(org, uploadId);
  if (committed && (committed.state === "stored" || committed.state === "duplicate")) {
    await store.removeData(uploadId);
    await store.markSettled(uploadId, { done: committed.state, recordingId: committed.recordingId });
    return committed;
  }
  // the info may have changed while we waited for the lock
  const info = await store.readInfo(uploadId);
  if (!info || info.size === undefined) throw new UploadRefusal("not_found", "Upload not found");
  const size = info.size;
  const mark = settledMark(info.metadata);
  if (mark?.done === "refused") return { ...common, state: "refused", reason: mark.reason ?? "The file was refused" };
  const unfiledId = mark?.done === "duplicate" ? mark.recordingId : await unfiledDuplicateOf(org, uploadId);
  if (unfiledId) {
    await store.removeData(uploadId);
    await store.markSettled(uploadId, { done: "duplicate", recordingId: unfiledId });
    const o = await outcomeOfUnfiledDuplicate(org, common, unfiledId);
    if (o) return o;
  }

  // Where are the bytes: still staged, or already placed by an attempt that died before its commit?
  const recordingId = recordingIdForUpload(uploadId);
  const key = originalKey(org, recordingId);
  const staged = await store.stagedSize(uploadId);
  const placed = await statKey(key);
  let source: "staged" | "placed";
  if (staged !== null) {
    if (staged < size) return { ...common, state: "receiving", offset: staged, size };
    // the staged file is complete and authoritative; a placed copy can only be a half-finished earlier attempt
    if (placed) await removeKey(key);
    source = "staged";
  } else if (placed && placed.size === size) {
    source = "placed";
  } else {
    throw new UploadRefusal("gone", `The data of “${meta.filename}” is no longer on the server; add the file again to upload it`);
  }
  const file = store.dataPath(uploadId); // the staged bytes (source "staged" only)

  const refuse = async (reason: string): Promise<UploadOutcome> => {
    if (source === "staged") await store.removeData(uploadId);
    else await removeKey(key);
    await store.markSettled(uploadId, { done: "refused", reason });
    return { ...common, state: "refused", reason };
  };

  const head = source === "staged" ? await readFileHead(file, SNIFF_BYTES) : await readStoredBytesHead(key, size);
  const sniff = sniffContent(head, size <= SNIFF_BYTES);
  if (!sniff.ok) return refuse(refusalMessage(meta.filename, sniff.reason));

  const [flight] = await db()
    .select({ jobId: flights.jobId })
    .from(flights)
    .where(and(eq(flights.id, meta.flightId), eq(flights.organisationId, org)));
  if (!flight || flight.jobId !== meta.jobId) {
    return refuse(`“${meta.filename}” was not stored: its flight was removed or moved to another job while it uploaded. Add the file again and choose a flight`);
  }

  const sha256 = (source === "staged" ? store.takeHash(uploadId, size) : null) ?? (await hashBytes(source === "staged" ? createReadStream(file) : readKey(key), size, uploadId));
  const actor = { userId: meta.userId, role: ctx.role ?? (await roleOf(meta.userId, org)) };
  const facts = ctx.req ? requestFacts(ctx.req) : { clientAddress: null, userAgent: null };
  const rowValues = {
    id: recordingId,
    organisationId: org,
    jobId: meta.jobId,
    flightId: meta.flightId,
    uploadId,
    originalName: meta.filename,
    relativePath: meta.relativePath ?? null,
    sizeBytes: size,
    kind: sniff.kind,
    sha256,
    uploadedBy: meta.userId,
    recorderModifiedAt: meta.lastModified !== undefined ? new Date(meta.lastModified) : null,
    state: "waiting" as const,
  };
  const custodyBase = {
    organisationId: org,
    evidenceType: "recording" as const,
    jobId: meta.jobId,
    originalSha256: sha256,
    originalSize: size,
    actor,
    ...facts,
    tool: "cairn-ingest",
  };

  // The same bytes already held by the organisation: no second copy.
  if (source === "staged") {
    const holder = await originalHolder(org, sha256);
    if (holder) {
      const inFlight = await sameBytesInFlight(org, meta.flightId, sha256);
      const details = { uploadId, originalName: meta.filename, relativePath: meta.relativePath ?? null, flightId: meta.flightId, duplicateOf: holder.id };
      if (inFlight) {
        // the flight already has these bytes: nothing new is filed, the attempt is recorded
        await db().transaction(async (tx) => {
          await recordCustodyEvent({ ...custodyBase, eventType: "duplicate_upload", evidenceId: inFlight.id, storageLocation: holder.storageKey, details: { ...details, linked: false } }, tx);
          await ctx.beforeCommit?.();
        });
        await store.removeData(uploadId);
        await store.markSettled(uploadId, { done: "duplicate", recordingId: inFlight.id });
        return (await outcomeOfUnfiledDuplicate(org, common, inFlight.id))!;
      }
      // another flight or job: a recording of its own in this flight, pointing at the held original
      await db().transaction(async (tx) => {
        await insertRecordingRow(tx, { ...rowValues, duplicateOfId: holder.id, storageKey: holder.storageKey });
        await releaseReservation(uploadId, tx);
        await recordCustodyEvent({ ...custodyBase, eventType: "duplicate_upload", evidenceId: recordingId, storageLocation: holder.storageKey, details: { ...details, linked: true } }, tx);
        await ctx.beforeCommit?.();
      });
      await store.removeData(uploadId);
      await store.markSettled(uploadId, { done: "duplicate", recordingId });
      await enqueueProcessing(recordingId);
      return (await outcomeOfRow(org, uploadId))!;
    }
    // from here until the recording's transaction, a death of this process leaves a placed original
    // that only this mark finds (lib/uploads/purge-abandoned-uploads.ts)
    await markPlacing({ uploadId, organisationId: org, bytes: size, originalKey: key });
    await placeOriginal(file, key);
  }

  try {
    await db().transaction(async (tx) => {
      await insertRecordingRow(tx, { ...rowValues, storageKey: key });
      await releaseReservation(uploadId, tx); // the bytes now count as stored
      await recordCustodyEvent(
        { ...custodyBase, eventType: "upload", evidenceId: recordingId, storageLocation: key, details: { uploadId, originalName: meta.filename, relativePath: meta.relativePath ?? null, flightId: meta.flightId, kind: sniff.kind } },
        tx,
      );
      await ctx.beforeCommit?.();
    });
  } catch (err) {
    // no row: the original must not stay in the store; put it back so a retry can commit it
    if (source === "staged") await returnToStaging(key, store.dataPath(uploadId), uploadId).catch((e) => console.error("[ingest] could not return an original to staging:", key, e));
    throw err;
  }
  await store.markSettled(uploadId, { done: "stored", recordingId });
  await enqueueProcessing(recordingId);
  return (await outcomeOfRow(org, uploadId))!;
}

async function hashBytes(stream: AsyncIterable<unknown>, size: number, uploadId: string): Promise<string> {
  const digest = await sha256OfStream(stream);
  if (digest.bytes !== size) throw new Error(`hashed ${digest.bytes} bytes of upload ${uploadId}, expected ${size}`);
  return digest.hex;
}

/** The first bytes of an original already placed in the store, for the content check. */
function readStoredBytesHead(key: string, size: number): Promise<Buffer> {
  return size === 0 ? Promise.resolve(Buffer.alloc(0)) : readStoredBytes(key, { start: 0, end: Math.min(size, SNIFF_BYTES) - 1 });
}

async function roleOf(userId: string, organisationId: string): Promise<Role | null> {
  const [m] = await db()
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.organisationId, organisationId)));
  return m?.role ?? null;
}

/** The recording that owns the stored copy of these bytes in the organisation (the first one filed). */
async function originalHolder(organisationId: string, sha256: string) {
  const [row] = await db()
    .select({ id: recordings.id, storageKey: recordings.storageKey })
    .from(recordings)
    .where(and(eq(recordings.organisationId, organisationId), eq(recordings.sha256, sha256), isNull(recordings.duplicateOfId), isNull(recordings.deletedAt), isNotNull(recordings.storageKey)))
    .orderBy(asc(recordings.createdAt))
    .limit(1);
  return row ? { id: row.id, storageKey: row.storageKey! } : null;
}

async function sameBytesInFlight(organisationId: string, flightId: string, sha256: string) {
  const [row] = await db()
    .select({ id: recordings.id })
    .from(recordings)
    .where(and(eq(recordings.organisationId, organisationId), eq(recordings.flightId, flightId), eq(recordings.sha256, sha256), isNull(recordings.deletedAt)))
    .orderBy(asc(recordings.createdAt))
    .limit(1);
  return row ?? null;
}

/** An unfiled duplicate leaves no row, only its custody event: find it, so it is never recorded twice. */
async function unfiledDuplicateOf(organisationId: string, uploadId: string): Promise<string | null> {
  const [row] = await db()
    .select({ evidenceId: custodyEvents.evidenceId })
    .from(custodyEvents)
    .where(and(eq(custodyEvents.organisationId, organisationId), eq(custodyEvents.eventType, "duplicate_upload"), sql`${custodyEvents.details}->>'uploadId' = ${uploadId}`))
    .limit(1);
  return row?.evidenceId ?? null;
}

async function returnToStaging(key: string, stagedPath: string, uploadId: string): Promise<void> {
  await takeBackOriginal(key, stagedPath);
  await markNotPlaced(uploadId);
}

async function enqueueProcessing(recordingId: string): Promise<void> {
  try {
    await enqueue("process-recording", { recordingId });
  } catch (err) {
    // the row is committed in state "waiting": the worker's reconciler enqueues it when it starts
    console.warn(`[ingest] could not enqueue processing of ${recordingId}; it stays waiting for the reconciler:`, (err as Error).message);
  }
}
