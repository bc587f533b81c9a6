// Bad raw H.264 input through lib/processing/derive-recording-outputs.ts: each file ends either with a
// rendition that ffmpeg decodes from start to end without one error (ffmpeg -v error -f null, the
// outside reference) and an honest trace, or refused with a readable reason. Never a rendition that
// would stop a browser's decoder.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdir, mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { deriveRecordingOutputs, PLAYABLE_FILE, type DeriveResult } from "@/lib/processing/derive-recording-outputs";
import { RecordingRefused } from "@/lib/recordings/recording-refused";
import { makeCounterStream, runTool } from "@/tests/support/media/make-h264";
import { accessUnitRanges, damageH264, range } from "@/tests/support/media/cut-h264";

const FPS = 30;
let dir: string;
let clean: string;

beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "cairn-bad-input-"));
  clean = await makeCounterStream({ seconds: 4, gop: 30 });
}, 60_000);
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function derive(name: string, file: string): Promise<{ result: DeriveResult; playable: string }> {
  const workDir = path.join(dir, name);
  await mkdir(workDir, { recursive: true });
  const result = await deriveRecordingOutputs({
    declaredKind: "raw_h264",
    originalPath: file,
    fpsOverride: null,
    organisationDefaultFps: FPS,
    workDir,
    signal: new AbortController().signal,
  });
  return { result, playable: path.join(workDir, PLAYABLE_FILE) };
}

/** The rendition plays from start to end: ffmpeg decodes it without an error, one frame per slot. */
async function expectPlaysThrough(playable: string, frameSlots: number) {
  const { stderr } = await runTool("ffmpeg", ["-v", "error", "-i", playable, "-f", "null", "-"]);
  expect(stderr.trim()).toBe("");
  const { stdout } = await runTool("ffprobe", ["-v", "error", "-count_frames", "-select_streams", "v:0", "-show_entries", "stream=nb_read_frames,width,height", "-of", "json", playable]);
  const stream = JSON.parse(stdout).streams[0];
  expect(Number(stream.nb_read_frames)).toBe(frameSlots);
  return stream as { width: number; height: number };
}

describe("bad raw H.264 input", () => {
  it("a truncated stream (cut in the middle of a picture): ready, the cut picture damaged", async () => {
    const units = await accessUnitRanges(clean);
    const [start, end] = units[100];
    const file = await damageH264(clean, path.join(dir, "truncated.264"), { truncateAt: start + Math.floor((end - start) / 2) });
    const { result, playable } = await derive("truncated", file);
    const f = result.figures!;
    expect(f.frameSlots).toBe(101);
    expect(result.trace!.intervals.at(-1)).toMatchObject({ state: "damaged", endFrame: 101 });
    await expectPlaysThrough(playable, f.frameSlots);
  });

  it("a stream that starts without an SPS: ready, the frames before the first IDR damaged, time kept from slot 0", async () => {
    const file = await damageH264(clean, path.join(dir, "no-sps.264"), { startAt: 10 });
    const { result, playable } = await derive("no-sps", file);
    const f = result.figures!;
    expect(f.frameSlots).toBe(110);
    expect(result.trace!.intervals[0]).toMatchObject({ state: "damaged", startFrame: 0, endFrame: 20 });
    expect(f.rendition).toBe("reencode");
    await expectPlaysThrough(playable, f.frameSlots);
  });

  it("a resolution change mid-stream: every picture size reported, one size in the rendition", async () => {
    const small = await makeCounterStream({ seconds: 2, gop: 30, width: 320, height: 180 });
    const file = path.join(dir, "resize.264");
    await writeFile(file, Buffer.concat([await readFile(clean), await readFile(small)]));
    const { result, playable } = await derive("resize", file);
    const f = result.figures!;
    expect(f.pictureSizes).toEqual([
      { width: 432, height: 240, fromSlot: 0 },
      { width: 320, height: 180, fromSlot: 120 },
    ]);
    expect(f.frameSlots).toBe(180);
    expect(f.rendition).toBe("reencode");
    expect(await expectPlaysThrough(playable, f.frameSlots)).toMatchObject({ width: 432, height: 240 });
  });

  it("garbage between start codes: ready, every picture still counted, nothing counted lost", async () => {
    const file = await damageH264(clean, path.join(dir, "garbage.264"), { garbageBefore: [20, 50, 77] });
    const { result, playable } = await derive("garbage", file);
    const f = result.figures!;
    expect(f.frameSlots).toBe(120);
    // The junk lands after a slice's last bit (rbsp trailing bits, 7.3.2.11): ffmpeg's decoder skips
    // it, and so does the trace; what matters is that no picture is lost or split by it.
    expect(f.framesLost).toBe(0);
    expect(f.framesPresent).toBe(120);
    await expectPlaysThrough(playable, f.frameSlots);
  });

  it("a file damaged throughout: ready with a low intact share, and still plays to the end", async () => {
    const every = range(1, 120).filter((n) => n % 30 !== 0);
    const file = await damageH264(clean, path.join(dir, "throughout.264"), {
      remove: every.filter((n) => n % 7 === 3),
      scramble: [...every.filter((n) => n % 7 !== 3 && n % 2 === 0), 30, 60, 90],
    });
    const { result, playable } = await derive("throughout", file);
    const f = result.figures!;
    expect(f.frameSlots).toBe(120);
    expect(f.intactShare!).toBeLessThan(0.2);
    await expectPlaysThrough(playable, f.frameSlots);
  });

  it("no H.264 at all (random bytes): refused with a readable reason", async () => {
    const bytes = Buffer.alloc(64 * 1024);
    let seed = 7;
    for (let i = 0; i < bytes.length; i++) {
      seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
      bytes[i] = (seed >>> 16) & 0xff;
    }
    const file = path.join(dir, "noise.264");
    await writeFile(file, bytes);
    const err = await derive("noise", file).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(RecordingRefused);
    expect((err as Error).message).toMatch(/H\.264|sequence parameter set|frame/);
  });
});
