// Damaged controller streams through lib/processing/derive-recording-outputs.ts (no queue, no database):
// frames cut out mid-group, at the end of a group before its IDR and over a whole group, slices
// scrambled in IDR and P pictures. Checked against outside references:
// - the clean source's frame count by ffprobe -count_frames (ffmpeg's own H.264 parser and decoder);
// - the rendition's frame timestamps by ffprobe -show_frames (pts_time);
// - which recorder frame a rendition picture shows, by comparing it with ffmpeg's decode of the clean
//   source (the burned-in frame counter makes neighbouring frames differ clearly);
// - that the rendition decodes without one error by ffmpeg (-v error -f null).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdir, mkdtemp, readFile, rm } from "node:fs/promises";
import { createHash } from "node:crypto";
import os from "node:os";
import path from "node:path";
import { deriveRecordingOutputs, PLAYABLE_FILE, type DeriveResult } from "@/lib/processing/derive-recording-outputs";
import { describeLostFrames } from "@/lib/recordings/recording-figures";
import { makeCounterStream, runTool } from "@/tests/support/media/make-h264";
import { damageH264, range, type StreamDamage } from "@/tests/support/media/cut-h264";
import { ffprobeFrameCount } from "./support/probe-tools";

const FPS = 30;
let dir: string;
let clean: string;

beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "cairn-damaged-rendition-"));
  // 12 s at 30 fps, an IDR exactly every 30 frames: 360 frames, 12 groups of pictures
  clean = await makeCounterStream({ seconds: 12, gop: 30 });
}, 60_000);
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function derive(name: string, damage: StreamDamage | null): Promise<{ result: DeriveResult; original: string; playable: string }> {
  const original = damage ? await damageH264(clean, path.join(dir, `${name}.264`), damage) : clean;
  const workDir = path.join(dir, name);
  await mkdir(workDir, { recursive: true });
  const before = createHash("sha256").update(await readFile(original)).digest("hex");
  const result = await deriveRecordingOutputs({
    declaredKind: "raw_h264",
    originalPath: original,
    fpsOverride: null,
    organisationDefaultFps: FPS,
    workDir,
    signal: new AbortController().signal,
  });
  // the original stays byte for byte as it was
  expect(createHash("sha256").update(await readFile(original)).digest("hex")).toBe(before);
  return { result, original, playable: path.join(workDir, PLAYABLE_FILE) };
}

/** pts_time of every video frame of `file`, by ffprobe. */
async function framePts(file: string): Promise<number[]> {
  const { stdout } = await runTool("ffprobe", ["-v", "error", "-select_streams", "v:0", "-show_entries", "frame=pts_time", "-of", "csv=p=0", file]);
  return stdout.split("\n").map((l) => l.trim()).filter(Boolean).map((l) => Number.parseFloat(l.split(",")[0]));
}

/** Frame `n` (0-based, decode order) of `file` as 8-bit gray pixels, decoded by ffmpeg. */
async function grayFrame(file: string, n: number, rawH264 = false): Promise<Buffer> {
  const out = path.join(dir, `frame-${createHash("sha1").update(`${file}:${n}`).digest("hex").slice(0, 10)}.gray`);
  await runTool("ffmpeg", [
    "-v", "error", "-y", ...(rawH264 ? ["-f", "h264", "-r", String(FPS)] : []), "-i", file,
    "-vf", `select=eq(n\\,${n}),crop=160:90:0:0`, "-frames:v", "1", "-fps_mode", "passthrough", "-pix_fmt", "gray", "-f", "rawvideo", out,
  ]);
  return readFile(out);
}

function meanDiff(a: Buffer, b: Buffer): number {
  let sum = 0;
  for (let i = 0; i < a.length; i++) sum += Math.abs(a[i] - b[i]);
  return sum / a.length;
}

/** The clean source frame the rendition's picture at `slot` shows, among `candidates`. */
async function shownSourceFrame(playable: string, slot: number, candidates: number[]): Promise<number> {
  const shown = await grayFrame(playable, slot);
  let best = -1;
  let bestDiff = Infinity;
  for (const c of candidates) {
    const d = meanDiff(shown, await grayFrame(clean, c, true));
    if (d < bestDiff) {
      bestDiff = d;
      best = c;
    }
  }
  return best;
}

const lostRuns = (r: DeriveResult) => r.trace!.intervals.filter((i) => i.state === "lost").map((i) => [i.startFrame, i.endFrame]);

describe("a clean stream", () => {
  it("keeps the fast copy; figures agree with ffprobe's frame count", async () => {
    const { result } = await derive("clean", null);
    // reference: ffprobe -count_frames on the source
    const reference = await ffprobeFrameCount(clean, true);
    expect(reference).toBe(360);
    expect(result.facts.playableMode).toBe("remux");
    expect(result.figures).toMatchObject({ frameSlots: reference, framesLost: 0, framesDamaged: 0, framesLostIsLowerBound: false, rendition: "copy", intactShare: 1 });
    expect(result.figures!.durationSeconds).toBe(12);
    expect(result.durationSec).toBe(12);
  });
});

