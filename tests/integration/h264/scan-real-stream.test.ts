import { readFile } from "node:fs/promises";
import { describe, expect, it } from "vitest";
import { AnnexBSplitter, type NalUnit } from "@/lib/h264/annexb-scanner";
import { probeH264File, probeStream } from "@/lib/h264/probe-stream";
import { makeRawH264 } from "@/tests/support/media/make-h264";
import { readTraceHeaders } from "./ffmpeg-reference";

// The scanner on a real x264 stream: chunking must not change anything, and the NAL units found are
// the ones ffmpeg's trace_headers walks through (same count, same types, in order).

function split(data: Uint8Array, chunk: number): NalUnit[] {
  const splitter = new AnnexBSplitter({ prefixBytes: 48 });
  const out: NalUnit[] = [];
  for (let pos = 0; pos < data.length; pos += chunk) splitter.push(data.subarray(pos, pos + chunk), (n) => out.push(n));
  splitter.end((n) => out.push(n));
  return out;
}

const summary = (nals: NalUnit[]) => nals.map((n) => [n.offset, n.size, n.nalUnitType, n.nalRefIdc, Buffer.from(n.prefix).toString("hex")].join(":"));

describe("Annex B scanning of an x264 stream", () => {
  it("finds the same NAL units with 1..7-byte chunks as in one piece", async () => {
    const file = await makeRawH264({ seconds: 1 });
    const data = new Uint8Array(await readFile(file));
    const whole = summary(split(data, data.length));
    for (let chunk = 1; chunk <= 7; chunk++) expect(summary(split(data, chunk))).toEqual(whole);
  });

  it("finds the NAL units ffmpeg's trace_headers reads", async () => {
    const file = await makeRawH264({ seconds: 1, x264Params: "slices=3" });
    const data = new Uint8Array(await readFile(file));
    const nals = split(data, 65536);
    const titles: Record<number, string> = { 1: "Slice Header", 5: "Slice Header", 7: "Sequence Parameter Set", 8: "Picture Parameter Set" };
    const ours = nals.map((n) => titles[n.nalUnitType]).filter(Boolean);
    const reference = (await readTraceHeaders(file)).map((u) => u.title).filter((t) => Object.values(titles).includes(t));
    expect(ours).toEqual(reference);
  });

  it("probes a stream read in 1..7-byte chunks exactly as the file read in 1 MiB chunks", async () => {
    const file = await makeRawH264({ seconds: 1, profile: "main", bframes: 2 });
    const data = await readFile(file);
    const expected = await probeH264File(file);
    for (const chunk of [1, 2, 3, 5, 7]) {
      async function* chunks() {
        for (let pos = 0; pos < data.length; pos += chunk) yield data.subarray(pos, pos + chunk);
      }
      const result = await probeStream(chunks());
      expect(result.facts).toEqual(expected.facts);
      expect(Array.from(result.trace.states)).toEqual(Array.from(expected.trace.states));
      expect(Array.from(result.trace.offsets)).toEqual(Array.from(expected.trace.offsets));
    }
  });
});
