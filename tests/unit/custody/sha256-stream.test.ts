import { createHash, randomBytes } from "node:crypto";
import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { sha256OfStream } from "@/lib/custody/sha256-stream";

// FIPS 180-4 SHA-256 examples (NIST), as listed in docs/outside-checks.md (Integrity).
const FIPS_VECTORS: Array<[string, string]> = [
  ["abc", "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"],
  ["", "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"],
  ["abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq", "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1"],
];

function inChunks(data: Buffer, sizes: (i: number) => number): Buffer[] {
  const chunks: Buffer[] = [];
  for (let offset = 0, i = 0; offset < data.length; i++) {
    const size = Math.max(1, sizes(i));
    chunks.push(data.subarray(offset, offset + size));
    offset += size;
  }
  return chunks;
}

// A byte stream as Node delivers it (non-object mode, Buffer chunks), fed from a list of chunks.
function byteStream(chunks: Buffer[]): Readable {
  let i = 0;
  return new Readable({
    read() {
      this.push(i < chunks.length ? chunks[i++] : null);
    },
  });
}

const oneShot = (data: Buffer) => createHash("sha256").update(data).digest("hex");

// Deterministic pseudo-random split sizes (xorshift32), so a failure can be replayed.
function splitter(seed: number, max: number) {
  let x = seed >>> 0 || 1;
  return () => {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    return 1 + (x % max);
  };
}

describe("sha256OfStream (FIPS 180-4)", () => {
  it.each(FIPS_VECTORS)("FIPS 180-4 example %j in chunks of every size 1..64", async (message, digest) => {
    const data = Buffer.from(message, "ascii");
    for (let size = 1; size <= 64; size++) {
      const result = await sha256OfStream(byteStream(inChunks(data, () => size)));
      expect({ size, ...result }).toEqual({ size, hex: digest, bytes: data.length });
    }
  });

  it("the one-million-'a' FIPS 180-4 example, read as a stream in random splits", async () => {
    // Digest recalled from memory; the same comparison is also made against Node's one-shot hash.
    const data = Buffer.alloc(1_000_000, "a");
    const expected = "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0";
    expect(oneShot(data)).toBe(expected);
    const next = splitter(7, 70_000);
    expect(await sha256OfStream(byteStream(inChunks(data, next)))).toEqual({ hex: expected, bytes: 1_000_000 });
  });

  it("equals Node's one-shot createHash for random data in random splits, across block boundaries", async () => {
    for (let seed = 1; seed <= 40; seed++) {
      const length = [0, 1, 55, 56, 63, 64, 65, 127, 128, 129][seed % 10] + (seed > 10 ? seed * 37 : 0);
      const data = randomBytes(length);
      const next = splitter(seed, 1 + (seed % 9) * 17);
      expect(await sha256OfStream(byteStream(inChunks(data, next)))).toEqual({ hex: oneShot(data), bytes: length });
    }
  });

  it("works on Readable.from and on typed arrays that are views into larger buffers", async () => {
    const backing = randomBytes(4096);
    const view = new Uint8Array(backing.buffer, backing.byteOffset + 100, 1000);
    expect(await sha256OfStream(Readable.from([view]))).toEqual({ hex: oneShot(Buffer.from(view)), bytes: 1000 });
  });

  it("refuses string chunks: a decoded stream is not the original bytes", async () => {
    const stream = byteStream([Buffer.from("abc")]).setEncoding("utf8");
    await expect(sha256OfStream(stream)).rejects.toThrow(/string/);
  });

  it("passes a stream error on", async () => {
    const failing = new Readable({
      read() {
        this.destroy(new Error("disk gone"));
      },
    });
    await expect(sha256OfStream(failing)).rejects.toThrow("disk gone");
  });
});
