// Extracts one decoded frame, exactly frame N, as a full-resolution JPEG (through lib/processing/ffmpeg.ts).
//
// Why a timestamp seek and not `select=eq(n\,N)` from the start: counting decoded frames from the
// start is exact but decodes everything before N (minutes for a late frame of a long 4K file). An
// input seek to half a frame before N's start decodes from the preceding keyframe only, and ffmpeg's
// accurate seek drops every frame that starts before the seek point, so the first frame out is N.
// To be sure, the frame's own timestamp (kept with -copyts, printed by the metadata filter) is
// checked against N's start; a mismatch fails the job instead of storing the wrong picture.
import "server-only";
import { readFile } from "node:fs/promises";
import path from "node:path";
import { runFfmpeg, runFfprobe } from "@/lib/processing/ffmpeg";
import type { FrameRate } from "@/lib/timecode/frame-rate";

export type ExtractedFrame = { width: number; height: number; ptsTime: number; tool: "ffmpeg"; args: string[] };

// filtergraph option values: backslash-escape the characters the parser treats specially
const escapeFilterValue = (v: string) => v.replace(/[\\:',;[\]=]/g, (c) => `\\${c}`);

export async function extractFrame(opts: {
  input: string;
  inputName: string;
  frame: number;
  rate: FrameRate;
  output: string;
  signal?: AbortSignal;
}): Promise<ExtractedFrame> {
  const { input, frame, rate, output } = opts;
  if (!Number.isSafeInteger(frame) || frame < 0) throw new RangeError(`frame must be a non-negative integer, got ${frame}`);
  const frameSec = rate.den / rate.num;
  const probe = await runFfprobe(input, [], opts.signal);
  const startTime = Number(probe.format.start_time ?? 0) || 0;
  // -ss on the input is relative to the file's start time (ffmpeg adds start_time itself)
  const seek = frame > 0 ? (frame - 0.5) * frameSec : 0;
  const metaFile = path.join(path.dirname(output), `${path.basename(output)}.frames.txt`);
  const run = await runFfmpeg({
    label: "still",
    input: { source: input, name: opts.inputName, options: ["-copyts", ...(frame > 0 ? ["-ss", seek.toFixed(6)] : [])] },
    output: {
      path: output,
      name: "still.jpg",
      options: [
        "-map", "0:v:0", "-an", "-sn", "-dn",
        "-vf", `metadata=mode=add:key=cairn_still:value=1,metadata=mode=print:file=${escapeFilterValue(metaFile)}`,
        "-frames:v", "1",
        "-q:v", "2", // JPEG quality scale 2..31: 2 keeps the detail evidence needs
        "-f", "image2", "-update", "1",
      ],
    },
    signal: opts.signal,
  });
  const printed = await readFile(metaFile, "utf8").catch(() => "");
  const m = /^frame:0\s+pts:\s*-?\d+\s+pts_time:(\S+)/m.exec(printed);
  if (!m) throw new Error(`frame ${frame} was not decoded (past the end of the stream?)`);
  const ptsTime = Number(m[1]);
  const expected = startTime + frame * frameSec;
  if (!(Math.abs(ptsTime - expected) < frameSec / 2)) {
    throw new Error(`decoded the frame at ${ptsTime} s but frame ${frame} starts at ${expected.toFixed(6)} s: the stream's timing differs from the recording's frame rate`);
  }
  const still = await runFfprobe(output, [], opts.signal);
  const video = still.streams.find((s) => s.codec_type === "video");
  if (!video?.width || !video?.height) throw new Error("the extracted still cannot be read back");
  // the metadata filter's options hold a per-run path: record a stable stand-in
  const args = run.args.map((a) => (a.includes(metaFile) ? a.replace(escapeFilterValue(metaFile), "{frames.txt}") : a));
  return { width: video.width, height: video.height, ptsTime, tool: "ffmpeg", args };
}
