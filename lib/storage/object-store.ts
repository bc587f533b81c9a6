// The one storage interface. Every stored file (originals, renditions, stills, reports, tracks,
// evidence packages) is reached through it by its key (lib/storage/storage-keys.ts); no module outside
// lib/storage knows where or how the bytes are kept. Two implementations, chosen by STORAGE_BACKEND:
//   disk  the local folder STORAGE_DIR (lib/storage/disk-store.ts), the default
//   s3    an S3-compatible bucket through @aws-sdk/client-s3 (lib/storage/s3-store.ts)
// The contract both keep is tested in tests/integration/storage/object-store-contract.test.ts.
import type { Readable } from "node:stream";

/** A byte range, both ends inclusive (as in an HTTP Range header, RFC 9110 14.1.2). */
export type ByteRange = { start: number; end: number };

export type StoredObject = { key: string; size: number; modifiedAt: Date };

export class AlreadyStored extends Error {
  constructor(key: string) {
    super(`original already stored at ${key}`);
    this.name = "AlreadyStored";
  }
}

export interface ObjectStore {
  readonly kind: "disk" | "s3";
  /** Size of a stored object, or null when there is none. */
  stat(key: string): Promise<{ size: number } | null>;
  /** The object's bytes, or one range of them. Returned at once; a missing object errors the stream. */
  read(key: string, range?: ByteRange): Readable;
  /**
   * Puts a local file at a key, replacing what was there; a reader sees the old bytes or the new,
   * never half a file. `consume` lets the store take the file itself (it is gone afterwards).
   */
  putFile(key: string, sourceFile: string, opts?: { consume?: boolean }): Promise<void>;
  /** Places an original write-once: refuses (AlreadyStored) if the key holds anything. Consumes the source. */
  placeOnce(key: string, sourceFile: string): Promise<void>;
  /** Undoes a placement whose database commit failed: the bytes go back to a local file, the key is emptied. */
  takeBack(key: string, destFile: string): Promise<void>;
  /** Removes an object, or every object below `key/` (deletion is decided and recorded by the caller). */
  remove(key: string): Promise<void>;
  /** Makes the objects below `prefix/` exactly the files of a local folder (the worker's derived files). */
  replaceFolder(prefix: string, fromDir: string): Promise<void>;
  /** Runs `fn` on a local file holding the object's bytes and cleans up afterwards; the file is read-only to `fn`. */
  withLocalCopy<T>(key: string, fn: (file: string) => Promise<T>): Promise<T>;
  /** Every object below `prefix/`, in no particular order. */
  list(prefix: string): AsyncIterable<StoredObject>;
}
