import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { AnnexBSplitter, scanAnnexB, type NalUnit } from "@/lib/h264/annexb-scanner";

// Reference: ITU-T H.264 B.2 (byte stream NAL unit decoding), written plainly over the whole buffer.
// A NAL unit starts after 0x000001 and runs up to (not including) the next byte-aligned 0x000000,
// 0x000001 or the end of the stream; zero bytes in between are leading/trailing zero bytes.
function referenceSplit(data: Uint8Array): Array<{ offset: number; size: number }> {
  const out: Array<{ offset: number; size: number }> = [];
  let i = 0;
  const isStart = (k: number) => data[k] === 0 && data[k + 1] === 0 && data[k + 2] === 1;
  while (i + 3 <= data.length && !isStart(i)) i++;
  while (i + 3 <= data.length) {
    const offset = i + 3;
    let end = offset;
    while (end < data.length && !(end + 3 <= data.length && data[end] === 0 && data[end + 1] === 0 && data[end + 2] <= 1)) end++;
    if (end > offset) out.push({ offset, size: end - offset });
    i = end;
    while (i + 3 <= data.length && !isStart(i)) i++;
  }
  return out;
}

let seed = 0x2545f491;
function rand(n: number): number {
  seed ^= seed << 13;
  seed ^= seed >>> 17;
  seed ^= seed << 5;
  return (seed >>> 0) % n;
}

/** A NAL unit of `size` bytes, escaped per 7.4.1.1 so that no start code appears inside. */
function makeNal(header: number, size: number): number[] {
  const bytes = [header];
  let zeros = 0;
  while (bytes.length < size - 1) {
    const b = rand(4) === 0 ? 0 : rand(256);
    if (zeros >= 2 && b <= 3) {
      bytes.push(3);
      zeros = 0;
    }
    bytes.push(b);
    zeros = b === 0 ? zeros + 1 : 0;
  }
  bytes.push(0x80); // rbsp_stop_one_bit: a NAL unit never ends in 0x00
  return bytes;
}

function buildStream(): Uint8Array {
  const parts: number[] = [0, 0]; // leading_zero_8bits
  parts.push(0, 0, 0, 1, ...makeNal(0x67, 24)); // SPS with a 4-byte start code
  parts.push(0, 0, 0, 1, ...makeNal(0x68, 5));
  parts.push(0, 0, 1, ...makeNal(0x06, 40));
  parts.push(0, 0, 0, 1, ...makeNal(0x65, 2000)); // longer than the prefix
  parts.push(0, 0, 0, 0, 0, 1, ...makeNal(0x41, 300)); // trailing_zero_8bits before the next start code
  parts.push(0, 0, 1, 0, 0, 1, ...makeNal(0x41, 7)); // an empty NAL unit between two start codes
  for (let n = 0; n < 30; n++) parts.push(...(rand(2) ? [0, 0, 1] : [0, 0, 0, 1]), ...makeNal(0x01 | (rand(4) << 5), 2 + rand(400)));
  parts.push(0, 0, 1, 0x41, 0x9a, 0x00, 0x00, 0x03, 0x01, 0x80); // escape right before the end
  parts.push(0, 0, 0); // trailing zeros at the end of the stream
  return Uint8Array.from(parts);
}

function splitInChunks(data: Uint8Array, sizes: (n: number) => number, prefixBytes = 64): { nals: NalUnit[]; splitter: AnnexBSplitter } {
  const splitter = new AnnexBSplitter({ prefixBytes });
  const nals: NalUnit[] = [];
  let pos = 0;
  let n = 0;
  while (pos < data.length) {
    const size = Math.max(1, sizes(n++));
    splitter.push(data.subarray(pos, pos + size), (nal) => nals.push(nal));
    pos += size;
  }
  splitter.end((nal) => nals.push(nal));
  return { nals, splitter };
}

