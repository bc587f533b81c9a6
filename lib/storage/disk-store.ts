// The local disk store (STORAGE_BACKEND=disk, the default): every key is a relative path below
// STORAGE_DIR. Originals are made read-only once in place and never written again; other files are
// copied beside their final name, flushed and renamed over it, so a reader never sees half a file.
import "server-only";
import { constants, createReadStream } from "node:fs";
import { chmod, copyFile, cp, mkdir, open, readdir, rename, rm, stat, unlink } from "node:fs/promises";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { AlreadyStored, type ByteRange, type ObjectStore, type StoredObject } from "./object-store";

async function fsyncPath(p: string) {
  const fh = await open(p, constants.O_RDONLY);
  try {
    await fh.sync();
  } finally {
    await fh.close();
  }
}

const exists = (p: string) => stat(p).then(() => true, () => false);

/** Moves a file, or copies it when the two paths are on different file systems. */
async function moveFile(from: string, to: string) {
  try {
    await rename(from, to);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== "EXDEV") throw err;
    await copyFile(from, to, constants.COPYFILE_EXCL);
    await fsyncPath(to);
    await unlink(from);
  }
}

export class DiskStore implements ObjectStore {
  readonly kind = "disk" as const;
  constructor(readonly root: string) {}

  /** Absolute path of a key; refuses keys that would leave the store. */
  pathOf(key: string): string {
    const full = path.resolve(this.root, key);
    if (!full.startsWith(this.root + path.sep)) throw new Error("key outside the store");
    return full;
  }

  async stat(key: string) {
    try {
      const s = await stat(this.pathOf(key));
      return s.isFile() ? { size: s.size } : null;
    } catch {
      return null;
    }
  }

  read(key: string, range?: ByteRange) {
    return createReadStream(this.pathOf(key), range ? { start: range.start, end: range.end } : undefined);
  }

  async putFile(key: string, sourceFile: string, opts: { consume?: boolean } = {}) {
    const dest = this.pathOf(key);
    await mkdir(path.dirname(dest), { recursive: true });
    // unique per call: two runs of one job (a still's job delivered twice) can start in the same
    // millisecond, and must neither collide on nor remove each other's temporary file
    const temp = `${dest}.part-${process.pid}-${randomUUID()}`;
    try {
      if (opts.consume) await moveFile(sourceFile, temp);
      else await copyFile(sourceFile, temp, constants.COPYFILE_EXCL);
      await fsyncPath(temp);
      await rename(temp, dest);
    } catch (err) {
      await rm(temp, { force: true });
      throw err;
    }
  }

  /** fsync the data, rename (or copy across file systems), make it read-only, fsync the folder so the rename survives a crash. */
  async placeOnce(key: string, sourceFile: string) {
    const dest = this.pathOf(key);
    await mkdir(path.dirname(dest), { recursive: true });
    if (await exists(dest)) throw new AlreadyStored(key);
    await fsyncPath(sourceFile);
    await moveFile(sourceFile, dest);
    await chmod(dest, 0o444);
    await fsyncPath(path.dirname(dest));
  }

  async takeBack(key: string, destFile: string) {
    const placed = this.pathOf(key);
    await chmod(placed, 0o644);
    await moveFile(placed, destFile);
  }

  async remove(key: string) {
    const p = this.pathOf(key);
    await chmod(p, 0o644).catch(() => {});
    await rm(p, { recursive: true, force: true });
  }

  /** The new folder is renamed into place and the old one removed after. */
  async replaceFolder(prefix: string, fromDir: string) {
    const dest = this.pathOf(prefix);
    await mkdir(path.dirname(dest), { recursive: true });
    const old = `${dest}.old-${process.pid}-${randomUUID()}`;
    const had = await exists(dest);
    if (had) await rename(dest, old);
    try {
      await rename(fromDir, dest);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "EXDEV") throw err;
      await mkdir(dest, { recursive: true });
      await cp(fromDir, dest, { recursive: true });
      await rm(fromDir, { recursive: true, force: true });
    }
    if (had) await rm(old, { recursive: true, force: true });
  }

  /** The stored file itself: originals are read-only, and nothing else is handed out for writing. */
  async withLocalCopy<T>(key: string, fn: (file: string) => Promise<T>): Promise<T> {
    const file = this.pathOf(key);
    if (!(await this.stat(key))) throw Object.assign(new Error(`no stored object at ${key}`), { code: "ENOENT" });
    return fn(file);
  }

  async *list(prefix: string): AsyncIterable<StoredObject> {
    const base = this.pathOf(prefix);
    const walk = async function* (dir: string, rel: string): AsyncGenerator<StoredObject> {
      for (const entry of await readdir(dir, { withFileTypes: true }).catch(() => [])) {
        const full = path.join(dir, entry.name);
        const key = `${rel}/${entry.name}`;
        if (entry.isDirectory()) yield* walk(full, key);
        else if (entry.isFile() && !entry.name.includes(".part-")) {
          const s = await stat(full).catch(() => null);
          if (s) yield { key, size: s.size, modifiedAt: s.mtime };
        }
      }
    };
    yield* walk(base, prefix.replace(/\/+$/, ""));
  }
}
