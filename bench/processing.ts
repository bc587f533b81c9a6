// Benchmark: processing a generated controller recording (raw H.264 Annex B, 432x240, 30 fps,
// Constrained Baseline, ~560 kbit/s) against the bare ffmpeg/ffprobe commands alone.
// Run: npx tsx bench/processing.ts            (10 minutes of video)
//      BENCH_MINUTES=60 npx tsx bench/processing.ts
//
// Side by side, alternating, on the same file:
//   bare     the very commands the pipeline runs (remux, ffprobe of the MP4, the decoder-error pass,
//            thumbnail tiles, sprite, poster), spawned one after the other with
//            their output thrown away: the floor any pipeline built on ffmpeg pays.
//   pipeline lib/processing/derive-recording-outputs.ts: our streaming Annex B scan and signal trace, the
//            same ffmpeg commands through the fluent-ffmpeg wrapper with progress, the decoder
//            errors parsed and merged into the trace, the WebVTT track, SHA-256 of every output.
// Not included in either: the queue and the final Postgres transaction (a handful of rows).
// The ratio pipeline / bare is the figure to watch (target <= 1.5).
//
// Two cases: a clean stream (the copy path) and the same stream damaged as a fading link damages it
// (every 10 s: 13 frames lost mid-group, a frame lost before an IDR, a P picture scrambled), which
// takes the re-encode path (lib/processing/plan-timed-reencode.ts). For each: the time from the end of the
// upload (the original in place) to a final playable MP4, the whole pipeline against the bare
// commands, and the real-time factor; for the damaged case also the re-encode alone (target >= 30x
// real time for 432x240 on 2 cores).
import { spawn } from "node:child_process";
import { mkdir, rm, stat } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { readFileSync } from "node:fs";
import { writeFile } from "node:fs/promises";
import { damageDemoStream, frames as frameRange } from "@/db/seed/damage-demo-stream";
import { decoderErrorProbeArgs } from "@/lib/h264/ffmpeg-decode-errors";
import { deriveRecordingOutputs, type DeriveResult } from "@/lib/processing/derive-recording-outputs";
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

/** The recorded arguments with their file names put back (see describeArgs in lib/processing/ffmpeg.ts). */
function materialize(args: string[], files: Record<string, string>): string[] {
  return args.map((a) => a.replace(/^\{(.+)\}$/, (_m, name: string) => files[name] ?? (() => { throw new Error(`no file for ${name}`); })()));
}

async function pipeline(source: string, dir: string): Promise<{ ms: number; playableMs: number; result: DeriveResult }> {
  await rm(dir, { recursive: true, force: true });
  await mkdir(dir, { recursive: true });
  const t0 = process.hrtime.bigint();
  let playableMs = 0;
  const result = await deriveRecordingOutputs({
    declaredKind: "raw_h264",
    originalPath: source,
    fpsOverride: null,
    organisationDefaultFps: 30,
    workDir: dir,
    signal: new AbortController().signal,
    onPlayable: () => (playableMs = Number(process.hrtime.bigint() - t0) / 1e6),
  });
  return { ms: Number(process.hrtime.bigint() - t0) / 1e6, playableMs, result };
}

/** The playable's commands: one, or (re-encode) the timestamp copy && the re-encode with its filter script. */
async function playableCommands(recorded: string[], files: Record<string, string>): Promise<string[][]> {
  const last = recorded[recorded.length - 1];
  if (!recorded.includes("&&")) return [materialize(recorded, files)];
  const split = recorded.indexOf("&&");
  const encode = recorded.slice(split + 2, last.startsWith("(") ? -1 : undefined);
  const scriptAt = encode.indexOf("-filter_script:v");
  if (scriptAt >= 0 && last.startsWith("(")) {
    // the script's text is recorded as "(timestamps.filter: <text>)"
    const text = last.slice(last.indexOf(":") + 2, -1);
    await writeFile(encode[scriptAt + 1], text);
  }
  return [materialize(recorded.slice(0, split), files), materialize(encode, files)];
}

