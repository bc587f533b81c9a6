// The scheduled clean-up of the upload path (job "purge-uploads"; the worker schedules it).
//   - An unfinished upload older than the expiry is deleted (data and info). A finished one is
//     never deleted by age: tus's own expiry clean-up would (@tus/file-store deleteExpired compares
//     the offset written at creation; docs/library-notes.md), so it is not used.
//   - A complete upload whose commit never ran (server died, response lost, client gone) is
//     committed now, once it has been quiet for a while.
//   - The record of a settled upload (tombstone) is dropped after its time to live.
//   - Data files in the staging folder without an info file are deleted after the expiry.
//   - An original placed by a commit that died between placing the file and its transaction, and
//     that cannot be committed any more, is deleted after a grace period. It is found from database
//     state (its placement mark in upload_reservations, with no recording), never by listing the store.
import "server-only";
import { readdir, stat, unlink } from "node:fs/promises";
import path from "node:path";
import { removeKey } from "@/lib/storage/store";
import { settleUpload } from "./settle-upload";
import { StagingStore } from "./staging-store";
import { settledMark } from "./upload-metadata";
import { ORPHAN_GRACE_MS, STALLED_INGEST_AFTER_MS, UPLOAD_EXPIRY_MS, UPLOAD_TOMBSTONE_TTL_MS } from "./upload-limits";
import { uploadService } from "./upload-server";
import { keyInUse, releaseFiledReservations, releaseReservation, strandedPlacements, unplacedReservations } from "./upload-reservations";

export type PurgeOptions = {
  now?: number;
  store?: StagingStore;
  expiryMs?: number;
  tombstoneTtlMs?: number;
  stalledAfterMs?: number;
  orphanGraceMs?: number;
};

export type PurgeReport = {
  expiredUploads: number;
  committedStalled: number;
  tombstonesRemoved: number;
  strayFilesRemoved: number;
  orphanOriginalsRemoved: number;
};

const mtimeOf = (p: string) => stat(p).then((s) => s.mtimeMs, () => null);

export async function purgeAbandonedUploads(opts: PurgeOptions = {}): Promise<PurgeReport> {
  const now = opts.now ?? Date.now();
  const store = opts.store ?? uploadService().store;
  const expiryMs = opts.expiryMs ?? UPLOAD_EXPIRY_MS;
  const tombstoneTtlMs = opts.tombstoneTtlMs ?? UPLOAD_TOMBSTONE_TTL_MS;
  const stalledAfterMs = opts.stalledAfterMs ?? STALLED_INGEST_AFTER_MS;
  const report: PurgeReport = { expiredUploads: 0, committedStalled: 0, tombstonesRemoved: 0, strayFilesRemoved: 0, orphanOriginalsRemoved: 0 };
  // uploads that may still commit (their placed original is not an orphan), and all with an info file
  const pendingUploadIds = new Set<string>();
  const knownUploadIds = new Set<string>();

  const names = new Set(await readdir(store.directory).catch(() => [] as string[]));
  for (const name of names) {
    if (!name.endsWith(".json")) continue;
    const id = name.slice(0, -5);
    if (!StagingStore.isUploadId(id)) continue;
    try {
      const info = await store.readInfo(id);
      if (!info) continue;
      knownUploadIds.add(id);
      const created = info.creation_date ? Date.parse(info.creation_date) : ((await mtimeOf(path.join(store.directory, name))) ?? now);
      const staged = await store.stagedSize(id);
      const mark = settledMark(info.metadata);
      if (mark) {
        if (staged !== null) await store.removeData(id); // a settled upload keeps no data here
        await releaseReservation(id); // its bytes count no more (the release at its outcome may have failed)
        if (now - created > tombstoneTtlMs) {
          await store.removeInfo(id);
          report.tombstonesRemoved++;
        }
        continue;
      }
      const complete = info.size !== undefined && (staged === null || staged >= info.size);
      if (complete) {
        pendingUploadIds.add(id);
        const quietSince = (await mtimeOf(staged === null ? path.join(store.directory, name) : store.dataPath(id))) ?? created;
        if (now - quietSince < stalledAfterMs) continue;
        try {
          const outcome = await settleUpload(store, id);
          if (outcome.state !== "storing") report.committedStalled++;
        } catch (err) {
          // data gone and nothing placed: nothing can be committed any more
          if (staged === null && now - created > expiryMs) {
            await store.removeInfo(id);
            report.expiredUploads++;
          } else {
            console.warn(`[purge] could not commit stalled upload ${id}:`, (err as Error).message);
          }
        }
        continue;
      }
      if (now - created > expiryMs) {
        await store.remove(id).catch(async () => {
          await store.removeData(id);
          await store.removeInfo(id);
        });
        report.expiredUploads++;
      }
    } catch (err) {
      console.warn(`[purge] skipped upload ${id}:`, (err as Error).message);
    }
  }

  // data files whose info file is gone
  for (const name of names) {
    if (name.endsWith(".json") || names.has(`${name}.json`) || !StagingStore.isUploadId(name)) continue;
    const m = await mtimeOf(path.join(store.directory, name));
    if (m !== null && now - m > expiryMs) {
      await unlink(path.join(store.directory, name)).catch(() => {});
      report.strayFilesRemoved++;
    }
  }

  report.orphanOriginalsRemoved = await removeOrphanOriginals(now, opts.orphanGraceMs ?? ORPHAN_GRACE_MS, expiryMs, pendingUploadIds, knownUploadIds);
  return report;
}

/**
 * Originals placed by a commit that died before its transaction (and could not be committed since):
 * found from database state alone, the placement marks in upload_reservations with no recording
 * (lib/uploads/upload-reservations.ts), never by listing the store. Also drops reservations that can
 * no longer be used: their upload was filed, or its info file is gone past the expiry.
 */
async function removeOrphanOriginals(now: number, graceMs: number, expiryMs: number, pendingUploads: Set<string>, knownUploads: Set<string>): Promise<number> {
  let removed = 0;
  for (const p of await strandedPlacements(new Date(now - graceMs))) {
    if (pendingUploads.has(p.uploadId)) continue; // its commit can still run, and will use this original
    if (!(await keyInUse(p.originalKey))) {
      console.warn(`[purge] removing an original whose commit never filed a recording: ${p.originalKey}`);
      await removeKey(p.originalKey);
      removed++;
    }
    await releaseReservation(p.uploadId);
  }
  await releaseFiledReservations();
  for (const r of await unplacedReservations(new Date(now - expiryMs))) {
    if (!knownUploads.has(r.uploadId)) await releaseReservation(r.uploadId);
  }
  return removed;
}
