// Decoder errors with their positions, from ffmpeg's H.264 decoder (Debian ffmpeg 5.1), to cross-check
// the signal trace.
//
// Method (checked on ffmpeg 5.1): `ffmpeg -v error -i in.264 -f null -` prints decoder errors but not
// which frame they belong to, and ffprobe 5.1 has no decode_error_flags field. ffprobe's -show_log
// option, however, attaches the decoder's log messages to the frame it prints next, and -show_packets
// interleaves packet lines (with their byte position) with the frame lines in processing order:
//
//   ffprobe -v error -threads 1 -f h264 -show_log 32 -show_packets -show_frames
//           -show_entries packet=pos:frame=pkt_pos,coded_picture_number:log=level,message -of compact FILE
//
// ffprobe reads a packet, prints it, feeds it to the decoder, then prints every frame the decoder
// returns together with the messages logged meanwhile. So an error message belongs to a packet printed
// since the previous frame line (one packet in the steady state; with B-frame reordering the frame
// printed is an earlier one, which is why we go by packet lines, not by the frame's pkt_pos).
// -threads 1 keeps frame threading from delaying the output by extra packets.
// Each packet of the raw H.264 demuxer is one access unit, and its pos is the byte offset where that
// access unit starts in the file, so errors map to our frames by byte offset.
// Kept messages: errors (level 16), and the error concealment's "concealing N DC, N AC, N MV errors in
// P frame", logged at info level (32): for a picture with missing slices it is the decoder's only remark.
// Frames the decoder inferred for a frame_num gap get a coded_picture_number but are never output:
// holes in the coded_picture_number sequence are ffmpeg's view of lost frames.
//
// This module builds the arguments and reads the lines; lib/processing/ffmpeg.ts (readH264DecoderErrors) runs
// ffprobe, like every other ffmpeg and ffprobe call.

import { findFrameAtOffset, presentFrameSlots, type SignalTrace } from "./signal-trace";

export interface DecoderError {
  /** Byte positions of the packets (access units) the messages may belong to; one in the steady state. */
  packetPositions: number[];
  messages: string[];
}

export interface DecoderGap {
  /** Byte position of the first frame decoded after the gap. */
  packetPosition: number;
  missingPictures: number;
}

export interface DecoderReport {
  /** Every packet the demuxer produced, in file order. */
  packetPositions: number[];
  /** Frames the decoder output. */
  decodedFrames: number;
  errors: DecoderError[];
  gaps: DecoderGap[];
  /** Packets that produced no frame at all (e.g. before the first IDR, or undecodable). */
  undecodedPacketPositions: number[];
}

const LOG_LEVEL_ERROR = 16; // AV_LOG_ERROR
const LOG_LEVEL_INFO = 32; // AV_LOG_INFO: error concealment reports at this level
const CONCEALMENT = /^concealing /;

/** Splits a line of ffprobe's compact writer on '|' that are not escaped with a backslash. */
function splitCompact(line: string): string[] {
  const out: string[] = [];
  let token = "";
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === "\\" && i + 1 < line.length) {
      const n = line[++i];
      token += n === "n" ? "\n" : n === "t" ? "\t" : n === "r" ? "\r" : n;
    } else if (c === "|") {
      out.push(token);
      token = "";
    } else {
      token += c;
    }
  }
  out.push(token);
  return out;
}

function cleanMessage(raw: string): string {
  return raw.replace(/^\[[^\]]*\]\s*/, "").trim();
}

/** Collects decoder errors from ffprobe's compact output lines (exported for tests). */
export class DecoderLogCollector {
  private readonly packets: number[] = [];
  private pending: number[] = [];
  private logTarget: DecoderError | null = null;
  private readonly decodedPositions = new Set<number>();
  private readonly codedNumbers: Array<{ n: number; pos: number }> = [];
  private readonly errors: DecoderError[] = [];
  private decodedFrames = 0;

