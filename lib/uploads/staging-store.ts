// The tus staging folder: @tus/file-store's FileStore with the changes Cairn needs.
//
// 1. Bytes are hashed as they arrive. Each PATCH's bytes pass through a running SHA-256 on their
//    way to disk, so the commit at the end does not read a multi-GB file a second time. The running
//    hash lives in this process only: after a restart (or any write that failed half-way) there is
//    none, and the commit hashes the staged file from disk instead.
// 2. Every PATCH is fsynced before its new offset is acknowledged, so an offset the client was told
//    survives a power cut and a resumed upload never builds on bytes that were not on disk. Syncs
//    also run in the background while the body arrives, so that last fsync is short and the disk
//    works while the network does (bench/upload-throughput.ts measures the difference).
// 3. A settled upload keeps its info file as a record (a "tombstone": stored, duplicate or refused)
//    after its data has left the folder. A client retrying after a lost response then learns that
//    the upload is complete (HEAD answers the full offset) instead of starting it again.
// 4. A PATCH cut off by the client (a dropped link, a pause) keeps the bytes that arrived, and its
//    running hash: they are a true prefix of the file, and the resumed upload goes on from there.
//    A PATCH that breaks the protocol (more bytes than allowed) keeps nothing.
import "server-only";
import { createHash, type Hash } from "node:crypto";
import { open, stat, unlink } from "node:fs/promises";
import path from "node:path";
import type { Readable } from "node:stream";
import { FileStore } from "@tus/file-store";
import { ERRORS, Upload } from "@tus/server";
import { OneAtATime } from "./run-one-at-a-time";
import { settledMark, type SettledMark } from "./upload-metadata";
import { UPLOAD_EXPIRY_MS } from "./upload-limits";

type RunningHash = { hash: Hash; offset: number; touched: number };

const WRITE_BATCH_BYTES = 1024 * 1024; // 1 MiB per writev
const SYNC_AHEAD_BYTES = 4 * 1024 * 1024; // a background sync after every 4 MiB written (at most one at a time)

/** An error tus answers with a status (the body limit, say), as opposed to a client that went away. */
function isRefusal(err: unknown): boolean {
  return typeof err === "object" && err !== null && typeof (err as { status_code?: unknown }).status_code === "number";
}

/** The buffers left after the first `written` bytes of a partial writev. */
function dropWritten(buffers: Buffer[], written: number): Buffer[] {
  const rest: Buffer[] = [];
  for (const b of buffers) {
    if (written >= b.length) {
      written -= b.length;
      continue;
    }
    rest.push(written > 0 ? b.subarray(written) : b);
    written = 0;
  }
  return rest;
}

// tus ids are 32 hex digits (the server's default naming); anything else never names a file here
const UPLOAD_ID = /^[A-Za-z0-9_-]{1,128}$/;

export type StagedInfo = {
  id: string;
  size?: number;
  metadata?: Record<string, string | null>;
  creation_date?: string;
};

export class StagingStore extends FileStore {
  private readonly running = new Map<string, RunningHash>();

  private readonly admissions = new OneAtATime();

  /**
   * `admit` runs before an upload's info file is written and may refuse it by throwing; for uploads
   * of one organisation (metadata.cairnOrg) the check and the write happen one at a time, so what
   * `admit` counted is still true when the upload is recorded (the storage quota relies on it).
   */
  constructor(
    directory: string,
    private readonly opts: {
      fsyncEachWrite?: boolean;
      expiryMs?: number;
      admit?: (file: Upload) => Promise<void>;
      /** undoes what `admit` reserved: the upload was not recorded after all, was settled, or removed */
      release?: (id: string) => Promise<void>;
    } = {},
  ) {
    super({ directory, expirationPeriodInMilliseconds: opts.expiryMs ?? UPLOAD_EXPIRY_MS });
  }

  static isUploadId(id: string): boolean {
    return UPLOAD_ID.test(id);
  }

  dataPath(id: string): string {
    if (!StagingStore.isUploadId(id)) throw ERRORS.FILE_NOT_FOUND;
    return path.join(this.directory, id);
  }

  async readInfo(id: string): Promise<StagedInfo | undefined> {
    if (!StagingStore.isUploadId(id)) return undefined;
    return (await this.configstore.get(id)) as StagedInfo | undefined;
  }

  /** Size of the staged data file, or null when it is not (or no longer) in the folder. */
  async stagedSize(id: string): Promise<number | null> {
    try {
      return (await stat(this.dataPath(id))).size;
    } catch {
      return null;
    }
  }

  /** Writes the outcome into the upload's info file: from now on it is a tombstone. */
  async markSettled(id: string, mark: SettledMark): Promise<void> {
    const info = await this.readInfo(id);
    if (!info) return;
    const metadata: Record<string, string | null> = { ...info.metadata, cairnDone: mark.done };
    if (mark.reason) metadata.cairnReason = mark.reason;
    if (mark.recordingId) metadata.cairnRecording = mark.recordingId;
    await this.configstore.set(id, new Upload({ id, size: info.size, offset: info.size ?? 0, metadata, creation_date: info.creation_date }));
    // the outcome is written; should the database be away now, the purge releases it later
    await this.opts.release?.(id).catch((err) => console.warn(`[uploads] reservation of ${id} kept for the purge:`, (err as Error).message));
  }

  /** Removes the staged data only (the info file stays as a tombstone). */
  async removeData(id: string): Promise<void> {
    this.running.delete(id);
    await unlink(this.dataPath(id)).catch((err: NodeJS.ErrnoException) => {
      if (err.code !== "ENOENT") throw err;
    });
  }

