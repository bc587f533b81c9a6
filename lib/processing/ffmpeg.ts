// The one module that runs ffmpeg and ffprobe (through fluent-ffmpeg, archived upstream: replacing it
// by child_process.spawn later touches this file only). Every run can be cancelled with an
// AbortSignal (the child is killed), logs its command line and the tail of stderr when it fails, and
// reports progress clamped to 0..100. The one exception to fluent-ffmpeg is runFfprobeLines: its
// ffprobe() only returns the parsed -show_streams/-show_format output, and the decoder-error pass
// needs ffprobe's own writer read line by line as it comes.
import { spawn } from "node:child_process";
import { createInterface } from "node:readline";
import ffmpeg from "fluent-ffmpeg";
import type { Readable } from "node:stream";
import { DecoderLogCollector, decoderErrorProbeArgs, type DecoderReport } from "@/lib/h264/ffmpeg-decode-errors";
import { progressFromTimemark } from "./progress-from-timemark";

export interface FfmpegInput {
  /** A file path, or a byte stream fed to ffmpeg's stdin. */
  source: string | Readable;
  options?: string[];
  /** What the input is called in recorded arguments (paths are per run; the names are not). */
  name: string;
}

export interface FfmpegOutput {
  path: string;
  options: string[];
  name: string;
}

export interface FfmpegRequest {
  /** Short name for logs: "playable", "poster"... */
  label: string;
  input: FfmpegInput;
  output: FfmpegOutput;
  signal?: AbortSignal;
  /** Output duration expected, in seconds: turns ffmpeg's time= into a percentage. */
  expectedDurationSec?: number;
  onProgress?: (percent: number) => void;
}

export interface FfmpegResult {
  tool: "ffmpeg";
  /** The arguments as run, with file paths replaced by the names given: stable across runs. */
  args: string[];
}

export class MediaToolError extends Error {
  constructor(
    message: string,
    readonly tool: "ffmpeg" | "ffprobe",
    readonly commandLine: string,
    readonly stderrTail: string,
    readonly aborted: boolean,
  ) {
    super(message);
    this.name = "MediaToolError";
  }
}

const STDERR_LOG_LINES = 40;

/** Arguments in the order fluent-ffmpeg passes them (input options, -i, -y, output options, output). */
export function describeArgs(request: Pick<FfmpegRequest, "input" | "output">): string[] {
  return [...inputOptionsOf(request.input), "-i", `{${request.input.name}}`, "-y", ...request.output.options, `{${request.output.name}}`];
}

// -hide_banner: a failure's stderr then starts with what went wrong, not with the build configuration.
function inputOptionsOf(input: FfmpegInput): string[] {
  return ["-hide_banner", ...(input.options ?? [])];
}

function abortReason(signal: AbortSignal | undefined): Error {
  const reason = signal?.reason;
  return reason instanceof Error ? reason : new Error(typeof reason === "string" ? reason : "cancelled");
}

export function runFfmpeg(request: FfmpegRequest): Promise<FfmpegResult> {
  const { input, output, signal } = request;
  return new Promise<FfmpegResult>((resolve, reject) => {
    if (signal?.aborted) return reject(abortReason(signal));
    // stdoutLines bounds the stderr ring fluent-ffmpeg keeps: damaged streams repeat decoder errors endlessly.
    const command = ffmpeg({ stdoutLines: 200 })
      .input(input.source)
      .inputOptions(inputOptionsOf(input))
      .output(output.path)
      .outputOptions(output.options);
    let commandLine = `ffmpeg (${request.label}, not started)`;
    let started = false;
    let killed = false;
    let lastPercent = -1;
    const kill = () => {
      killed = true;
      if (started) command.kill("SIGKILL");
    };
    signal?.addEventListener("abort", kill, { once: true });
    const done = () => signal?.removeEventListener("abort", kill);

    command.on("start", (line: string) => {
      started = true;
      commandLine = line;
      // Aborted while fluent-ffmpeg was still checking capabilities: kill as soon as there is a child.
      if (killed) command.kill("SIGKILL");
    });
    if (request.onProgress && request.expectedDurationSec) {
      const onProgress = request.onProgress;
      const duration = request.expectedDurationSec;
      command.on("progress", (p: { timemark?: string }) => {
        const percent = progressFromTimemark(p.timemark, duration);
        if (percent === null || percent <= lastPercent) return;
        lastPercent = percent;
        onProgress(percent);
      });
    }
    command.on("error", (err: Error, _stdout: string | null, stderr: string | null) => {
      done();
      const tail = (stderr ?? "").trim().split("\n").slice(-STDERR_LOG_LINES).join("\n");
      if (killed || signal?.aborted) {
        reject(signal?.aborted ? abortReason(signal) : new MediaToolError(`ffmpeg (${request.label}) was stopped`, "ffmpeg", commandLine, tail, true));
        return;
      }
      console.error(`[ffmpeg] ${request.label} failed: ${err.message.split("\n")[0]}\n  command: ${commandLine}\n  stderr:\n${tail}`);
      reject(new MediaToolError(summarizeFailure(err.message, tail), "ffmpeg", commandLine, tail, false));
    });
    command.on("end", () => {
      done();
      request.onProgress?.(100);
      resolve({ tool: "ffmpeg", args: describeArgs(request) });
    });
    command.run();
  });
}

