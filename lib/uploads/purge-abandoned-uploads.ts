// The scheduled clean-up of the upload path (job "purge-uploads"; the worker schedules it).
//   - An unfinished upload older than the expiry is deleted (data and info). A finished one is
//     never deleted by age: tus's own expiry clean-up would (@tus/file-store deleteExpired compares
//     the offset written at creation; docs/library-notes.md), so it is not used.
//   - A complete upload whose commit never ran (server died, response lost, client gone) is
//     committed now, once it has been quiet for a while.
//   - The record of a settled upload (tombstone) is dropped after its time to live.
//   - Data files in the staging folder without an info file are deleted after the expiry.
//   - A file in the originals store with no recording row (a commit that died between placing
//     the file and its transaction, with its upload info gone too) is deleted after a grace
//     period; one whose upload can still be committed is left for that commit.
import "server-only";
import { readdir, stat, unlink } from "node:fs/promises";
import path from "node:path";
import { inArray, or } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { listStored, removeKey } from "@/lib/storage/store";
import { ORIGINALS_FOLDER } from "@/lib/storage/storage-keys";
import { recordingIdForUpload } from "./recording-id-for-upload";
import { settleUpload } from "./settle-upload";
import { StagingStore } from "./staging-store";
import { settledMark } from "./upload-metadata";
import { ORPHAN_GRACE_MS, STALLED_INGEST_AFTER_MS, UPLOAD_EXPIRY_MS, UPLOAD_TOMBSTONE_TTL_MS } from "./upload-limits";
import { uploadService } from "./upload-server";

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
  // recordings whose upload may still commit: their placed original is not an orphan
  const pendingRecordingIds = new Set<string>();

  const names = new Set(await readdir(store.directory).catch(() => [] as string[]));
  for (const name of names) {
    if (!name.endsWith(".json")) continue;
    const id = name.slice(0, -5);
    if (!StagingStore.isUploadId(id)) continue;
    try {
      const info = await store.readInfo(id);
      if (!info) continue;
      const created = info.creation_date ? Date.parse(info.creation_date) : ((await mtimeOf(path.join(store.directory, name))) ?? now);
      const staged = await store.stagedSize(id);
      const mark = settledMark(info.metadata);
      if (mark) {
        if (staged !== null) await store.removeData(id); // a settled upload keeps no data here
        if (now - created > tombstoneTtlMs) {
          await store.removeInfo(id);
          report.tombstonesRemoved++;
        }
        continue;
      }
      const complete = info.size !== undefined && (staged === null || staged >= info.size);
      if (complete) {
        pendingRecordingIds.add(recordingIdForUpload(id));
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

  report.orphanOriginalsRemoved = await removeOrphanOriginals(now, opts.orphanGraceMs ?? ORPHAN_GRACE_MS, pendingRecordingIds);
  return report;
}

async function removeOrphanOriginals(now: number, graceMs: number, pending: Set<string>): Promise<number> {
  const candidates: { key: string; recordingId: string }[] = [];
  for await (const o of listStored(ORIGINALS_FOLDER)) {
    const recordingId = o.key.split("/").pop()!;
    if (now - o.modifiedAt.getTime() < graceMs || pending.has(recordingId)) continue;
    candidates.push({ key: o.key, recordingId });
  }
  let removed = 0;
  const UUID = /^[0-9a-f-]{36}$/;
  for (let i = 0; i < candidates.length; i += 500) {
    const batch = candidates.slice(i, i + 500);
    const ids = batch.map((c) => c.recordingId).filter((id) => UUID.test(id));
    const keys = batch.map((c) => c.key);
    const known = await db()
      .select({ id: recordings.id, storageKey: recordings.storageKey })
      .from(recordings)
      .where(ids.length ? or(inArray(recordings.id, ids), inArray(recordings.storageKey, keys)) : inArray(recordings.storageKey, keys));
    const referenced = new Set(known.flatMap((r) => [r.id, r.storageKey]));
    for (const c of batch) {
      if (referenced.has(c.recordingId) || referenced.has(c.key)) continue;
      console.warn(`[purge] removing original without a recording row: ${c.key}`);
      await removeKey(c.key);
      removed++;
    }
  }
  return removed;
}
