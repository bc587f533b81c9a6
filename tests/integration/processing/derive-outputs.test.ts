// lib/processing/derive-recording-outputs.ts without the queue: the raw H.264 path reads a head of the
// stream to plan the playable, then scans the whole file alongside ffmpeg. Whatever the head covers
// (all of the file, a part holding the first IDR, or too little to decide), the outputs are the same
// bytes (SHA-256 by Node's crypto) and the same facts.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdir, mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { deriveRecordingOutputs, type DeriveResult } from "@/lib/processing/derive-recording-outputs";
import { probeH264File } from "@/lib/h264/probe-stream";
import { makeRawH264 } from "@/tests/support/media/make-h264";

let dir: string;
let midGop: string;

beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "cairn-test-3-derive-"));
  const whole = await makeRawH264({ width: 432, height: 240, fps: 30, seconds: 3, bitrate: 560, gop: 30 });
  const probe = await probeH264File(whole);
  midGop = path.join(dir, "midgop.264");
  // Starts at the 6th frame of a GOP of 30: the first IDR is 25 frames in (about 60 KB at 560 kbit/s).
  await writeFile(midGop, (await readFile(whole)).subarray(probe.trace.offsets[5]));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function derive(headBytes: number | undefined, name: string): Promise<DeriveResult> {
  const workDir = path.join(dir, name);
  await rm(workDir, { recursive: true, force: true });
  await mkdir(workDir, { recursive: true });
  return deriveRecordingOutputs({
    declaredKind: "raw_h264",
    originalPath: midGop,
    fpsOverride: null,
    organisationDefaultFps: 30,
    workDir,
    signal: new AbortController().signal,
    headBytes,
  });
}

describe("the head look at a raw stream", () => {
  it("does not change the result, whether it covers the whole file, the first IDR, or too little", async () => {
    const firstIdr = (await probeH264File(midGop)).facts.firstIdrOffset!;
    expect(firstIdr).toBeGreaterThan(4 * 1024);
    expect(firstIdr).toBeLessThan(96 * 1024);
    const whole = await derive(undefined, "whole"); // 4 MiB: the whole file
    const withIdr = await derive(96 * 1024, "with-idr"); // holds the first IDR
    const tooSmall = await derive(4 * 1024, "too-small"); // no IDR in it: the full scan decides first
    const hashes = (r: DeriveResult) => Object.fromEntries(r.outputs.map((o) => [o.kind, o.sha256]));
    expect(whole.facts).toMatchObject({ startsWithIdr: false, playableFirstFrame: 0, playableMode: "reencode" });
    for (const other of [withIdr, tooSmall]) {
      expect(hashes(other)).toEqual(hashes(whole));
      expect(other.facts).toEqual(whole.facts);
      expect(other.trace).toEqual(whole.trace);
    }
  });
});
