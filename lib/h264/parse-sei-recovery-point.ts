// Finds the recovery point SEI message (payloadType 6, ITU-T H.264 D.1.8 / D.2.8) in an SEI NAL unit.
// A recovery point tells a decoder that starts (or restarts after damage) at this picture that output
// is correct again after recovery_frame_cnt frames: intra refresh streams have no IDR to recover at.

import { RbspBitReader } from "./bit-reader";

export interface RecoveryPoint {
  recoveryFrameCnt: number;
  exactMatch: boolean;
  brokenLink: boolean;
}

const RECOVERY_POINT_PAYLOAD = 6;

/**
 * Walks the sei_message() list of section 7.3.2.3.1. `rbsp` is the SEI NAL unit without emulation
 * prevention bytes, header byte included; it may be only the front of the NAL unit, in which case a
 * message cut off at the end is not read. Returns null when no recovery point is found.
 */
export function parseSeiRecoveryPoint(rbsp: Uint8Array): RecoveryPoint | null {
  let pos = 1;
  const end = rbsp.length;
  // A message needs at least two header bytes; a lone 0x80 is rbsp_trailing_bits.
  while (pos + 2 <= end) {
    let payloadType = 0;
    while (pos < end && rbsp[pos] === 0xff) {
      payloadType += 255;
      pos++;
    }
    if (pos >= end) return null;
    payloadType += rbsp[pos++];
    let payloadSize = 0;
    while (pos < end && rbsp[pos] === 0xff) {
      payloadSize += 255;
      pos++;
    }
    if (pos >= end) return null;
    payloadSize += rbsp[pos++];
    if (pos + payloadSize > end) return null;
    if (payloadType === RECOVERY_POINT_PAYLOAD) {
      try {
        const r = new RbspBitReader(rbsp.subarray(pos, pos + payloadSize));
        const recoveryFrameCnt = r.readUe();
        const exactMatch = r.readFlag();
        const brokenLink = r.readFlag();
        return { recoveryFrameCnt, exactMatch, brokenLink };
      } catch {
        return null;
      }
    }
    pos += payloadSize;
  }
  return null;
}
