// Two runs of one job in one worker process (a still's job delivered twice, with concurrency 2) put
// the same file at the same key at the same moment: both must succeed, and the file must be whole.
import { afterEach, describe, expect, it, vi } from "vitest";
import { mkdtemp, readFile, readdir, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { placeStoredFile } from "@/lib/media-serving/place-stored-file";
import { storePath } from "@/lib/storage/local-store";

afterEach(() => vi.restoreAllMocks());

describe("placeStoredFile", () => {
  it("two placements of one key in the same millisecond both succeed and leave one whole file", async () => {
    const dir = await mkdtemp(path.join(os.tmpdir(), "cairn-place-"));
    const source = path.join(dir, "still.jpg");
    const bytes = Buffer.alloc(256 * 1024, 7);
    await writeFile(source, bytes);
    const key = `stills/${randomUUID()}/${randomUUID()}/${randomUUID()}.jpg`;
    vi.spyOn(Date, "now").mockReturnValue(1_796_258_479_018); // the same millisecond for both
    await Promise.all([placeStoredFile(source, key), placeStoredFile(source, key)]);
    expect((await readFile(storePath(key))).equals(bytes)).toBe(true);
    // no temporary file left beside it
    expect(await readdir(path.dirname(storePath(key)))).toEqual([path.basename(storePath(key))]);
  });
});
