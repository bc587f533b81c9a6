// The scheduled purge: abandoned uploads go, finished ones never go by age, stalled commits are
// completed, and originals without a row are removed only after their grace period.
import { randomUUID } from "node:crypto";
import { readFile, stat, utimes, writeFile } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import { Upload } from "@tus/server";
import { db, closeDb } from "@/db/client";
import { recordings, uploadReservations } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { storedBytes, storedExists, writeStoredBytes } from "@/tests/support/stored-files";
import { originalKey } from "@/lib/storage/storage-keys";
import { purgeAbandonedUploads } from "@/lib/uploads/purge-abandoned-uploads";
import { settleUpload } from "@/lib/uploads/settle-upload";
import { recordingIdForUpload } from "@/lib/uploads/recording-id-for-upload";
import { toTusMetadata } from "@/lib/uploads/upload-metadata";
import { uploadService } from "@/lib/uploads/upload-server";
import { demoActors, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeRawH264, sha256Hex } from "@/tests/support/media/make-upload-fixtures";
import { stagedDataSize } from "./upload-helpers";

const DAY = 24 * 3600_000;
let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let target: { jobId: string; flightId: string };
let h264: Buffer;

beforeAll(async () => {
  actors = await demoActors();
  orgId = actors.pilot!.organisationId;
  const f = await makeFlight(orgId);
  target = { jobId: f.jobId, flightId: f.id };
  h264 = await readFile(await makeRawH264({ seconds: 1, pattern: "testsrc2", width: 256, height: 144 }));
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

const hexId = () => randomUUID().replace(/-/g, "");

/** An upload staged with `bytes` of `data` received, created `ageMs` ago. */
async function staged(data: Buffer, bytes: number, ageMs: number, filename = "staged.264"): Promise<string> {
  const { store } = uploadService();
  const id = hexId();
  const created = new Date(Date.now() - ageMs).toISOString();
  await store.create(new Upload({ id, size: data.length, offset: 0, metadata: toTusMetadata({ ...target, filename, organisationId: orgId, userId: actors.pilot!.userId }), creation_date: created }));
  if (bytes > 0) await store.write(Readable.from([data.subarray(0, bytes)]), id, 0);
  const old = new Date(Date.now() - ageMs);
  await utimes(store.dataPath(id), old, old);
  return id;
}

const infoExists = async (id: string) => (await uploadService().store.readInfo(id)) !== undefined;

describe("purgeAbandonedUploads", () => {
  it("deletes an unfinished upload past the expiry, keeps a recent one", async () => {
    const old = await staged(h264, 1000, 8 * DAY);
    const fresh = await staged(h264, 1000, 1 * DAY);
    const report = await purgeAbandonedUploads();
    expect(report.expiredUploads).toBeGreaterThanOrEqual(1);
    expect(await stagedDataSize(old)).toBeNull();
    expect(await infoExists(old)).toBe(false);
    expect(await stagedDataSize(fresh)).toBe(1000);
    expect(await infoExists(fresh)).toBe(true);
  });

  it("never deletes a finished upload by age: its recording and original stay, its record goes after its time to live", async () => {
    const id = await staged(h264, h264.length, 20 * DAY, "finished-long-ago.264");
    const outcome = await settleUpload(uploadService().store, id);
    expect(outcome.state).toBe("stored");
    const [row] = await db().select().from(recordings).where(eq(recordings.uploadId, id));
    const report = await purgeAbandonedUploads();
    expect(report.tombstonesRemoved).toBeGreaterThanOrEqual(1);
    expect(await infoExists(id)).toBe(false);
    expect(sha256Hex(await storedBytes(row.storageKey!))).toBe(sha256Hex(h264));
    expect(await db().$count(recordings, eq(recordings.id, row.id))).toBe(1);
  });

  it("commits a complete upload whose commit never ran, once it has been quiet", async () => {
    // other bytes than the test above, or this would be a duplicate of it
    const other = await readFile(await makeRawH264({ seconds: 1, pattern: "smptebars", width: 256, height: 144 }));
    const id = await staged(other, other.length, 1 * DAY, "never-committed.264");
    const report = await purgeAbandonedUploads({ stalledAfterMs: 60_000 });
    expect(report.committedStalled).toBeGreaterThanOrEqual(1);
    const [row] = await db().select().from(recordings).where(eq(recordings.uploadId, id));
    expect(row).toMatchObject({ sha256: sha256Hex(other), state: "waiting", originalName: "never-committed.264" });
  });

  it("removes an original whose commit died after placing it, found from the database after the grace period; keeps fresh ones and those with rows", async () => {
    // what a commit leaves when its process dies between placing the original and its transaction
    // (lib/uploads/settle-upload.ts): a placement mark in upload_reservations, a stored file, no recording
    const placed = async (ageMs: number) => {
      const uploadId = hexId();
      const key = originalKey(orgId, recordingIdForUpload(uploadId));
      await writeStoredBytes(key, "bytes nobody filed");
      await db().insert(uploadReservations).values({ uploadId, organisationId: orgId, bytes: 18, originalKey: key, placingSince: new Date(Date.now() - ageMs) });
      return { uploadId, key };
    };
    const orphan = await placed(2 * DAY);
    const freshOrphan = await placed(0);
    // a file that no placement mark names is not looked for: the purge never lists the store
    const unmarked = originalKey(orgId, randomUUID());
    await writeStoredBytes(unmarked, "bytes nobody filed");
    // a recording this file stored through an upload (the demo organisation also holds rows other
    // test files made with keys that name no stored file), its mark kept as if its release was lost
    const [withRow] = await db()
      .select()
      .from(recordings)
      .where(and(eq(recordings.organisationId, orgId), eq(recordings.originalName, "finished-long-ago.264")));
    await db()
      .insert(uploadReservations)
      .values({ uploadId: withRow.uploadId!, organisationId: orgId, bytes: 1, originalKey: withRow.storageKey!, placingSince: new Date(Date.now() - 2 * DAY) });

    const report = await purgeAbandonedUploads({ orphanGraceMs: DAY });
    expect(report.orphanOriginalsRemoved).toBe(1);
    expect(await storedExists(orphan.key)).toBe(false);
    expect(await storedExists(freshOrphan.key)).toBe(true);
    expect(await storedExists(unmarked)).toBe(true);
    expect(await storedExists(withRow.storageKey!)).toBe(true);
    const left = await db().select({ id: uploadReservations.uploadId }).from(uploadReservations).where(inArray(uploadReservations.uploadId, [orphan.uploadId, freshOrphan.uploadId, withRow.uploadId!]));
    expect(left.map((r) => r.id)).toEqual([freshOrphan.uploadId]);
  });

  it("removes staging data files whose info file is gone, after the expiry", async () => {
    const { store } = uploadService();
    const stray = path.join(store.directory, hexId());
    await writeFile(stray, "half an upload");
    const old = new Date(Date.now() - 8 * DAY);
    await utimes(stray, old, old);
    const report = await purgeAbandonedUploads();
    expect(report.strayFilesRemoved).toBeGreaterThanOrEqual(1);
    expect(await stat(stray).catch(() => null)).toBeNull();
  });
});
