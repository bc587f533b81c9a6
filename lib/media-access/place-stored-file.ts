// Puts a finished file (a still, a report PDF) at its key in the store: copied beside its final
// name, flushed, then renamed over it, so a reader never sees half a file and a crashed run leaves
// at most a stray temporary file. Running the same job twice puts the same bytes there.
import { constants } from "node:fs";
import { copyFile, mkdir, open, rename, rm } from "node:fs/promises";
import path from "node:path";
import { storePath } from "@/lib/storage/local-store";

export async function placeStoredFile(sourcePath: string, key: string): Promise<void> {
  const dest = storePath(key);
  await mkdir(path.dirname(dest), { recursive: true });
  const temp = `${dest}.part-${process.pid}-${Date.now()}`;
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
