// The staging folder: bytes written in PATCH-sized pieces land byte-exact, the running SHA-256 of
// the bytes as they arrived equals GNU sha256sum of the file on disk, and a write out of step (a
// process that did not see the earlier bytes) gives no hash rather than a wrong one.
import { randomBytes } from "node:crypto";
import { mkdtemp, open, readFile, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { ERRORS, Upload } from "@tus/server";
import { StagingStore } from "@/lib/uploads/staging-store";
import { sha256sum } from "@/tests/support/media/make-upload-fixtures";

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "cairn-staging-"));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

/** A readable that yields `data` in pieces of the given sizes, as a request body does. */
function pieces(data: Buffer, sizes: number[]): Readable {
  const out: Buffer[] = [];
  let at = 0;
  for (let i = 0; at < data.length; i++) {
    const n = sizes[i % sizes.length];
    out.push(data.subarray(at, at + n));
    at += n;
  }
  return Readable.from(out);
}

const newId = () => randomBytes(16).toString("hex");

/** Like pieces(), but each piece arrives a little later, as from a network, so background syncs run while bytes still come in. */
function slowPieces(data: Buffer, size: number): Readable {
  return Readable.from(
    (async function* () {
      for (let at = 0; at < data.length; at += size) {
        await new Promise((r) => setImmediate(r));
        yield data.subarray(at, at + size);
      }
    })(),
  );
}

/** The prototype of Node's FileHandle (not exported by name), to watch or fail its datasync. */
async function fileHandlePrototype(): Promise<{ datasync: () => Promise<void> }> {
  const fh = await open(__filename, "r");
  await fh.close();
  return Object.getPrototypeOf(fh);
}

afterEach(() => {
  vi.restoreAllMocks();
});

