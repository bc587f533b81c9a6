// Decides what an uploaded file is from its first bytes, never from its name: a controller's raw
// H.264 stream often has no extension at all, and a renamed file must not slip through.
//
// Accepted:
//   raw H.264  ITU-T H.264 Annex B byte stream: optional leading zero bytes, a start code
//              (00 00 01), NAL units whose forbidden_zero_bit is 0, and a sequence parameter set
//              (nal_unit_type 7, Table 7-1) within the sniffed head, with a known profile_idc
//              (7.4.2.1.1, Annex A) and level_idc (Table A-1).
//   MP4 / MOV  ISO/IEC 14496-12 file: a `ftyp` box at offset 4; major brand "qt  " is QuickTime.
//   JPEG       SOI marker FF D8 followed by a marker byte FF (ITU-T T.81, B.2.1).
// Everything else is refused, with a description of what it looks like when we can tell.
import { NalType } from "@/lib/h264/nal-unit-types";

export type RecordingKind = "raw_h264" | "mp4" | "mov" | "jpeg";

export type SniffResult = { ok: true; kind: RecordingKind } | { ok: false; reason: string };

// profile_idc values of H.264 (7.4.2.1.1 and Annexes A, G, H)
const PROFILES = new Set([66, 77, 88, 100, 110, 122, 244, 44, 83, 86, 118, 128, 138, 139, 134, 135]);
// level_idc values of Table A-1 (9 is level 1b in the High profiles)
const LEVELS = new Set([9, 10, 11, 12, 13, 20, 21, 22, 30, 31, 32, 40, 41, 42, 50, 51, 52, 60, 61, 62]);

// ISO BMFF brands of files that are not video: still images and audio (registered brands, mp4ra.org).
const NON_VIDEO_BRANDS: Record<string, string> = {
  heic: "an HEIF/HEIC still image",
  heix: "an HEIF/HEIC still image",
  heim: "an HEIF/HEIC still image",
  heis: "an HEIF/HEIC still image",
  mif1: "an HEIF still image",
  msf1: "an HEIF image sequence",
  avif: "an AVIF still image",
  avis: "an AVIF image sequence",
  "M4A ": "an audio file (M4A)",
  "M4B ": "an audio book (M4B)",
  "M4P ": "a protected audio file (M4P)",
  "jp2 ": "a JPEG 2000 image",
  "jpx ": "a JPEG 2000 image",
  "crx ": "a camera raw image",
};

const ACCEPTED = "Cairn accepts raw H.264 streams, MP4/MOV and JPEG, recognised by their bytes (the file name's extension does not count)";

function ascii(head: Uint8Array, start: number, length: number): string {
  let out = "";
  for (let i = start; i < start + length && i < head.length; i++) out += String.fromCharCode(head[i]);
  return out;
}

function startsWith(head: Uint8Array, bytes: number[], at = 0): boolean {
  if (head.length < at + bytes.length) return false;
  return bytes.every((b, i) => head[at + i] === b);
}

/** Position just after the first start code, or -1 when the head does not open with one. */
function openingStartCode(head: Uint8Array): number {
  let i = 0;
  while (i < head.length && head[i] === 0) i++;
  // at least two zero bytes then 0x01 (leading_zero_8bits may add more zeros, Annex B.2)
  return i >= 2 && i < head.length && head[i] === 1 ? i + 1 : -1;
}

/** Walks the Annex B NAL units of the head and looks for a plausible SPS. */
function sniffAnnexB(head: Uint8Array, complete: boolean): SniffResult | null {
  const first = openingStartCode(head);
  if (first < 0) return null;
  const firstHeader = head[first];
  if (firstHeader === undefined) return { ok: false, reason: "it holds only a start code and no video" };
  if (firstHeader & 0x80) {
    // 00 00 01 BA / B3 / E0...: MPEG-1/2 systems or video start codes, not H.264 NAL units
    return { ok: false, reason: "it looks like an MPEG-1/MPEG-2 stream, not H.264" };
  }
  if (firstHeader === 0x40 && head[first + 1] === 0x01) {
    return { ok: false, reason: "it looks like a raw H.265 (HEVC) stream; Cairn accepts raw H.264 streams, or H.265 inside MP4/MOV" };
  }
  let pos = first;
  let sawNal = false;
  while (pos < head.length) {
    const header = head[pos];
    if (header & 0x80) return { ok: false, reason: "it starts like an H.264 stream but its NAL units are malformed (forbidden bit set) before any sequence parameter set" };
    const type = header & 0x1f;
    sawNal = true;
    if (type === NalType.Sps) {
      if (head.length < pos + 4) break; // SPS cut off by the end of the head: undecided, see below
      const refIdc = (header >> 5) & 0x03;
      const profile = head[pos + 1];
      const level = head[pos + 3];
      // 7.4.1: nal_ref_idc of an SPS is never 0; profile and level must be ones the standard defines
      if (refIdc !== 0 && PROFILES.has(profile) && LEVELS.has(level)) return { ok: true, kind: "raw_h264" };
      return { ok: false, reason: `it starts like an H.264 stream but its sequence parameter set is not valid (profile_idc ${profile}, level_idc ${level})` };
    }
    // next start code
    let next = -1;
    for (let i = pos + 1; i + 2 < head.length; i++) {
      if (head[i] === 0 && head[i + 1] === 0 && head[i + 2] === 1) {
        next = i + 3;
        break;
      }
    }
    if (next < 0) break;
    pos = next;
  }
  if (!sawNal) return { ok: false, reason: "it holds only a start code and no video" };
  const where = complete ? "anywhere in the file" : "in its first bytes";
  return { ok: false, reason: `it starts like an H.264 stream but carries no sequence parameter set (SPS) ${where}, so it cannot be decoded` };
}

