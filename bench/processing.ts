// Benchmark: processing a generated controller recording (raw H.264 Annex B, 432x240, 30 fps,
// Constrained Baseline, ~560 kbit/s) against the bare ffmpeg/ffprobe commands alone.
// Run: npx tsx bench/processing.ts            (10 minutes of video)
//      BENCH_MINUTES=60 npx tsx bench/processing.ts
//
// Side by side, alternating, on the same file:
//   bare     the very commands the pipeline runs (remux, ffprobe of the MP4, the decoder-error pass,
//            thumbnail tiles, sprite, poster), spawned one after the other with
//            their output thrown away: the floor any pipeline built on ffmpeg pays.
//   pipeline lib/media/derive-recording-outputs.ts: our streaming Annex B scan and signal trace, the
//            same ffmpeg commands through the fluent-ffmpeg wrapper with progress, the decoder
//            errors parsed and merged into the trace, the WebVTT track, SHA-256 of every output.
// Not included in either: the queue and the final Postgres transaction (a handful of rows).
// The ratio pipeline / bare is the figure to watch (target <= 1.5).
import { spawn } from "node:child_process";
import { mkdir, rm, stat } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { deriveRecordingOutputs, type DeriveResult } from "@/lib/media/derive-recording-outputs";
import { makeRawH264 } from "@/tests/support/media/make-h264";

const minutes = Number(process.env.BENCH_MINUTES ?? 10);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 2);
const work = path.join(os.tmpdir(), `cairn-bench-processing-${process.pid}`);

function run(command: string, args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { stdio: ["ignore", "ignore", "ignore"] });
    child.on("error", reject);
    child.on("close", (code) => (code === 0 ? resolve() : reject(new Error(`${command} ${args.join(" ")} exited with ${code}`))));
  });
}

/** The recorded arguments with their file names put back (see describeArgs in lib/media/ffmpeg.ts). */
function materialize(args: string[], files: Record<string, string>): string[] {
  return args.map((a) => a.replace(/^\{(.+)\}$/, (_m, name: string) => files[name] ?? (() => { throw new Error(`no file for ${name}`); })()));
}

async function pipeline(source: string, dir: string): Promise<{ ms: number; result: DeriveResult }> {
  await rm(dir, { recursive: true, force: true });
  await mkdir(dir, { recursive: true });
  const t0 = process.hrtime.bigint();
  const result = await deriveRecordingOutputs({
    declaredKind: "raw_h264",
    originalPath: source,
    fpsOverride: null,
    organisationDefaultFps: 30,
    workDir: dir,
    signal: new AbortController().signal,
  });
  return { ms: Number(process.hrtime.bigint() - t0) / 1e6, result };
}

async function bare(source: string, dir: string, recorded: DeriveResult): Promise<number> {
  await rm(dir, { recursive: true, force: true });
  await mkdir(path.join(dir, ".tiles"), { recursive: true });
  const files: Record<string, string> = {
    original: source,
    "playable.mp4": path.join(dir, "playable.mp4"),
    "poster.jpg": path.join(dir, "poster.jpg"),
    "sprite.jpg": path.join(dir, "sprite.jpg"),
    "tiles/%06d.bmp": path.join(dir, ".tiles", "%06d.bmp"),
  };
  const args = (kind: string) => recorded.outputs.find((o) => o.kind === kind)!.toolArgs;
  const sprite = args("sprite");
  const split = sprite.indexOf("&&");
  const t0 = process.hrtime.bigint();
  await run("ffmpeg", materialize(args("playable"), files));
  await run("ffprobe", ["-hide_banner", "-show_streams", "-show_format", files["playable.mp4"]]);
  // The decoder-error pass exactly as lib/h264/ffmpeg-decode-errors.ts runs it.
  await run("ffprobe", [
    "-v", "error", "-threads", "1", "-f", "h264", "-show_log", "16", "-show_packets", "-show_frames",
    "-show_entries", "packet=pos:frame=pkt_pos,coded_picture_number:log=level,message", "-of", "compact", source,
  ]);
  await run("ffmpeg", materialize(sprite.slice(0, split), files));
  await run("ffmpeg", materialize(sprite.slice(split + 2), files));
  await run("ffmpeg", materialize(args("poster"), files));
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

async function main() {
  console.log(`Generating ${minutes} min of 432x240 30 fps Constrained Baseline (cached after the first run)...`);
  const g0 = Date.now();
  const source = await makeRawH264({ width: 432, height: 240, fps: 30, seconds: minutes * 60, bitrate: 560, gop: 30, preset: "veryfast" });
  const size = (await stat(source)).size;
  console.log(`  ${source}\n  ${(size / 1e6).toFixed(1)} MB, ready in ${((Date.now() - g0) / 1000).toFixed(1)} s`);

  // Warm-up: file cache, fluent-ffmpeg's one-time capability checks, and the recorded arguments.
  const warm = await pipeline(source, path.join(work, "warm"));
  const frames = warm.result.facts.frameCount ?? 0;
  console.log(`Warm-up pipeline run: ${(warm.ms / 1000).toFixed(1)} s, ${frames} frames, trace ${warm.result.trace?.intervals.length} interval(s)`);

  const bareMs: number[] = [];
  const pipeMs: number[] = [];
  for (let r = 0; r < ROUNDS; r++) {
    bareMs.push(await bare(source, path.join(work, "bare"), warm.result));
    pipeMs.push((await pipeline(source, path.join(work, "pipe"))).ms);
    console.log(`  round ${r + 1}: bare ${(bareMs[r] / 1000).toFixed(2)} s, pipeline ${(pipeMs[r] / 1000).toFixed(2)} s, ratio ${(pipeMs[r] / bareMs[r]).toFixed(2)}`);
  }
  await rm(work, { recursive: true, force: true });

  const b = median(bareMs);
  const p = median(pipeMs);
  const videoSec = frames / 30;
  console.log("");
  console.log(`video                ${(videoSec / 60).toFixed(1)} min, ${(size / 1e6).toFixed(1)} MB, ${frames} frames`);
  console.log(`bare ffmpeg commands ${(b / 1000).toFixed(2)} s  (${(videoSec / (b / 1000)).toFixed(0)}x real time)`);
  console.log(`full pipeline        ${(p / 1000).toFixed(2)} s  (${(videoSec / (p / 1000)).toFixed(0)}x real time)`);
  console.log(`ratio pipeline/bare  ${(p / b).toFixed(2)}  (target <= 1.5)`);
  console.log(`(medians of ${ROUNDS} alternating rounds; ${os.cpus().length} cores, load ${os.loadavg().map((l) => l.toFixed(1)).join(" ")})`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
