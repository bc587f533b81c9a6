// How the playable MP4 is made: H.264 that browsers decode (8-bit 4:2:0, progressive) is copied
// without re-encoding; anything else is transcoded with libx264. Raw Annex B input gets its frame
// rate from `-r` (the raw demuxer has no timestamps; input -r sets the rate even when the SPS carries
// timing info: ffmpeg manual, option -r, and docs/library-notes.md, "ffmpeg on raw H.264") and starts
// at the first IDR picture when the stream starts mid-GOP.
import { formatRateForFfmpeg } from "./choose-frame-rate";

// Deterministic output (no encoder version string), so a second run writes the same bytes.
const MP4_OUT = ["-movflags", "+faststart", "-fflags", "+bitexact", "-f", "mp4"];
// libx264 settings for browsers: veryfast keeps a 2-core machine near real time; CRF 23 is x264's
// default quality (x264 documentation); yuv420p is what every browser decodes.
const X264 = ["-c:v", "libx264", "-preset", "veryfast", "-crf", "23", "-pix_fmt", "yuv420p"];
const BROWSER_AUDIO = new Set(["aac", "mp3"]);
const BROWSER_PIX_FMTS = new Set(["yuv420p", "yuvj420p"]);

export interface PlayablePlan {
  mode: "remux" | "transcode";
  /** Byte offset in the original where ffmpeg's input starts (raw H.264 cut at its first IDR). */
  startOffset: number;
  inputOptions: string[];
  outputOptions: string[];
  /** Why, in words, for the facts shown to people. */
  reason: string;
}

export interface RawStreamShape {
  chromaFormatIdc: number | null;
  bitDepthLuma: number | null;
  interlaced: boolean | null;
  startsWithIdr: boolean;
  firstIdrOffset: number | null;
}

export function planRawPlayable(stream: RawStreamShape, fps: number): PlayablePlan {
  const browserReady = (stream.chromaFormatIdc ?? 1) === 1 && (stream.bitDepthLuma ?? 8) === 8 && stream.interlaced !== true;
  // Only when an IDR exists: a stream refreshed by recovery points alone is kept whole.
  const cut = !stream.startsWithIdr && stream.firstIdrOffset !== null && stream.firstIdrOffset > 0;
  const inputOptions = ["-f", "h264", "-r", formatRateForFfmpeg(fps)];
  const video = browserReady ? ["-c:v", "copy"] : X264;
  return {
    mode: browserReady ? "remux" : "transcode",
    startOffset: cut ? stream.firstIdrOffset! : 0,
    inputOptions,
    outputOptions: ["-map", "0:v:0", ...video, ...MP4_OUT],
    reason: browserReady
      ? cut
        ? "remuxed without re-encoding, from the first IDR picture"
        : "remuxed without re-encoding"
      : "transcoded to H.264 4:2:0 8-bit: the stream's format does not play in browsers",
  };
}

export interface ContainerShape {
  videoCodec: string;
  pixFmt: string | null;
  audioCodec: string | null;
}

export function planContainerPlayable(source: ContainerShape): PlayablePlan {
  const copyVideo = source.videoCodec === "h264" && (source.pixFmt === null || BROWSER_PIX_FMTS.has(source.pixFmt));
  const audio = source.audioCodec === null ? [] : BROWSER_AUDIO.has(source.audioCodec) ? ["-c:a", "copy"] : ["-c:a", "aac", "-b:a", "128k"];
  // "?" makes the audio mapping optional: no audio track is not an error.
  const maps = ["-map", "0:v:0", "-map", "0:a:0?"];
  return {
    mode: copyVideo ? "remux" : "transcode",
    startOffset: 0,
    inputOptions: [],
    outputOptions: [...maps, ...(copyVideo ? ["-c:v", "copy"] : X264), ...audio, ...MP4_OUT],
    reason: copyVideo
      ? "remuxed without re-encoding"
      : `transcoded to H.264: browsers do not reliably play ${source.videoCodec}${source.pixFmt ? ` (${source.pixFmt})` : ""}`,
  };
}