async function bare(source: string, dir: string, recorded: DeriveResult): Promise<{ ms: number; playableMs: number }> {
  await rm(dir, { recursive: true, force: true });
  await mkdir(path.join(dir, ".tiles"), { recursive: true });
  const files: Record<string, string> = {
    original: source,
    "stamped.nut": path.join(dir, "stamped.nut"),
    "playable.mp4": path.join(dir, "playable.mp4"),
    "poster.jpg": path.join(dir, "poster.jpg"),
    "sprite.jpg": path.join(dir, "sprite.jpg"),
    "tiles/%06d.bmp": path.join(dir, ".tiles", "%06d.bmp"),
  };
  const args = (kind: string) => recorded.outputs.find((o) => o.kind === kind)!.toolArgs;
  const sprite = args("sprite");
  const split = sprite.indexOf("&&");
  // (a re-encode's filter script is written back where the warm-up run recorded it)
  const commands = await playableCommands(args("playable"), files);
  const t0 = process.hrtime.bigint();
  for (const c of commands) await run("ffmpeg", c);
  const playableMs = Number(process.hrtime.bigint() - t0) / 1e6;
  await run("ffprobe", ["-hide_banner", "-show_streams", "-show_format", files["playable.mp4"]]);
  // The decoder-error pass with the arguments lib/processing/ffmpeg.ts runs it with.
  await run("ffprobe", decoderErrorProbeArgs(source));
  await run("ffmpeg", materialize(sprite.slice(0, split), files));
  await run("ffmpeg", materialize(sprite.slice(split + 2), files));
  await run("ffmpeg", materialize(args("poster"), files));
  return { ms: Number(process.hrtime.bigint() - t0) / 1e6, playableMs };
}

/** The re-encode commands alone (timestamp copy + libx264), for its real-time factor. */
async function reencodeOnly(source: string, dir: string, recorded: DeriveResult): Promise<{ ms: number; cpuSec: number }> {
  await rm(dir, { recursive: true, force: true });
  await mkdir(dir, { recursive: true });
  const files: Record<string, string> = { original: source, "stamped.nut": path.join(dir, "stamped.nut"), "playable.mp4": path.join(dir, "playable.mp4") };
  const playable = recorded.outputs.find((o) => o.kind === "playable")!.toolArgs;
  const commands = await playableCommands(playable, files);
  const cpu0 = childCpuSec();
  const t0 = process.hrtime.bigint();
  for (const c of commands) await run("ffmpeg", c);
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  return { ms, cpuSec: childCpuSec() - cpu0 };
}