function looksLikeText(head: Uint8Array): boolean {
  const sample = head.subarray(0, 4096);
  if (sample.length === 0) return false;
  let printable = 0;
  for (const b of sample) {
    if (b === 0) return false;
    if (b === 0x09 || b === 0x0a || b === 0x0d || (b >= 0x20 && b < 0x7f) || b >= 0x80) printable++;
  }
  return printable / sample.length > 0.97;
}

/** What a refused file appears to be, for the message; null when we cannot tell. */
function describeOther(head: Uint8Array): string | null {
  if (startsWith(head, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return "a PNG image";
  if (ascii(head, 0, 4) === "GIF8") return "a GIF image";
  if (startsWith(head, [0x49, 0x49, 0x2a, 0x00]) || startsWith(head, [0x4d, 0x4d, 0x00, 0x2a])) return "a TIFF or camera raw image";
  if (ascii(head, 0, 4) === "RIFF" && ascii(head, 8, 4) === "AVI ") return "an AVI file";
  if (ascii(head, 0, 4) === "RIFF" && ascii(head, 8, 4) === "WEBP") return "a WebP image";
  if (ascii(head, 0, 4) === "RIFF" && ascii(head, 8, 4) === "WAVE") return "a WAV audio file";
  if (startsWith(head, [0x1a, 0x45, 0xdf, 0xa3])) return "a Matroska/WebM file";
  if (head.length > 376 && head[0] === 0x47 && head[188] === 0x47 && head[376] === 0x47) return "an MPEG transport stream"; // 188-byte packets, sync byte 0x47
  if (ascii(head, 0, 4) === "PK\u0003\u0004") return "a ZIP archive";
  if (ascii(head, 0, 5) === "%PDF-") return "a PDF document";
  if (looksLikeText(head)) return "text";
  return null;
}

/**
 * @param head the first bytes of the file (SNIFF_BYTES, or the whole file when shorter)
 * @param complete true when `head` is the whole file
 */
export function sniffContent(head: Uint8Array, complete: boolean): SniffResult {
  if (head.length === 0) return { ok: false, reason: "it is empty" };

  if (startsWith(head, [0xff, 0xd8, 0xff])) return { ok: true, kind: "jpeg" };

  if (head.length >= 12 && ascii(head, 4, 4) === "ftyp") {
    const boxSize = ((head[0] << 24) | (head[1] << 16) | (head[2] << 8) | head[3]) >>> 0;
    // size 1 means a 64-bit largesize follows; otherwise the box holds at least type, major brand and minor version
    if (boxSize !== 1 && boxSize < 16) return { ok: false, reason: "it has an ISO BMFF `ftyp` box that is too short to be valid" };
    const brand = ascii(head, 8, 4);
    if (NON_VIDEO_BRANDS[brand]) return { ok: false, reason: `it is ${NON_VIDEO_BRANDS[brand]}, not a video` };
    return { ok: true, kind: brand === "qt  " ? "mov" : "mp4" };
  }

  const annexB = sniffAnnexB(head, complete);
  if (annexB) return annexB;

  const looks = describeOther(head);
  return { ok: false, reason: looks ? `it is ${looks}, not a recording` : "its bytes are not a format Cairn recognises" };
}

/** The sentence shown to the pilot: names the file and says why. */
export function refusalMessage(fileName: string, reason: string): string {
  return `“${fileName}” was not stored: ${reason}. ${ACCEPTED}.`;
}
