// Reference readings of a raw H.264 file by Debian ffmpeg/ffprobe 5.1: the outside source the
// H.264 integration tests compare our parser with.

import { runTool } from "@/tests/support/media/make-h264";

export interface TraceUnit {
  title: string;
  fields: Record<string, number>;
}

const FIELD = /^\[trace_headers @ [^\]]+\]\s+\d+\s+(\S+)\s+[01]+\s+=\s+(-?\d+)\s*$/;
const TITLE = /^\[trace_headers @ [^\]]+\]\s+(.+?)\s*$/;

/**
 * Syntax elements as ffmpeg's trace_headers bitstream filter prints them, one unit per NAL unit or
 * SEI message, in stream order (the copy of the parameter sets ffmpeg prints as "Extradata" is skipped).
 */
export async function readTraceHeaders(file: string): Promise<TraceUnit[]> {
  const { stderr } = await runTool("ffmpeg", [
    "-hide_banner", "-nostats", "-f", "h264", "-i", file, "-c", "copy", "-bsf:v", "trace_headers", "-f", "null", "-",
  ]);
  const units: TraceUnit[] = [];
  let inPackets = false;
  let current: TraceUnit | null = null;
  for (const line of stderr.split("\n")) {
    if (!line.startsWith("[trace_headers")) continue;
    const field = FIELD.exec(line);
    if (field) {
      if (inPackets && current) current.fields[field[1]] = Number(field[2]);
      continue;
    }
    const title = TITLE.exec(line)?.[1] ?? "";
    if (title.startsWith("Packet:")) {
      inPackets = true;
      continue;
    }
    if (!inPackets) continue;
    current = { title, fields: {} };
    units.push(current);
  }
  return units;
}

export interface FfprobeFacts {
  width: number;
  height: number;
  profile: string;
  level: number;
  rFrameRate: number;
  sampleAspectRatio: string;
  nbReadFrames: number;
  packetPositions: number[];
}

export async function ffprobeFacts(file: string): Promise<FfprobeFacts> {
  const { stdout } = await runTool("ffprobe", [
    "-v", "error", "-f", "h264", "-count_frames", "-show_packets",
    "-show_entries", "stream=width,height,profile,level,r_frame_rate,sample_aspect_ratio,nb_read_frames:packet=pos",
    "-of", "json", file,
  ]);
  const json = JSON.parse(stdout) as {
    streams: Array<Record<string, string | number>>;
    packets: Array<{ pos: string }>;
  };
  const s = json.streams[0];
  const [num, den] = String(s.r_frame_rate).split("/").map(Number);
  return {
    width: Number(s.width),
    height: Number(s.height),
    profile: String(s.profile),
    level: Number(s.level),
    rFrameRate: num / den,
    sampleAspectRatio: String(s.sample_aspect_ratio),
    nbReadFrames: Number(s.nb_read_frames),
    packetPositions: json.packets.map((p) => Number(p.pos)),
  };
}