/** CPU seconds (user + system) of this process's finished children, from /proc/self/stat (proc(5)). */
function childCpuSec(): number {
  const stat = readFileSync("/proc/self/stat", "utf8");
  const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
  // after the command name: field 3 is index 0, so cutime (16) and cstime (17) are at 13 and 14
  const ticks = Number(fields[13]) + Number(fields[14]);
  return ticks / 100; // USER_HZ is 100 on Linux (sysconf(_SC_CLK_TCK))
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

async function runCase(name: string, source: string) {
  const size = (await stat(source)).size;
  // Warm-up: file cache, fluent-ffmpeg's one-time capability checks, and the recorded arguments.
  const warm = await pipeline(source, path.join(work, `${name}-warm`));
  const frames = warm.result.figures?.frameSlots ?? warm.result.facts.frameCount ?? 0;
  console.log(`\n[${name}] warm-up: ${(warm.ms / 1000).toFixed(1)} s, ${frames} frame slots, playable made by ${warm.result.facts.playableMode}, ${warm.result.figures?.framesLost ?? 0} frames lost`);
  const bareRuns: Array<{ ms: number; playableMs: number }> = [];
  const pipeRuns: Array<{ ms: number; playableMs: number }> = [];
  for (let r = 0; r < ROUNDS; r++) {
    bareRuns.push(await bare(source, path.join(work, `${name}-bare`), warm.result));
    pipeRuns.push(await pipeline(source, path.join(work, `${name}-pipe`)));
    console.log(`  round ${r + 1}: bare ${(bareRuns[r].ms / 1000).toFixed(2)} s, pipeline ${(pipeRuns[r].ms / 1000).toFixed(2)} s, ratio ${(pipeRuns[r].ms / bareRuns[r].ms).toFixed(2)}`);
  }
  const videoSec = frames / 30;
  const b = median(bareRuns.map((x) => x.ms));
  const p = median(pipeRuns.map((x) => x.ms));
  const bp = median(bareRuns.map((x) => x.playableMs));
  const pp = median(pipeRuns.map((x) => x.playableMs));
  console.log(`[${name}] video ${(videoSec / 60).toFixed(1)} min, ${(size / 1e6).toFixed(1)} MB, ${frames} frame slots`);
  console.log(`[${name}] upload end -> playable: pipeline ${(pp / 1000).toFixed(2)} s, bare ${(bp / 1000).toFixed(2)} s, ratio ${(pp / bp).toFixed(2)}`);
  console.log(`[${name}] whole: pipeline ${(p / 1000).toFixed(2)} s (${(videoSec / (p / 1000)).toFixed(0)}x real time), bare ${(b / 1000).toFixed(2)} s (${(videoSec / (b / 1000)).toFixed(0)}x real time), ratio ${(p / b).toFixed(2)} (target <= 1.5)`);
  if (warm.result.facts.playableMode === "reencode") {
    const runs = [await reencodeOnly(source, path.join(work, `${name}-re`), warm.result), await reencodeOnly(source, path.join(work, `${name}-re`), warm.result)];
    const ms = median(runs.map((x) => x.ms));
    const cpu = median(runs.map((x) => x.cpuSec));
    console.log(`[${name}] re-encode alone (timestamp copy + libx264): ${(ms / 1000).toFixed(2)} s, ${(videoSec / (ms / 1000)).toFixed(0)}x real time (target >= 30x)`);
    // On a shared machine wall time depends on the load; the CPU it takes is what it costs.
    console.log(`[${name}] re-encode CPU ${cpu.toFixed(2)} s: ${(videoSec / (cpu / os.cpus().length)).toFixed(0)}x real time on ${os.cpus().length} idle cores (estimate: the CPU time spread over all cores)`);
  }
}

async function main() {
  console.log(`Generating ${minutes} min of 432x240 30 fps Constrained Baseline (cached after the first run)...`);
  const g0 = Date.now();
  const source = await makeRawH264({ width: 432, height: 240, fps: 30, seconds: minutes * 60, bitrate: 560, gop: 30, preset: "veryfast", x264Params: "keyint-min=30:scenecut=0" });
  console.log(`  ${source}, ready in ${((Date.now() - g0) / 1000).toFixed(1)} s`);
  // The fading link, every 300 frames (10 s): 13 frames lost mid-group, one lost just before an IDR,
  // one P picture scrambled.
  await mkdir(work, { recursive: true });
  const damaged = path.join(work, "damaged.264");
  const total = minutes * 60 * 30;
  const remove: number[] = [];
  const scramble: number[] = [];
  for (let at = 0; at + 300 <= total; at += 300) {
    remove.push(...frameRange(at + 100, at + 113), at + 179);
    scramble.push(at + 215);
  }
  await damageDemoStream(source, damaged, { remove, scramble });
  await runCase("clean", source);
  await runCase("damaged", damaged);
  await rm(work, { recursive: true, force: true });
  console.log(`\n(medians of ${ROUNDS} alternating rounds; ${os.cpus().length} cores, load ${os.loadavg().map((l) => l.toFixed(1)).join(" ")})`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
