// An upload-sized file for the upload benchmarks: a real raw H.264 head (Cairn's content check reads
// the first bytes of an upload) padded with random bytes to `size`. Written once to `file` and reused
// while it has that size.
import { createWriteStream } from "node:fs";
import { mkdir, readFile, stat } from "node:fs/promises";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { makeRawH264 } from "@/tests/support/media/make-h264";

export async function paddedH264(file: string, size: number): Promise<string> {
  if ((await stat(file).catch(() => null))?.size === size) return file;
  await mkdir(path.dirname(file), { recursive: true });
  const head = await readFile(await makeRawH264({ seconds: 2 }));
  const ws = createWriteStream(file);
  ws.write(head);
  for (let left = size - head.length; left > 0; ) {
    const n = Math.min(left, 8 * 1024 * 1024);
    if (!ws.write(randomBytes(n))) await new Promise<void>((r) => ws.once("drain", () => r()));
    left -= n;
  }
  ws.end();
  await new Promise<void>((r) => ws.once("finish", () => r()));
  return file;
}
