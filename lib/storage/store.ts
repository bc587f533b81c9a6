// The configured store, and the operations the rest of Cairn uses by key. This module and the two
// implementations beside it are the only code that knows where stored bytes live.
import "server-only";
import type { Readable } from "node:stream";
import { env } from "@/lib/config/env";
import { DiskStore } from "./disk-store";
import type { ByteRange, ObjectStore } from "./object-store";
import { S3Store } from "./s3-store";
import { scratchDir } from "./scratch";

let current: ObjectStore | null = null;

/** The store STORAGE_BACKEND chooses (disk unless told otherwise). */
export function objectStore(): ObjectStore {
  if (current) return current;
  const e = env();
  current = e.STORAGE_BACKEND === "s3" ? s3StoreFromSettings() : new DiskStore(e.storageDir);
  return current;
}

/** An S3 store with the configured bucket and client settings; `keyPrefix` overrides S3_KEY_PREFIX. */
export function s3StoreFromSettings(keyPrefix?: string): S3Store {
  const e = env();
  return new S3Store({
    bucket: e.S3_BUCKET,
    keyPrefix: keyPrefix ?? e.S3_KEY_PREFIX,
    client: {
      region: e.S3_REGION,
      endpoint: e.S3_ENDPOINT,
      // a local or self-hosted server is reached as endpoint/bucket/key, not bucket.endpoint/key
      forcePathStyle: e.S3_FORCE_PATH_STYLE ? e.S3_FORCE_PATH_STYLE === "true" : Boolean(e.S3_ENDPOINT),
      credentials: e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY ? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY } : undefined,
      // checksums only where S3 requires them: many S3-compatible servers (s3rver among them) do
      // not understand the SDK's default streaming checksum trailers; integrity is checked by
      // Cairn's own SHA-256 of every file instead
      requestChecksumCalculation: "WHEN_REQUIRED",
      responseChecksumValidation: "WHEN_REQUIRED",
      maxAttempts: 5,
    },
  });
}

/** Forgets the chosen store (tests that switch STORAGE_BACKEND). */
export function resetObjectStore(): void {
  current = null;
}

export const statKey = (key: string) => objectStore().stat(key);
export const readKey = (key: string, range?: ByteRange): Readable => objectStore().read(key, range);
export const removeKey = (key: string) => objectStore().remove(key);
export const placeOriginal = (sourceFile: string, key: string) => objectStore().placeOnce(key, sourceFile);
export const putStoredFile = (sourceFile: string, key: string, opts?: { consume?: boolean }) => objectStore().putFile(key, sourceFile, opts);
export const takeBackOriginal = (key: string, destFile: string) => objectStore().takeBack(key, destFile);
export const withLocalCopy = <T>(key: string, fn: (file: string) => Promise<T>) => objectStore().withLocalCopy(key, fn);
export const replaceStoredFolder = (prefix: string, fromDir: string) => objectStore().replaceFolder(prefix, fromDir);
export const listStored = (prefix: string) => objectStore().list(prefix);

/**
 * The local folder whose free space bounds a large write (an evidence package is written there
 * before it is stored): the store itself on disk, this process's scratch space with a bucket.
 */
export async function localSpaceFolder(): Promise<string> {
  return objectStore().kind === "disk" ? env().storageDir : scratchDir();
}

/** The whole of a small stored file (a still for a report page, a WebVTT track), or one range of it. */
export async function readStoredBytes(key: string, range?: ByteRange): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of readKey(key, range)) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}