describe("StagingStore", () => {
  it("writes PATCH after PATCH byte-exact and hashes the bytes as they arrive", async () => {
    const store = new StagingStore(dir, { fsyncEachWrite: true });
    const data = randomBytes(5 * 1024 * 1024 + 12345);
    const id = newId();
    await store.create(new Upload({ id, size: data.length, offset: 0, creation_date: new Date().toISOString() }));
    let offset = 0;
    // three PATCHes of odd sizes, each arriving in odd pieces (1 byte to 300 KiB)
    for (const patch of [1_000_001, 2_500_000, data.length - 3_500_001]) {
      offset = await store.write(pieces(data.subarray(offset, offset + patch), [65_536, 1, 300_000, 7_777]), id, offset);
    }
    expect(offset).toBe(data.length);
    expect(Buffer.compare(await readFile(store.dataPath(id)), data)).toBe(0);
    const running = store.takeHash(id, data.length);
    expect(running).toBe(await sha256sum(store.dataPath(id)));
  });

  it("syncs in the background while a large PATCH arrives, and still lands byte-exact with the right hash", async () => {
    const proto = await fileHandlePrototype();
    const datasync = vi.spyOn(proto, "datasync");
    const store = new StagingStore(dir, { fsyncEachWrite: true });
    const data = randomBytes(13 * 1024 * 1024 + 333);
    const id = newId();
    await store.create(new Upload({ id, size: data.length, offset: 0 }));
    expect(await store.write(slowPieces(data, 64 * 1024), id, 0)).toBe(data.length);
    // 13 MiB with a sync ahead every 4 MiB written (one at a time): at least two ran before the end
    expect(datasync.mock.calls.length).toBeGreaterThanOrEqual(2);
    expect(Buffer.compare(await readFile(store.dataPath(id)), data)).toBe(0);
    expect(store.takeHash(id, data.length)).toBe(await sha256sum(store.dataPath(id)));
  });

  it("a background sync that fails fails the PATCH: no offset acknowledged, no running hash", async () => {
    const proto = await fileHandlePrototype();
    vi.spyOn(proto, "datasync").mockRejectedValueOnce(Object.assign(new Error("EIO: i/o error, fdatasync"), { code: "EIO" }));
    const store = new StagingStore(dir, { fsyncEachWrite: true });
    const data = randomBytes(9 * 1024 * 1024);
    const id = newId();
    await store.create(new Upload({ id, size: data.length, offset: 0 }));
    await expect(store.write(slowPieces(data, 64 * 1024), id, 0)).rejects.toMatchObject({ status_code: 500 });
    expect(store.takeHash(id, data.length)).toBeNull();
  });

  it("without per-PATCH syncing (fsyncEachWrite: false) no sync runs at all", async () => {
    const proto = await fileHandlePrototype();
    const datasync = vi.spyOn(proto, "datasync");
    const store = new StagingStore(dir, { fsyncEachWrite: false });
    const data = randomBytes(9 * 1024 * 1024);
    const id = newId();
    await store.create(new Upload({ id, size: data.length, offset: 0 }));
    expect(await store.write(slowPieces(data, 64 * 1024), id, 0)).toBe(data.length);
    expect(datasync).not.toHaveBeenCalled();
  });

  it("a PATCH cut off by the client keeps what arrived, and the resumed upload still gets its running hash", async () => {
    const store = new StagingStore(dir, { fsyncEachWrite: true });
    const data = randomBytes(7 * 1024 * 1024);
    const id = newId();
    await store.create(new Upload({ id, size: data.length, offset: 0 }));
    const cut = 3 * 1024 * 1024 + 100; // not on a batch boundary
    const dropped = Object.assign(new Error("aborted"), { code: "ECONNRESET" });
    const body = Readable.from(
      (async function* () {
        for (let at = 0; at < cut; at += 65_536) yield data.subarray(at, Math.min(at + 65_536, cut));
        throw dropped;
      })(),
    );
    await expect(store.write(body, id, 0)).rejects.toBe(dropped);
    expect(await store.stagedSize(id)).toBe(cut);
    // the client asks for the offset (HEAD) and sends the rest
    expect(await store.write(pieces(data.subarray(cut), [65_536]), id, cut)).toBe(data.length);
    expect(Buffer.compare(await readFile(store.dataPath(id)), data)).toBe(0);
    expect(store.takeHash(id, data.length)).toBe(await sha256sum(store.dataPath(id)));
  });

  it("a PATCH refused mid-body (over the size limit) leaves the upload as it was, with no running hash", async () => {
    const store = new StagingStore(dir, { fsyncEachWrite: true });
    const data = randomBytes(4 * 1024 * 1024);
    const id = newId();
    await store.create(new Upload({ id, size: data.length + 10, offset: 0 }));
    expect(await store.write(pieces(data.subarray(0, 1000), [1000]), id, 0)).toBe(1000);
    const body = Readable.from(
      (async function* () {
        for (let at = 1000; at < data.length; at += 65_536) yield data.subarray(at, Math.min(at + 65_536, data.length));
        throw ERRORS.ERR_MAX_SIZE_EXCEEDED;
      })(),
    );
    await expect(store.write(body, id, 1000)).rejects.toBe(ERRORS.ERR_MAX_SIZE_EXCEEDED);
    expect(await store.stagedSize(id)).toBe(1000);
    expect(store.takeHash(id, 1000)).toBeNull();
  });

  it("has no running hash when it did not see every byte (another process, a restart)", async () => {
    const data = randomBytes(300_000);
    const id = newId();
    const first = new StagingStore(dir);
    await first.create(new Upload({ id, size: data.length, offset: 0 }));
    await first.write(pieces(data.subarray(0, 100_000), [4096]), id, 0);
    // a fresh store object stands for a restarted server: it must not pretend to know the hash
    const restarted = new StagingStore(dir);
    expect(await restarted.write(pieces(data.subarray(100_000), [4096]), id, 100_000)).toBe(data.length);
    expect(restarted.takeHash(id, data.length)).toBeNull();
    expect(first.takeHash(id, data.length)).toBeNull(); // its hash stopped at 100,000 bytes
  });

  it("a settled upload whose data has left reports itself complete; a refused one does not", async () => {
    const store = new StagingStore(dir);
    const stored = newId();
    const refused = newId();
    for (const id of [stored, refused]) {
      await store.create(new Upload({ id, size: 10, offset: 0, metadata: { filename: "a.264" } }));
      await store.write(Readable.from([Buffer.alloc(10)]), id, 0);
      await store.removeData(id);
    }
    await store.markSettled(stored, { done: "stored", recordingId: "r" });
    await store.markSettled(refused, { done: "refused", reason: "no" });
    expect(await store.getUpload(stored)).toMatchObject({ offset: 10, size: 10 });
    await expect(store.getUpload(refused)).rejects.toMatchObject({ status_code: 410 });
  });

  it("never resolves an upload id outside its folder", () => {
    const store = new StagingStore(dir);
    expect(() => store.dataPath("../../etc/passwd")).toThrow();
    expect(StagingStore.isUploadId("..")).toBe(false);
  });
});