  line(line: string): void {
    if (line.length === 0) return;
    const tokens = splitCompact(line);
    let section = "";
    let fields: Record<string, string> = {};
    const closeSection = () => {
      if (section === "frame") this.onFrame(fields);
      else if (section === "packet") this.onPacket(fields);
      else if (section === "log") this.onLog(fields);
    };
    for (const token of tokens) {
      if (token.length === 0) continue;
      const eq = token.indexOf("=");
      if (eq < 0) {
        closeSection();
        section = token;
        fields = {};
      } else {
        fields[token.slice(0, eq)] = token.slice(eq + 1);
      }
    }
    closeSection();
  }

  report(): DecoderReport {
    const gaps: DecoderGap[] = [];
    const sorted = this.codedNumbers.slice().sort((a, b) => a.n - b.n);
    for (let i = 1; i < sorted.length; i++) {
      const missing = sorted[i].n - sorted[i - 1].n - 1;
      if (missing > 0) gaps.push({ packetPosition: sorted[i].pos, missingPictures: missing });
    }
    return {
      packetPositions: this.packets,
      decodedFrames: this.decodedFrames,
      errors: this.errors,
      gaps,
      undecodedPacketPositions: this.packets.filter((pos) => !this.decodedPositions.has(pos)),
    };
  }

  private onPacket(fields: Record<string, string>): void {
    const pos = Number(fields.pos);
    if (!Number.isFinite(pos)) return;
    this.packets.push(pos);
    this.pending.push(pos);
  }

  private onFrame(fields: Record<string, string>): void {
    this.decodedFrames++;
    const pos = Number(fields.pkt_pos);
    if (Number.isFinite(pos)) this.decodedPositions.add(pos);
    const n = Number(fields.coded_picture_number);
    if (Number.isFinite(pos) && Number.isFinite(n)) this.codedNumbers.push({ n, pos });
    // Messages printed with this frame were logged while decoding the packets read since the last frame.
    this.logTarget = this.pending.length > 0 ? { packetPositions: this.pending, messages: [] } : null;
    this.pending = [];
  }

  private onLog(fields: Record<string, string>): void {
    const level = Number(fields.level);
    if (!this.logTarget || !Number.isFinite(level)) return;
    const message = cleanMessage(fields.message ?? "");
    if (level > LOG_LEVEL_ERROR && !(level <= LOG_LEVEL_INFO && CONCEALMENT.test(message))) return;
    if (this.logTarget.messages.length === 0) this.errors.push(this.logTarget);
    this.logTarget.messages.push(message);
  }
}

/** The ffprobe arguments that print packets, frames and decoder messages of a raw H.264 file (see above). */
export function decoderErrorProbeArgs(path: string): string[] {
  return [
    "-v", "error",
    "-threads", "1",
    "-f", "h264",
    "-show_log", String(LOG_LEVEL_INFO),
    "-show_packets",
    "-show_frames",
    "-show_entries", "packet=pos:frame=pkt_pos,coded_picture_number:log=level,message",
    "-of", "compact",
    path,
  ];
}

export interface LocatedDecoderEvents {
  /** Stream frame indexes (present frames, file order) with decoder errors or no decoded output. */
  damagedFrames: number[];
  /** Stream frame indexes of the first frame after each gap the decoder inferred. */
  gapFrames: Array<{ frame: number; missingPictures: number }>;
}

/** Maps a decoder report onto the frames of a trace by byte offset. */
export function locateDecoderEvents(report: DecoderReport, trace: SignalTrace): LocatedDecoderEvents {
  const slots = presentFrameSlots(trace);
  const damaged = new Set<number>();
  for (const error of report.errors) {
    for (const pos of error.packetPositions) {
      const frame = findFrameAtOffset(trace, slots, pos);
      if (frame >= 0) damaged.add(frame);
    }
  }
  for (const pos of report.undecodedPacketPositions) {
    const frame = findFrameAtOffset(trace, slots, pos);
    if (frame >= 0) damaged.add(frame);
  }
  const gapFrames = report.gaps
    .map((gap) => ({ frame: findFrameAtOffset(trace, slots, gap.packetPosition), missingPictures: gap.missingPictures }))
    .filter((gap) => gap.frame >= 0);
  return { damagedFrames: [...damaged].sort((a, b) => a - b), gapFrames };
}