const view = (nals: NalUnit[]) =>
  nals.map((n) => ({
    offset: n.offset,
    startCodeOffset: n.startCodeOffset,
    startCodeLength: n.startCodeLength,
    size: n.size,
    type: n.nalUnitType,
    ref: n.nalRefIdc,
    prefix: Buffer.from(n.prefix).toString("hex"),
  }));

describe("AnnexBSplitter", () => {
  const data = buildStream();
  const whole = splitInChunks(data, () => data.length);

  it("finds the same NAL units as the Annex B.2 reference", () => {
    expect(whole.nals.map((n) => ({ offset: n.offset, size: n.size }))).toEqual(referenceSplit(data));
    expect(whole.nals.length).toBe(37);
  });

  it("reports header fields, start code length and a bounded prefix", () => {
    const [sps, pps, sei, idr] = whole.nals;
    expect([sps.nalUnitType, sps.nalRefIdc, sps.startCodeLength, sps.startCodeOffset, sps.offset]).toEqual([7, 3, 4, 2, 6]);
    expect([pps.nalUnitType, sei.nalUnitType, sei.startCodeLength, idr.nalUnitType]).toEqual([8, 6, 3, 5]);
    expect(idr.size).toBe(2000);
    expect(idr.prefix.length).toBe(64);
    expect(Array.from(idr.prefix)).toEqual(Array.from(data.subarray(idr.offset, idr.offset + 64)));
    expect(whole.splitter.stats.leadingBytes).toBe(2);
    expect(whole.splitter.stats.emptyNalUnits).toBe(1);
  });

  it("keeps zero_byte as part of a 4-byte start code and the rest as trailing zeros", () => {
    const afterTrailing = whole.nals[4];
    expect(afterTrailing.startCodeLength).toBe(4);
    expect(afterTrailing.offset - afterTrailing.startCodeOffset).toBe(4);
    const before = whole.nals[3];
    expect(afterTrailing.startCodeOffset - (before.offset + before.size)).toBe(2); // two trailing_zero_8bits
  });

  for (let chunk = 1; chunk <= 7; chunk++) {
    it(`gives identical results with ${chunk}-byte chunks`, () => {
      expect(view(splitInChunks(data, () => chunk).nals)).toEqual(view(whole.nals));
    });
  }

  it("gives identical results with irregular chunk sizes", () => {
    for (let trial = 0; trial < 20; trial++) {
      expect(view(splitInChunks(data, () => 1 + rand(300)).nals)).toEqual(view(whole.nals));
    }
  });

  it("drops the last NAL unit's trailing zeros at the end of the stream", () => {
    const last = whole.nals[whole.nals.length - 1];
    expect(last.offset + last.size).toBe(data.length - 3);
  });
});

describe("scanAnnexB", () => {
  it("yields the same NAL units from a Readable as the splitter does", async () => {
    const data = buildStream();
    const chunks: Buffer[] = [];
    for (let pos = 0; pos < data.length; pos += 5) chunks.push(Buffer.from(data.subarray(pos, pos + 5)));
    const nals: NalUnit[] = [];
    for await (const nal of scanAnnexB(Readable.from(chunks), { prefixBytes: 64 })) nals.push(nal);
    expect(view(nals)).toEqual(view(splitInChunks(data, () => data.length).nals));
  });

  it("copies prefixes so reused source buffers do not change NAL units already handed out", async () => {
    const data = Buffer.from([0, 0, 1, 0x67, 1, 2, 0, 0, 1, 0x68, 3, 4]);
    const reused = Buffer.alloc(4);
    async function* source() {
      for (let pos = 0; pos < data.length; pos += 4) {
        data.copy(reused, 0, pos, pos + 4);
        yield reused;
      }
    }
    const nals: NalUnit[] = [];
    for await (const nal of scanAnnexB(source())) nals.push(nal);
    expect(nals.map((n) => Buffer.from(n.prefix).toString("hex"))).toEqual(["670102", "680304"]);
  });
});
