// Technical facts of a container file (MP4/MOV, or the playable we made) from ffprobe's stream and
// format sections: the first video stream, the first audio stream, duration and bitrate.
import { runFfprobe, type ProbeData, type ProbedStream } from "./ffmpeg";

export interface ContainerFacts {
  formatName: string | null;
  video: {
    codec: string;
    profile: string | null;
    level: number | null;
    width: number;
    height: number;
    pixFmt: string | null;
    /** Frames as the container counts them (MP4: samples in the stsz box). */
    frameCount: number | null;
    fps: number | null;
    durationSec: number | null;
  } | null;
  audio: { codec: string } | null;
  durationSec: number | null;
  bitrate: number | null;
}

function num(v: unknown): number | null {
  const n = typeof v === "number" ? v : typeof v === "string" && v.trim() !== "" ? Number(v) : NaN;
  return Number.isFinite(n) ? n : null;
}

/** "30000/1001" -> 29.97..., "0/0" -> null. */
export function parseRational(v: unknown): number | null {
  if (typeof v === "number") return Number.isFinite(v) && v > 0 ? v : null;
  if (typeof v !== "string") return null;
  const [a, b] = v.split("/").map(Number);
  if (b === undefined) return Number.isFinite(a) && a > 0 ? a : null;
  return Number.isFinite(a) && Number.isFinite(b) && a > 0 && b > 0 ? a / b : null;
}

export function containerFactsOf(data: ProbeData): ContainerFacts {
  // Cover art is stored as a one-frame "video" stream with disposition attached_pic: not a video track.
  const isRealVideo = (s: ProbedStream) =>
    s.codec_type === "video" && Number(s["DISPOSITION:attached_pic"] ?? s.disposition?.attached_pic ?? 0) !== 1;
  const v = data.streams.find(isRealVideo);
  const a = data.streams.find((s) => s.codec_type === "audio");
  const profile = v?.profile;
  return {
    formatName: typeof data.format.format_name === "string" ? data.format.format_name : null,
    video:
      v && num(v.width) && num(v.height)
        ? {
            codec: String(v.codec_name ?? "unknown"),
            profile: profile === undefined || profile === "unknown" ? null : String(profile),
            level: num(v.level),
            width: num(v.width)!,
            height: num(v.height)!,
            pixFmt: typeof v.pix_fmt === "string" ? v.pix_fmt : null,
            frameCount: num(v.nb_read_frames) ?? num(v.nb_frames),
            fps: parseRational(v.avg_frame_rate) ?? parseRational(v.r_frame_rate),
            durationSec: num(v.duration),
          }
        : null,
    audio: a ? { codec: String(a.codec_name ?? "unknown") } : null,
    durationSec: num(data.format.duration),
    bitrate: num(data.format.bit_rate),
  };
}

export async function readContainerFacts(path: string, signal?: AbortSignal): Promise<ContainerFacts> {
  return containerFactsOf(await runFfprobe(path, [], signal));
}
