// File signatures: Annex B start codes (ITU-T H.264 Annex B.1: zero_byte + start_code_prefix_one_3bytes,
// leading_zero_8bits allowed before the first), ISO BMFF boxes (ISO/IEC 14496-12 4.2: 32-bit size, then
// the 4-character type; 'ftyp' major brand 'qt  ' for QuickTime files, Apple QuickTime File Format
// specification), JPEG SOI marker FF D8 followed by a marker FF xx (ITU-T T.81 B.1.1.3).
import { describe, expect, it } from "vitest";
import { detectMediaKind } from "@/lib/processing/detect-media-kind";

const bytes = (...parts: Array<number[] | string>) =>
  Uint8Array.from(parts.flatMap((p) => (typeof p === "string" ? [...p].map((c) => c.charCodeAt(0)) : p)));

describe("detectMediaKind", () => {
  it.each([
    ["4-byte start code + SPS", bytes([0, 0, 0, 1, 0x67, 0x42]), "mp4", "raw_h264"],
    ["3-byte start code", bytes([0, 0, 1, 0x09, 0xf0]), "mp4", "raw_h264"],
    ["leading zero bytes", bytes([0, 0, 0, 0, 0, 1, 0x67]), "jpeg", "raw_h264"],
    ["ftyp isom", bytes([0, 0, 0, 0x20], "ftypisom", [0, 0, 2, 0]), "raw_h264", "mp4"],
    ["ftyp qt", bytes([0, 0, 0, 0x14], "ftypqt  ", [0, 0, 0, 0]), "mp4", "mov"],
    ["mdat first (old QuickTime)", bytes([0, 0, 0, 8], "mdat"), "mov", "mov"],
    ["moov first", bytes([0, 0, 0, 8], "moov"), "raw_h264", "mp4"],
    ["JPEG/JFIF", bytes([0xff, 0xd8, 0xff, 0xe0, 0, 0x10], "JFIF"), "raw_h264", "jpeg"],
  ] as const)("%s", (_label, head, declared, expected) => {
    expect(detectMediaKind(head, declared)).toBe(expected);
  });

  it("keeps the declared kind when the bytes say nothing known", () => {
    expect(detectMediaKind(bytes("hello world, not a video"), "mp4")).toBe("mp4");
    expect(detectMediaKind(new Uint8Array(0), "raw_h264")).toBe("raw_h264");
    // one zero then 01 is not a start code (needs two zeros)
    expect(detectMediaKind(bytes([0, 1, 0x67]), "mov")).toBe("mov");
  });
});
