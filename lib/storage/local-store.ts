// The local disk store. Originals live at a key built from organisation and recording id
// (lib/storage/storage-keys.ts), are made read-only once in place, and are never written again.
// Derived files live in a per-recording folder that the worker replaces as a whole.
import "server-only";
import { constants, createReadStream } from "node:fs";
import { chmod, copyFile, mkdir, open, rename, rm, stat, unlink } from "node:fs/promises";
import path from "node:path";
import { env } from "@/lib/config/env";
import { derivedFolderKey } from "./storage-keys";

/** Absolute path of a stored key; refuses keys that would leave the store. */
export function storePath(key: string): string {
  const root = env().storageDir;
  const full = path.resolve(root, key);
  if (!full.startsWith(root + path.sep)) throw new Error("key outside the store");
  return full;
}

async function fsyncPath(p: string, flags = constants.O_RDONLY) {
  const fh = await open(p, flags);
  try {
    await fh.sync();
  } finally {
    await fh.close();
  }
}

/**
 * Moves a finished upload into the write-once store: fsync the data, rename (or copy across
 * file systems), make it read-only, fsync the folder so the rename survives a crash.
 * Refuses to overwrite an existing original.
 */
export async function placeOriginal(sourcePath: string, key: string): Promise<void> {
  const dest = storePath(key);
  await mkdir(path.dirname(dest), { recursive: true });
  const exists = await stat(dest).then(() => true, () => false);
  if (exists) throw new Error(`original already stored at ${key}`);
  await fsyncPath(sourcePath);
  try {
    await rename(sourcePath, dest);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== "EXDEV") throw err;
    await copyFile(sourcePath, dest, constants.COPYFILE_EXCL);
    await fsyncPath(dest);
    await unlink(sourcePath);
  }
  await chmod(dest, 0o444);
  await fsyncPath(path.dirname(dest));
}

export async function statKey(key: string): Promise<{ size: number } | null> {
  try {
    const s = await stat(storePath(key));
    return { size: s.size };
  } catch {
    return null;
  }
}

export function readKey(key: string, range?: { start: number; end: number }) {
  return createReadStream(storePath(key), range ? { start: range.start, end: range.end } : undefined);
}

/** Removes a stored file or folder (deletion is decided and recorded by the caller). */
export async function removeKey(key: string): Promise<void> {
  const p = storePath(key);
  await chmod(p, 0o644).catch(() => {});
  await rm(p, { recursive: true, force: true });
}

/** Replaces a derived folder atomically-enough: the new folder is renamed into place, the old one removed. */
export async function replaceDerivedFolder(organisationId: string, recordingId: string, fromDir: string): Promise<void> {
  const dest = storePath(derivedFolderKey(organisationId, recordingId));
  await mkdir(path.dirname(dest), { recursive: true });
  const old = `${dest}.old-${process.pid}-${Date.now()}`;
  const had = await stat(dest).then(() => true, () => false);
  if (had) await rename(dest, old);
  try {
    await rename(fromDir, dest);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== "EXDEV") throw err;
    await mkdir(dest, { recursive: true });
    const { cp } = await import("node:fs/promises");
    await cp(fromDir, dest, { recursive: true });
    await rm(fromDir, { recursive: true, force: true });
  }
  if (had) await rm(old, { recursive: true, force: true });
}