  /** Removes the info file only. */
  async removeInfo(id: string): Promise<void> {
    await this.configstore.delete(id).catch(() => {});
  }

  /** The SHA-256 of the whole upload, if every byte of it passed through this process's running hash. */
  takeHash(id: string, size: number): string | null {
    const r = this.running.get(id);
    this.running.delete(id);
    return r && r.offset === size ? r.hash.digest("hex") : null;
  }

  override async getUpload(id: string): Promise<Upload> {
    try {
      return await super.getUpload(id);
    } catch (err) {
      if ((err as { status_code?: number }).status_code !== ERRORS.FILE_NO_LONGER_EXISTS.status_code) throw err;
      // the data has left the folder: a stored or linked upload is complete, say so
      const info = await this.readInfo(id);
      const mark = settledMark(info?.metadata);
      if (info && mark && mark.done !== "refused" && info.size !== undefined) {
        return new Upload({ id, size: info.size, offset: info.size, metadata: info.metadata, creation_date: info.creation_date });
      }
      throw err;
    }
  }

  override async create(file: Upload): Promise<Upload> {
    const record = async () => {
      await this.opts.admit?.(file);
      let created: Upload;
      try {
        created = await super.create(file);
      } catch (err) {
        await this.opts.release?.(file.id).catch(() => {});
        throw err;
      }
      this.running.set(file.id, { hash: createHash("sha256"), offset: 0, touched: Date.now() });
      return created;
    };
    const org = file.metadata?.cairnOrg;
    // one at a time per organisation in this process, so its admissions do not queue in the database
    return org ? this.admissions.run(org, record) : record();
  }

  override async remove(id: string): Promise<void> {
    this.running.delete(id);
    await super.remove(id);
    await this.opts.release?.(id);
  }

  override async write(readable: Readable, id: string, offset: number): Promise<number> {
    const file = this.dataPath(id);
    if ((await this.stagedSize(id)) === null) {
      // a settled upload whose data has left: nothing may be appended, and PatchHandler has
      // already refused any body longer than zero bytes
      for await (const _chunk of readable) void _chunk;
      return offset;
    }
    this.sweepIdleHashes();
    const running = this.running.get(id);
    const hashing = running && running.offset === offset ? running : null;
    if (running && !hashing) this.running.delete(id); // out of step: the commit will hash from disk

    let received = 0;
    const fsync = this.opts.fsyncEachWrite !== false;
    const fh = await open(file, "r+");
    // Flushing to disk while the body is still arriving: a sync of what is written so far runs in
    // the background (one at a time) every SYNC_AHEAD_BYTES, so the sync that must finish before the
    // offset is acknowledged only has the last few MiB left instead of the whole PATCH.
    let unsynced = 0;
    let syncing: Promise<void> | null = null;
    let syncFailure: unknown = null;
    const syncAhead = () => {
      if (!fsync || syncing || unsynced < SYNC_AHEAD_BYTES) return;
      unsynced = 0;
      syncing = fh
        .datasync()
        .catch((err: unknown) => void (syncFailure ??= err))
        .finally(() => void (syncing = null));
    };
    let diskFailed = false;
    let sourceError: unknown = null;
    try {
      // Request bodies arrive in small pieces (~64 KiB); writing them in batches of WRITE_BATCH_BYTES
      // with one writev keeps the number of system calls (and awaits) low.
      let batch: Buffer[] = [];
      let batchBytes = 0;
      const flush = async () => {
        let position = offset + received;
        let pending = batch;
        try {
          while (pending.length > 0) {
            const { bytesWritten } = await fh.writev(pending, position);
            position += bytesWritten;
            received += bytesWritten;
            unsynced += bytesWritten;
            pending = dropWritten(pending, bytesWritten);
          }
        } catch (err) {
          diskFailed = true;
          throw err;
        }
        batch = [];
        batchBytes = 0;
        syncAhead();
      };
      try {
        for await (const chunk of readable as AsyncIterable<Buffer>) {
          hashing?.hash.update(chunk);
          batch.push(chunk);
          batchBytes += chunk.length;
          if (batchBytes >= WRITE_BATCH_BYTES) await flush();
        }
      } catch (err) {
        if (diskFailed) throw err;
        sourceError = err;
      }
      if (sourceError && isRefusal(sourceError)) {
        // the request broke the protocol (a body longer than allowed): none of it is kept
        await syncing;
        await fh.truncate(offset);
        received = 0;
        this.running.delete(id);
      } else {
        // complete, or the client went away mid-PATCH: what arrived is a true prefix of the
        // file, so it is kept (a resumed upload goes on from there, with its running hash)
        await flush();
      }
      await syncing;
      if (syncFailure) throw syncFailure;
      if (fsync) await fh.sync();
    } catch {
      // some bytes may have been hashed that never reached the disk: drop the running hash
      this.running.delete(id);
      throw ERRORS.FILE_WRITE_ERROR;
    } finally {
      await syncing; // never close the descriptor under a sync in flight
      await fh.close();
    }
    if (hashing && this.running.get(id) === hashing) {
      hashing.offset = offset + received;
      hashing.touched = Date.now();
    }
    if (sourceError) throw sourceError;
    return offset + received;
  }

  private sweepIdleHashes() {
    const cutoff = Date.now() - this.getExpiration();
    for (const [id, r] of this.running) if (r.touched < cutoff) this.running.delete(id);
  }
}