/** One line a person can read: ffmpeg's last error line rather than its whole banner. */
function summarizeFailure(message: string, stderrTail: string): string {
  const lines = stderrTail.split("\n").map((l) => l.trim()).filter(Boolean);
  const last = lines.reverse().find((l) => !/^(frame=|size=|video:|Conversion failed)/.test(l));
  return last ? `ffmpeg: ${last}` : `ffmpeg: ${message.split("\n")[0]}`;
}

// ffprobe's default output, as fluent-ffmpeg parses it: numbers become numbers, the rest strings.
export interface ProbedStream {
  index: number;
  codec_type?: string;
  codec_name?: string;
  profile?: string | number;
  level?: number;
  width?: number;
  height?: number;
  pix_fmt?: string;
  avg_frame_rate?: string;
  r_frame_rate?: string;
  nb_frames?: number | string;
  nb_read_frames?: number | string;
  duration?: number | string;
  bit_rate?: number | string;
  disposition?: Record<string, number>;
  [key: string]: unknown;
}
export interface ProbedFormat {
  format_name?: string;
  duration?: number | string;
  bit_rate?: number | string;
  size?: number | string;
  [key: string]: unknown;
}
export interface ProbeData {
  streams: ProbedStream[];
  format: ProbedFormat;
}

/**
 * ffprobe -show_streams -show_format [options] FILE. fluent-ffmpeg cannot kill ffprobe, so an abort
 * only stops waiting for it; it is meant for header reads (containers), which end quickly.
 */
export function runFfprobe(path: string, options: string[] = [], signal?: AbortSignal): Promise<ProbeData> {
  return new Promise<ProbeData>((resolve, reject) => {
    if (signal?.aborted) return reject(abortReason(signal));
    const onAbort = () => reject(abortReason(signal));
    signal?.addEventListener("abort", onAbort, { once: true });
    ffmpeg.ffprobe(path, ["-hide_banner", ...options], (err: Error | null, data: unknown) => {
      signal?.removeEventListener("abort", onAbort);
      if (err) {
        const commandLine = `ffprobe -show_streams -show_format ${options.join(" ")} ${path}`;
        const tail = err.message.split("\n").slice(-STDERR_LOG_LINES).join("\n");
        console.error(`[ffprobe] failed\n  command: ${commandLine}\n  stderr:\n${tail}`);
        reject(new MediaToolError(summarizeProbeFailure(err.message), "ffprobe", commandLine, tail, false));
        return;
      }
      resolve(data as ProbeData);
    });
  });
}

function summarizeProbeFailure(message: string): string {
  const lines = message.split("\n").map((l) => l.trim()).filter(Boolean);
  // fluent-ffmpeg puts "ffprobe exited with code 1" first and ffprobe's own stderr after it.
  const detail = lines.slice(1).reverse().find(Boolean) ?? lines[0] ?? "ffprobe failed";
  return `ffprobe: ${detail.replace(/^[^:]*\/[^:]*:\s*/, "")}`;
}

const STDERR_KEEP_BYTES = 16 * 1024;

/**
 * ffprobe ARGS with its stdout handed over line by line; resolves once ffprobe has exited with code 0
 * and the last line is read. An abort kills ffprobe. Rejects with a plain Error (exit code and the
 * last lines of stderr); callers turn it into a MediaToolError.
 */
function runFfprobeLines(args: string[], onLine: (line: string) => void, signal?: AbortSignal): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn("ffprobe", args, { stdio: ["ignore", "pipe", "pipe"], signal });
    let stderr = "";
    let settled = false;
    const finish = (error: Error | null) => {
      if (settled) return;
      settled = true;
      if (error) reject(error);
      else resolve();
    };
    child.stderr.setEncoding("utf8");
    child.stderr.on("data", (text: string) => {
      // The decoder repeats its errors on stderr; keep only the tail for a failure message.
      stderr = (stderr + text).slice(-STDERR_KEEP_BYTES);
    });
    const lines = createInterface({ input: child.stdout, crlfDelay: Infinity });
    lines.on("line", onLine);
    child.on("error", (error) => finish(error));
    // Wait for both the exit and the last stdout line.
    let exitCode: number | null | undefined;
    let linesClosed = false;
    const maybeDone = () => {
      if (exitCode === undefined || !linesClosed) return;
      if (exitCode === 0) finish(null);
      else finish(new Error(`ffprobe exited with code ${exitCode}: ${stderr.trim().split("\n").slice(-5).join("\n")}`));
    };
    lines.on("close", () => {
      linesClosed = true;
      maybeDone();
    });
    child.on("close", (code) => {
      exitCode = code;
      maybeDone();
    });
  });
}

/**
 * ffmpeg's H.264 decoder errors located per access unit: ffprobe with the arguments and the line reader
 * of lib/h264/ffmpeg-decode-errors.ts. Takes an AbortSignal; logged like every other tool failure.
 */
export async function readH264DecoderErrors(path: string, signal?: AbortSignal): Promise<DecoderReport> {
  const collector = new DecoderLogCollector();
  try {
    await runFfprobeLines(decoderErrorProbeArgs(path), (line) => collector.line(line), signal);
    return collector.report();
  } catch (err) {
    if (signal?.aborted) throw abortReason(signal);
    const message = err instanceof Error ? err.message : String(err);
    console.error(`[ffprobe] decoder error pass failed on ${path}: ${message}`);
    throw new MediaToolError(`ffprobe: ${message.split("\n").slice(-1)[0]}`, "ffprobe", `ffprobe (decoder errors) ${path}`, message, false);
  }
}