describe("a fading link: losses mid-group and before an IDR, scrambled IDR and P slices", () => {
  let r: Awaited<ReturnType<typeof derive>>;
  beforeAll(async () => {
    r = await derive("fading", {
      remove: [...range(40, 53), ...range(85, 90), 200, 233],
      scramble: [150, 275],
    });
  }, 120_000);

  it("counts every lost frame exactly, in place on the recorder's clock", () => {
    const f = r.result.figures!;
    expect(lostRuns(r.result)).toEqual([[40, 53], [85, 90], [200, 201], [233, 234]]);
    expect(f.framesLost).toBe(13 + 5 + 2);
    expect(f.framesLostIsLowerBound).toBe(false);
    expect(describeLostFrames(f)).toBe("20");
    // slots: the clean source's frame count (ffprobe), lost ones included
    expect(f.frameSlots).toBe(360);
    expect(f.framesPresent).toBe(340);
    expect(f.durationSeconds).toBe(12);
    expect(f.firstDegradationSeconds).toBeCloseTo(40 / FPS, 9);
    expect(f.longestLossSeconds).toBeCloseTo(13 / FPS, 9);
    expect(f.rendition).toBe("reencode");
  });

  it("marks the scrambled IDR (150) and P (275) pictures damaged", () => {
    const damaged = r.result.trace!.intervals.filter((i) => i.state === "damaged");
    expect(damaged.some((i) => i.startFrame <= 150 && i.endFrame > 150)).toBe(true);
    expect(damaged.some((i) => i.startFrame <= 275 && i.endFrame > 275)).toBe(true);
  });

  it("makes a rendition with one frame per recorder slot at slot / fps (ffprobe -show_frames)", async () => {
    const pts = await framePts(r.playable);
    expect(pts.length).toBe(360);
    pts.forEach((t, k) => expect(Math.abs(t - k / FPS)).toBeLessThan(0.0005));
    // the frame after the 13-frame gap sits at its own slot's time
    expect(pts[53]).toBeCloseTo(53 / FPS, 3);
    expect(pts[60]).toBeCloseTo(60 / FPS, 3);
  });

  it("shows recorder frame k at slot k, and holds the frame before a gap for the gap's length", async () => {
    // Frames right after a loss are predicted from a missing reference (damaged until the next IDR),
    // so the pictures compared are the held ones and the IDRs that follow each gap.
    expect(await shownSourceFrame(r.playable, 45, [39, 44, 45, 47])).toBe(39);
    expect(await shownSourceFrame(r.playable, 60, [47, 59, 60, 61])).toBe(60);
    expect(await shownSourceFrame(r.playable, 87, [84, 86, 87, 88])).toBe(84);
    expect(await shownSourceFrame(r.playable, 90, [84, 85, 89, 90, 91])).toBe(90);
    expect(await shownSourceFrame(r.playable, 240, [238, 239, 240, 241])).toBe(240);
  }, 60_000);

  it("decodes from start to end without one decoder error (ffmpeg -v error)", async () => {
    const { stderr } = await runTool("ffmpeg", ["-v", "error", "-i", r.playable, "-f", "null", "-"]);
    expect(stderr.trim()).toBe("");
  });
});

describe("a run lost over a whole group of pictures", () => {
  it("counts a 45-frame run over a group (IDR included) as at least 45: x264's idr_pic_id alternates, so three groups would read the same; the frame after it sits at its slot", async () => {
    // 165..209 (45 frames): the end of the group at 150 and the whole group at 180; the next picture is
    // the IDR at 210
    const { result, playable } = await derive("whole-group", { remove: range(165, 210) });
    const f = result.figures!;
    expect(lostRuns(result)).toEqual([[165, 210]]);
    expect(f.framesLost).toBe(45);
    expect(f.framesLostIsLowerBound).toBe(true);
    expect(describeLostFrames(f)).toBe("at least 45");
    expect(f.frameSlots).toBe(360);
    const pts = await framePts(playable);
    expect(pts.length).toBe(360);
    // the frame after the 45-frame gap: slot 210 at 210 / 30 = 7 s (ffprobe pts_time)
    expect(pts[210]).toBeCloseTo(7, 4);
    expect(await shownSourceFrame(playable, 210, [164, 165, 209, 210, 211])).toBe(210);
    expect(await shownSourceFrame(playable, 190, [164, 165, 189, 190])).toBe(164);
  }, 60_000);
});

describe("where the structure cannot tell", () => {
  it("a stream with one IDR only: a loss longer than MaxFrameNum is counted as 'at least'", async () => {
    const single = await makeCounterStream({ seconds: 4, gop: 1000 });
    const out = path.join(dir, "single-gop.264");
    await damageH264(single, out, { remove: range(30, 50) });
    const workDir = path.join(dir, "single-gop");
    await mkdir(workDir, { recursive: true });
    const result = await deriveRecordingOutputs({ declaredKind: "raw_h264", originalPath: out, fpsOverride: null, organisationDefaultFps: FPS, workDir, signal: new AbortController().signal });
    const f = result.figures!;
    // 20 frames were cut; x264's MaxFrameNum is 16, so frame_num shows 4 and nothing bounds the rest
    expect(f.framesLostIsLowerBound).toBe(true);
    expect(f.framesLost).toBe(4);
    expect(describeLostFrames(f)).toBe("at least 4");
    // the rendition still has one frame per counted slot
    expect((await framePts(path.join(workDir, PLAYABLE_FILE))).length).toBe(f.frameSlots);
  }, 60_000);
});
