// The storage contract (lib/storage/object-store.ts), run against both implementations in the same
// run: the disk store in a folder of its own, and the S3 store against the local S3 server that
// docker-less-dev starts (s3rver). Byte equality is checked with SHA-256 from Node's crypto.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { mkdtemp, readFile, readdir, rm, stat, writeFile } from "node:fs/promises";
import { createHash, randomBytes, randomUUID } from "node:crypto";
import os from "node:os";
import path from "node:path";
import { env } from "@/lib/config/env";
import { DiskStore } from "@/lib/storage/disk-store";
import { s3StoreFromSettings } from "@/lib/storage/store";
import { AlreadyStored, type ObjectStore } from "@/lib/storage/object-store";

const sha = (b: Buffer) => createHash("sha256").update(b).digest("hex");
async function collect(stream: NodeJS.ReadableStream): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}

let work: string;
// the configured S3 store's own settings (the local S3 server in the tests), below a prefix of this run
const s3 = () => s3StoreFromSettings(`contract-${process.pid}`);

beforeAll(async () => {
  work = await mkdtemp(path.join(os.tmpdir(), "cairn-contract-"));
});
afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

async function localFile(bytes: Buffer): Promise<string> {
  const f = path.join(work, randomUUID());
  await writeFile(f, bytes);
  return f;
}

const stores: Array<[string, () => Promise<ObjectStore>]> = [
  ["disk", async () => new DiskStore(await mkdtemp(path.join(os.tmpdir(), "cairn-disk-store-")))],
  ["s3", async () => s3()],
];

