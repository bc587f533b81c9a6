// Stored files as the tests see them, through the same storage interface Cairn uses
// (lib/storage/object-store.ts), so a test passes on the disk store and on the S3 store alike.
// `diskPath` is for the tests that are about the local disk itself (file modes, a file edited on
// disk by hand): it refuses to answer when the configured store is not the disk.
import { writeFile, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { randomUUID, createHash } from "node:crypto";
import { env } from "@/lib/config/env";
import { DiskStore } from "@/lib/storage/disk-store";
import { listStored, objectStore, putStoredFile, readStoredBytes, statKey, withLocalCopy } from "@/lib/storage/store";

export const storeKind = () => objectStore().kind;
export const onDiskStore = () => objectStore().kind === "disk";

export const storedBytes = (key: string) => readStoredBytes(key);
export const storedText = async (key: string) => (await readStoredBytes(key)).toString("utf8");
export const storedExists = async (key: string) => (await statKey(key)) !== null;
export const storedSha256 = async (key: string) => createHash("sha256").update(await readStoredBytes(key)).digest("hex");

/** The keys below a folder, sorted. */
export async function storedKeysUnder(prefix: string): Promise<string[]> {
  const keys: string[] = [];
  for await (const o of listStored(prefix)) keys.push(o.key);
  return keys.sort();
}

/** Runs `fn` on a local file with the stored bytes (ffprobe, mp4box.js and ffmpeg need a path). */
export const withStoredFile = <T>(key: string, fn: (file: string) => Promise<T> | T) => withLocalCopy(key, async (f) => fn(f));

/** A local file with a copy of the stored bytes, for tools that read files (left in the temp folder). */
export async function storedFileCopy(key: string): Promise<string> {
  const file = path.join(os.tmpdir(), `cairn-test-copy-${randomUUID()}${path.extname(key)}`);
  await writeFile(file, await readStoredBytes(key));
  return file;
}

/** Puts bytes at a key (a fixture, or a file the test damages on purpose). */
export async function writeStoredBytes(key: string, bytes: Buffer | string): Promise<void> {
  const temp = path.join(os.tmpdir(), `cairn-test-put-${randomUUID()}`);
  await writeFile(temp, bytes);
  try {
    await putStoredFile(temp, key, { consume: true });
  } finally {
    await rm(temp, { force: true });
  }
}

/** The file of a key on the disk store; only for tests about the disk itself. */
export function diskPath(key: string): string {
  if (objectStore().kind !== "disk") throw new Error("diskPath: the configured store is not the disk store");
  return new DiskStore(env().storageDir).pathOf(key);
}
