// Puts a finished file (a still, a report PDF) at its key in the store: copied beside its final
// name, flushed, then renamed over it, so a reader never sees half a file and a crashed run leaves
// at most a stray temporary file. Running the same job twice puts the same bytes there.
import "server-only";
import { constants } from "node:fs";
import { copyFile, mkdir, open, rename, rm } from "node:fs/promises";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { storePath } from "@/lib/storage/local-store";

export async function placeStoredFile(sourcePath: string, key: string): Promise<void> {
  const dest = storePath(key);
  await mkdir(path.dirname(dest), { recursive: true });
  // unique per call: two runs of one job in one process (a still's job delivered twice, concurrency 2)
  // can start in the same millisecond, and must neither collide on nor remove each other's temp file
  const temp = `${dest}.part-${process.pid}-${randomUUID()}`;
  try {
    await copyFile(sourcePath, temp, constants.COPYFILE_EXCL);
    const fh = await open(temp, "r");
    try {
      await fh.sync();
    } finally {
      await fh.close();
    }
    await rename(temp, dest);
  } catch (err) {
    await rm(temp, { force: true });
    throw err;
  }
}