describe.each(stores)("the %s store", (kind, make) => {
  let store: ObjectStore;
  beforeAll(async () => {
    store = await make();
  });
  const key = (name: string) => `contract/${randomUUID()}/${name}`;

  it("puts a file and reads it back whole and by byte ranges, the last byte included", async () => {
    const bytes = randomBytes(100_003);
    const k = key("a.bin");
    await store.putFile(k, await localFile(bytes));
    expect(await store.stat(k)).toEqual({ size: bytes.length });
    expect(sha(await collect(store.read(k)))).toBe(sha(bytes));
    for (const [start, end] of [[0, 0], [10, 65_546], [100_000, 100_002]]) {
      expect((await collect(store.read(k, { start, end }))).equals(bytes.subarray(start, end + 1))).toBe(true);
    }
  });

  it("answers null for a missing key and errors the read stream, never hangs", async () => {
    const k = key("missing");
    expect(await store.stat(k)).toBeNull();
    await expect(collect(store.read(k))).rejects.toThrow();
  });

  it("a multipart-sized file (20 MB, more than two 8 MiB parts) round-trips byte-exact", async () => {
    const bytes = randomBytes(20 * 1000 * 1000);
    const k = key("big.bin");
    await store.putFile(k, await localFile(bytes));
    expect(await store.stat(k)).toEqual({ size: bytes.length });
    expect(sha(await collect(store.read(k)))).toBe(sha(bytes));
  });

  it("places an original once: the source is consumed, a second placement is refused and the first bytes stay", async () => {
    const first = randomBytes(4096);
    const k = key("original");
    const src = await localFile(first);
    await store.placeOnce(k, src);
    expect(await stat(src).catch(() => null)).toBeNull();
    const second = await localFile(randomBytes(4096));
    await expect(store.placeOnce(k, second)).rejects.toBeInstanceOf(AlreadyStored);
    expect(await stat(second).then(() => true)).toBe(true); // the refused file is left to its owner
    expect(sha(await collect(store.read(k)))).toBe(sha(first));
  });

  it("takes a placed original back out to a local file and empties the key", async () => {
    const bytes = randomBytes(3000);
    const k = key("taken");
    await store.placeOnce(k, await localFile(bytes));
    const back = path.join(work, `back-${randomUUID()}`);
    await store.takeBack(k, back);
    expect(sha(await readFile(back))).toBe(sha(bytes));
    expect(await store.stat(k)).toBeNull();
  });

  it("two puts of one key at the same moment both succeed and leave one whole file", async () => {
    const bytes = randomBytes(256 * 1024);
    const k = key("still.jpg");
    const src = await localFile(bytes);
    // the same millisecond for both on disk (request signing needs the real clock on S3)
    if (kind === "disk") vi.spyOn(Date, "now").mockReturnValue(1_796_258_479_018);
    try {
      await Promise.all([store.putFile(k, src), store.putFile(k, src)]);
    } finally {
      vi.restoreAllMocks();
    }
    expect(sha(await collect(store.read(k)))).toBe(sha(bytes));
    const listed = [];
    for await (const o of store.list(path.posix.dirname(k))) listed.push(o.key);
    expect(listed).toEqual([k]); // no temporary file beside it
  });

  it("replaces a folder: new files in, files not among them out, untouched neighbours kept", async () => {
    const folder = key("derived");
    const neighbour = `${folder}-next/keep.txt`;
    await store.putFile(neighbour, await localFile(Buffer.from("neighbour")));
    const v1 = await mkdtemp(path.join(work, "v1-"));
    await writeFile(path.join(v1, "playable.mp4"), "old video");
    await writeFile(path.join(v1, "sprite.jpg"), "old sprite");
    await store.replaceFolder(folder, v1);
    const v2 = await mkdtemp(path.join(work, "v2-"));
    await writeFile(path.join(v2, "playable.mp4"), "new video");
    await writeFile(path.join(v2, "poster.jpg"), "new poster");
    await store.replaceFolder(folder, v2);
    const listed: string[] = [];
    for await (const o of store.list(folder)) listed.push(o.key);
    expect(listed.sort()).toEqual([`${folder}/playable.mp4`, `${folder}/poster.jpg`]);
    expect((await collect(store.read(`${folder}/playable.mp4`))).toString()).toBe("new video");
    expect(await store.stat(neighbour)).toEqual({ size: 9 });
  });

  it("removes one object, or a whole folder, and nothing beside it", async () => {
    const folder = key("gone");
    for (const n of ["a", "b", "c/d"]) await store.putFile(`${folder}/${n}`, await localFile(Buffer.from(n)));
    const other = `${folder}-other/x`;
    await store.putFile(other, await localFile(Buffer.from("x")));
    await store.remove(`${folder}/a`);
    expect(await store.stat(`${folder}/a`)).toBeNull();
    expect(await store.stat(`${folder}/b`)).not.toBeNull();
    await store.remove(folder);
    const left: string[] = [];
    for await (const o of store.list(folder)) left.push(o.key);
    expect(left).toEqual([]);
    expect(await store.stat(other)).toEqual({ size: 1 });
  });

  it("hands out a local copy with the same bytes, and cleans up a downloaded one afterwards", async () => {
    const bytes = randomBytes(70_000);
    const k = key("copy.bin");
    await store.putFile(k, await localFile(bytes));
    let seen = "";
    const got = await store.withLocalCopy(k, async (file) => {
      seen = file;
      return sha(await readFile(file));
    });
    expect(got).toBe(sha(bytes));
    if (kind === "s3") expect(await stat(seen).catch(() => null)).toBeNull();
    await expect(store.withLocalCopy(key("nothing"), async () => "ran")).rejects.toThrow();
  });

  it("refuses keys that would leave the store", async () => {
    for (const bad of ["../escape", "a/../../b", "/etc/passwd"]) {
      expect(() => store.read(bad), bad).toThrow(/outside the store/);
    }
  });
});

describe("the S3 store's write-once request", () => {
  it("sends If-None-Match: * with an original, so a bucket with conditional writes refuses a second writer", async () => {
    const store = s3();
    const seen: Array<Record<string, string>> = [];
    store.client.middlewareStack.add(
      (next) => async (args) => {
        const req = (args as { request?: { headers?: Record<string, string> } }).request;
        if (req?.headers) seen.push({ ...req.headers });
        return next(args);
      },
      { step: "finalizeRequest", name: "captureHeaders" },
    );
    await store.placeOnce(`contract/${randomUUID()}/original`, await localFile(randomBytes(100)));
    expect(seen.some((h) => h["if-none-match"] === "*")).toBe(true);
  });
});

describe("scratch space", () => {
  it("lives outside the store, a folder per process", async () => {
    const { scratchFolder } = await import("@/lib/storage/scratch");
    const dir = await scratchFolder("contract");
    expect(dir.startsWith(env().storageDir)).toBe(false);
    expect(path.basename(path.dirname(dir))).toBe(`${os.hostname()}-${process.pid}`);
    expect(await readdir(dir)).toEqual([]);
  });
});
