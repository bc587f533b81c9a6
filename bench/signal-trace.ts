// Benchmark: our streaming signal trace (one pass, no decoding) against a full ffmpeg decode of the same
// controller-like raw H.264 stream, side by side on this machine.
//
//   npx tsx bench/signal-trace.ts                 # 10 minutes of 432x240, 560 kbit/s, 30 fps
//   BENCH_MINUTES=60 npx tsx bench/signal-trace.ts
//
// The stream is generated once into bench/out/ (x264 preset veryfast to keep generation short; the
// bitstream is still Constrained Baseline at the target bitrate) and reused on later runs.

import { spawn } from "node:child_process";
import { createReadStream, existsSync, statSync } from "node:fs";
import { mkdir, rename } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { readH264DecoderErrors } from "../lib/processing/ffmpeg";
import { probeH264File } from "../lib/h264/probe-stream";
import { summarizeTrace } from "../lib/h264/signal-trace";

const MINUTES = Number(process.env.BENCH_MINUTES ?? 10);
const OUT_DIR = path.join(__dirname, "out");
const FILE = path.join(OUT_DIR, `controller-432x240-560k-30fps-${MINUTES}min.264`);

interface Run {
  seconds: number;
  peakRssMiB: number | null;
}

function run(command: string, args: string[]): Promise<{ stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { stdio: ["ignore", "ignore", "pipe"] });
    let stderr = "";
    child.stderr.setEncoding("utf8").on("data", (t: string) => (stderr = (stderr + t).slice(-20000)));
    child.on("error", reject);
    child.on("close", (code) => (code === 0 ? resolve({ stderr }) : reject(new Error(`${command} exited ${code}: ${stderr.slice(-1000)}`))));
  });
}

async function makeStream(): Promise<void> {
  if (existsSync(FILE)) return;
  await mkdir(OUT_DIR, { recursive: true });
  const partial = `${FILE}.part`;
  console.log(`generating ${MINUTES} min test stream into ${path.relative(process.cwd(), FILE)} ...`);
  const started = performance.now();
  await run("ffmpeg", [
    "-v", "error", "-y",
    "-f", "lavfi", "-i", "testsrc2=size=432x240:rate=30",
    "-t", String(MINUTES * 60),
    "-c:v", "libx264", "-preset", "veryfast", "-profile:v", "baseline",
    "-b:v", "560k", "-maxrate", "560k", "-bufsize", "1120k", "-g", "30",
    "-f", "h264", partial,
  ]);
  await rename(partial, FILE);
  console.log(`generated in ${((performance.now() - started) / 1000).toFixed(1)} s`);
}

/** Runs a command under /usr/bin/time to get its wall time and peak RSS. */
async function timeChild(command: string, args: string[]): Promise<Run> {
  if (existsSync("/usr/bin/time")) {
    const { stderr } = await run("/usr/bin/time", ["-f", "BENCH %e %M", command, ...args]);
    const m = /BENCH ([\d.]+) (\d+)/.exec(stderr);
    if (m) return { seconds: Number(m[1]), peakRssMiB: Number(m[2]) / 1024 };
  }
  const started = performance.now();
  await run(command, args);
  return { seconds: (performance.now() - started) / 1000, peakRssMiB: null };
}

async function warmPageCache(): Promise<void> {
  for await (const chunk of createReadStream(FILE, { highWaterMark: 1 << 20 })) void chunk;
}

const mb = (bytes: number) => bytes / 1e6;
const fmt = (n: number, digits = 1) => n.toFixed(digits).padStart(9);

async function main(): Promise<void> {
  await makeStream();
  const bytes = statSync(FILE).size;
  await warmPageCache();
  const rssBefore = process.memoryUsage().rss;

  // Ours, in this process: the first (cold: module load and JIT warm-up) run, then the best of three.
  let first = 0;
  let firstPeakMiB = 0;
  let ours = Number.POSITIVE_INFINITY;
  let result: Awaited<ReturnType<typeof probeH264File>> | null = null;
  for (let n = 0; n < 4; n++) {
    const started = performance.now();
    result = await probeH264File(FILE);
    const seconds = (performance.now() - started) / 1000;
    if (n === 0) {
      first = seconds;
      firstPeakMiB = process.resourceUsage().maxRSS / 1024;
    } else ours = Math.min(ours, seconds);
  }

  const decode = await timeChild("ffmpeg", ["-v", "error", "-f", "h264", "-i", FILE, "-f", "null", "-"]);
  const crossCheckStarted = performance.now();
  const report = await readH264DecoderErrors(FILE);
  const crossCheck = (performance.now() - crossCheckStarted) / 1000;

  const { facts, trace } = result!;
  const summary = summarizeTrace(trace, facts.fps ?? 30);
  console.log("");
  console.log(`stream      ${path.basename(FILE)}: ${fmt(mb(bytes))} MB, ${facts.frameCount} frames, ${facts.profile} ${facts.level}, ${facts.width}x${facts.height} @ ${facts.fps} fps`);
  console.log(`trace       intact share ${summary.intactShare}, lost ${summary.lostFrames}, damaged ${summary.damagedFrames}; decoder errors ${report.errors.length}, decoded ${report.decodedFrames} frames`);
  console.log("");
  console.log("                                        seconds      MB/s   frames/s");
  console.log(`ours: streaming signal trace, warm   ${fmt(ours, 2)} ${fmt(mb(bytes) / ours)} ${fmt(facts.frameCount / ours, 0)}`);
  console.log(`ours: first run in a fresh process    ${fmt(first, 2)} ${fmt(mb(bytes) / first)} ${fmt(facts.frameCount / first, 0)}`);
  console.log(`ffmpeg -f h264 -i FILE -f null -      ${fmt(decode.seconds, 2)} ${fmt(mb(bytes) / decode.seconds)} ${fmt(facts.frameCount / decode.seconds, 0)}`);
  console.log(`ffprobe decoder-error pass (-threads 1)${fmt(crossCheck, 2)} ${fmt(mb(bytes) / crossCheck)} ${fmt(facts.frameCount / crossCheck, 0)}`);
  console.log("");
  console.log(`ratio ffmpeg decode / ours: ${(decode.seconds / ours).toFixed(1)}x warm, ${(decode.seconds / first).toFixed(1)}x first run (target >= 10x)`);
  console.log(`load average during the run: ${os.loadavg().map((l) => l.toFixed(1)).join(" ")} on ${os.cpus().length} cores`);
  console.log(
    `peak RSS: ours ${firstPeakMiB.toFixed(0)} MiB after the first run (whole node process, ${(rssBefore / 2 ** 20).toFixed(0)} MiB before it), ` +
      `ffmpeg decode ${decode.peakRssMiB === null ? "n/a" : `${decode.peakRssMiB.toFixed(0)} MiB`}`,
  );
  console.log(`trace arrays: ${((trace.states.byteLength + trace.flags.byteLength + trace.offsets.byteLength) / 2 ** 20).toFixed(2)} MiB for ${trace.length} frame slots`);
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
