// The playable MP4 of a damaged raw H.264 stream: decoded and re-encoded, on the recorder's clock.
//
// Why re-encode: copying broken slices into an MP4 hands the browser's decoder the damage, and
// Chromium stops for good at the first picture it cannot decode (MEDIA_ERR_DECODE). ffmpeg's decoder
// conceals broken slices and missing references instead, so what it outputs always decodes.
//
// Why the timestamps: the stream is first copied (no decoding) into NUT, whose packets keep the times
// the raw H.264 demuxer gives them: packet i (present frame i, in file order) at i / rate. Read from
// the raw stream directly, a decoded frame's time is only a guess from the decoder's output count,
// and the decoder drops pictures it cannot rebuild after a loss, which would shift every later
// frame. A setpts expression then moves frame i to its recorder frame slot (from the signal trace's
// slot map: lost frames shift everything after them), the first picture the decoder outputs to 0, and
// `-fps_mode cfr` then repeats the frame before each gap for the gap's length. tpad and `-frames:v`
// make the rendition exactly `frameSlots` frames long. So slot k is at k / rate in the rendition,
// as on the recorder, and the player, stills and trace share one clock. The packet time, not the
// decoder's output count (N), is what is mapped: a picture the decoder drops does not shift the rest.
// The filter goes to ffmpeg as a script file: with thousands of losses it outgrows one argument.
//
// libx264 settings for a controller stream (about 432x240 at ~0.5 Mbit/s): `superfast` encodes this
// size at well over 30x real time on two cores (bench/processing.ts measures it; `veryfast` needs
// about 1.5x the CPU for a file half the size, and leaves no headroom beside the decoder pass), and
// at CRF 23 (x264's default quality) it lands near the source's own ~0.5-0.7 Mbit/s, ample for a
// source that is itself ~0.5 Mbit/s and concealment-smeared; a keyframe every
// second keeps seeking and frame stepping quick in the browser; maxrate/bufsize cap the bursts that
// concealed noise would otherwise cost; yuv420p 8-bit is what every browser decodes; `scale` to the
// first picture size keeps one size when the stream changes resolution mid-way (the encoder cannot).
import type { FrameRateRatio } from "../recordings/recording-figures";

export interface TimedReencodeInput {
  /** Slot of each frame present in the file, in file order (presentFrameSlots of the trace). */
  presentSlots: ArrayLike<number>;
  frameSlots: number;
  rate: FrameRateRatio;
  width: number;
  height: number;
}

// Deterministic output (no encoder version string), so a second run writes the same bytes.
const MP4_OUT = ["-movflags", "+faststart", "-fflags", "+bitexact", "-f", "mp4"];

export function reencodeVideoOptions(rate: FrameRateRatio): string[] {
  const keyint = Math.max(1, Math.round(rate.num / rate.den));
  return [
    "-c:v", "libx264",
    "-preset", "superfast",
    "-crf", "23",
    "-maxrate", "1500k",
    "-bufsize", "3000k",
    "-g", String(keyint),
    "-pix_fmt", "yuv420p",
  ];
}

/** Breakpoints of the present-index -> slot offset: from index `at` on, slot = index + offset. */
function offsetSteps(presentSlots: ArrayLike<number>): Array<{ at: number; offset: number }> {
  const steps: Array<{ at: number; offset: number }> = [];
  let last = 0;
  for (let i = 0; i < presentSlots.length; i++) {
    const offset = presentSlots[i] - i;
    if (offset !== last) {
      steps.push({ at: i, offset });
      last = offset;
    }
  }
  return steps;
}

/** A balanced if-tree over the steps: log2(steps) comparisons per frame, not one per loss. */
function offsetExpression(steps: Array<{ at: number; offset: number }>, lo: number, hi: number, below: number): string {
  // steps[lo..hi) cover x >= steps[lo].at; `below` is the offset for x < steps[lo].at
  if (lo >= hi) return String(below);
  if (hi - lo === 1) return `if(lt(ld(0),${steps[lo].at}),${below},${steps[lo].offset})`;
  const mid = (lo + hi) >> 1;
  return `if(lt(ld(0),${steps[mid].at}),${offsetExpression(steps, lo, mid, below)},${offsetExpression(steps, mid + 1, hi, steps[mid].offset)})`;
}

/** The setpts expression that puts present frame i at its slot (seconds * 1/TB), the first output at 0. */
export function slotTimestampExpression(presentSlots: ArrayLike<number>, rate: FrameRateRatio): string {
  const steps = offsetSteps(presentSlots);
  const index = `st(0,round(T*${rate.num}/${rate.den}))`;
  return `if(eq(N,0),0,(${index};(ld(0)+${offsetExpression(steps, 0, steps.length, 0)})*${rate.den}/(${rate.num}*TB)))`;
}

export interface TimedReencodePlan {
  /** Step 1: raw stream -> NUT with packet times, no decoding. */
  stamp: { inputOptions: string[]; outputOptions: string[] };
  /** Step 2: NUT -> playable MP4; `-filter_script:v` names the file holding `filterScript`. */
  inputOptions: string[];
  outputOptions: string[];
  filterScript: string;
}

export function planTimedReencode(input: TimedReencodeInput, filterScriptPath: string): TimedReencodePlan {
  const rate = `${input.rate.num}/${input.rate.den}`;
  const filters = [
    `setpts='${slotTimestampExpression(input.presentSlots, input.rate)}'`,
    `scale=${input.width}:${input.height}`,
    // Frames lost at the very end (after the last picture) hold the last picture.
    "tpad=stop_mode=clone:stop=-1",
  ];
  return {
    stamp: { inputOptions: ["-f", "h264", "-r", rate], outputOptions: ["-map", "0:v:0", "-c:v", "copy", "-f", "nut"] },
    filterScript: filters.join(","),
    inputOptions: ["-f", "nut"],
    outputOptions: [
      "-map", "0:v:0",
      "-filter_script:v", filterScriptPath,
      "-fps_mode", "cfr",
      "-r", rate,
      "-frames:v", String(input.frameSlots),
      ...reencodeVideoOptions(input.rate),
      ...MP4_OUT,
    ],
  };
}
