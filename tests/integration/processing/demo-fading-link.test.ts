// The demo's fading-link flight (db/seed/seed-demo-recordings.ts) processes quickly and shows what it
// promises: losses of each kind, scrambled IDR and P slices, a count that is "at least", and the
// split into two files. Counts are checked against the damage the seed applies (frames cut out of a
// stream whose clean frame count ffprobe gives) and the rendition against ffprobe's frame count.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdir, mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { DEMO_FILES, generateDemoStream, TOWER_FADE } from "@/db/seed/seed-demo-recordings";
import { deriveRecordingOutputs, PLAYABLE_FILE } from "@/lib/processing/derive-recording-outputs";
import { describeLostFrames } from "@/lib/recordings/recording-figures";
import { ffprobeFrameCount } from "./support/probe-tools";

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "cairn-demo-fade-"));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe("the demo's fading link", () => {
  it("the first file: every kind of loss, in seconds, and the rendition holds one frame per slot", async () => {
    const f = DEMO_FILES.find((d) => d.damage === TOWER_FADE)!;
    const file = await generateDemoStream(f, dir);
    const workDir = path.join(dir, "work");
    await mkdir(workDir, { recursive: true });
    const started = performance.now();
    const result = await deriveRecordingOutputs({ declaredKind: "raw_h264", originalPath: file, fpsOverride: null, organisationDefaultFps: 30, workDir, signal: new AbortController().signal });
    const seconds = (performance.now() - started) / 1000;
    expect(seconds).toBeLessThan(15);
    const fig = result.figures!;
    const lost = result.trace!.intervals.filter((i) => i.state === "lost").map((i) => [i.startFrame, i.endFrame]);
    expect(lost).toEqual([[97, 98], [143, 144], [188, 189], [221, 222], [265, 270], [400, 413], [455, 510]]);
    expect(fig.frameSlots).toBe(f.seconds * 30);
    expect(fig.framesLost).toBe(TOWER_FADE.remove.length);
    expect(describeLostFrames(fig)).toBe(`at least ${TOWER_FADE.remove.length}`);
    expect(fig.framesDamaged).toBeGreaterThan(0);
    expect(fig.rendition).toBe("reencode");
    expect(await ffprobeFrameCount(path.join(workDir, PLAYABLE_FILE))).toBe(fig.frameSlots);
  }, 60_000);
});
