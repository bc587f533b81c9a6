// What an original really is, from its first bytes, so a file named ".mp4" that holds a raw H.264
// stream (or the reverse) still takes the right path. Signatures: Annex B start code 00 00 01 /
// 00 00 00 01 (ITU-T H.264 Annex B); ISO BMFF box types at offset 4 (ISO/IEC 14496-12 section 4.2:
// size then type); JPEG SOI FF D8 FF (ITU-T T.81 Annex B).
import type { Recording } from "@/db/schema/types";

export type MediaKind = Recording["kind"];

const BOX_TYPES = new Set(["ftyp", "moov", "mdat", "free", "wide", "skip", "pnot"]);

export function detectMediaKind(head: Uint8Array, declared: MediaKind): MediaKind {
  if (head.length >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return "jpeg";
  if (head.length >= 8) {
    const type = String.fromCharCode(head[4], head[5], head[6], head[7]);
    if (BOX_TYPES.has(type)) {
      // QuickTime brand "qt  " in the ftyp box; everything else in the family is played as MP4.
      const brand = head.length >= 12 ? String.fromCharCode(head[8], head[9], head[10], head[11]) : "";
      return type === "ftyp" && brand === "qt  " ? "mov" : declared === "mov" ? "mov" : "mp4";
    }
  }
  // Annex B allows leading zero bytes before the first start code.
  let i = 0;
  while (i < head.length && head[i] === 0) i++;
  if (i >= 2 && i < head.length && head[i] === 1) return "raw_h264";
  return declared;
}
