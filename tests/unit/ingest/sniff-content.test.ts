// Content check by bytes on hand-built byte layouts taken from the standards (ITU-T H.264 Annex B
// and Table 7-1, ISO/IEC 14496-12 FileTypeBox, the PNG/ZIP/MPEG signatures). Files made by ffmpeg
// and identified by ffprobe are checked in tests/integration/ingest/sniff-content-media.test.ts.
import { describe, expect, it } from "vitest";
import { refusalMessage, sniffContent } from "@/lib/uploads/sniff-content";

describe("byte layouts", () => {
  const enc = (s: string) => new TextEncoder().encode(s);
  const bytes = (...b: number[]) => new Uint8Array(b);
  // ISO/IEC 14496-12 4.3: FileTypeBox = size(4) "ftyp" major_brand(4) minor_version(4) compatible_brands
  const ftyp = (brand: string) => new Uint8Array([0, 0, 0, 20, ...enc("ftyp"), ...enc(brand), 0, 0, 0, 0, ...enc("mif1")]);

  const cases: [string, Uint8Array, boolean, RegExp][] = [
    ["empty", new Uint8Array(0), true, /empty/],
    ["text named .264", enc("flight notes: link faded behind the tower\n"), true, /is text/],
    ["only a start code", bytes(0, 0, 0, 1), true, /only a start code/],
    ["start code, then NAL units without an SPS", bytes(0, 0, 1, 0x41, 0x9a, 0x00, 0x00, 0x01, 0x41, 0x9b), true, /no sequence parameter set/],
    // SPS header 0x67 then profile_idc 0: no such profile in 7.4.2.1.1
    ["an SPS with an unknown profile", bytes(0, 0, 0, 1, 0x67, 0x00, 0x00, 0x1e, 0xff), true, /not valid \(profile_idc 0/],
    // nal_ref_idc 0 on an SPS is forbidden (7.4.1)
    ["an SPS with nal_ref_idc 0", bytes(0, 0, 0, 1, 0x07, 0x42, 0xc0, 0x1e, 0xff), true, /not valid/],
    ["MPEG program stream pack header", bytes(0, 0, 1, 0xba, 0x44, 0, 4, 0, 4, 1), true, /MPEG-1\/MPEG-2/],
    ["HEIC still in an ISO BMFF box", ftyp("heic"), true, /HEIF\/HEIC still image/],
    ["audio-only M4A", ftyp("M4A "), true, /audio file/],
    ["a ftyp box too short to be valid", bytes(0, 0, 0, 8, ...enc("ftyp"), ...enc("isom")), true, /too short/],
    ["ZIP archive", bytes(0x50, 0x4b, 3, 4, 20, 0, 0, 0), true, /ZIP archive/],
    ["unknown binary", bytes(0x13, 0x37, 0x00, 0xfe, 0x01, 0x02), true, /not a format Cairn recognises/],
  ];
  const accepted: [string, Uint8Array, string][] = [
    // Annex B: 4-byte start code, SPS header 0x67 (nal_ref_idc 3, type 7), profile_idc 66 (Baseline), level_idc 30
    ["raw H.264 opening with its SPS", bytes(0, 0, 0, 1, 0x67, 0x42, 0xc0, 0x1e, 0xda, 0x02), "raw_h264"],
    // B.2: leading_zero_8bits may precede the first start code; an AUD (type 9) may come before the SPS
    ["raw H.264 with leading zeros and an AUD", bytes(0, 0, 0, 0, 0, 1, 0x09, 0xf0, 0, 0, 1, 0x67, 0x64, 0x00, 0x1f, 0xac), "raw_h264"],
    ["MP4 (major brand isom)", ftyp("isom"), "mp4"],
    ["QuickTime (major brand qt)", ftyp("qt  "), "mov"],
    // ITU-T T.81 B.2.1: SOI (FF D8) then the next marker's FF
    ["JPEG", bytes(0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46), "jpeg"],
  ];
  it.each(accepted)("accepts %s", (_label, data, kind) => {
    expect(sniffContent(data, true)).toEqual({ ok: true, kind });
  });

  it.each(cases)("%s", (_label, data, complete, reason) => {
    const r = sniffContent(data, complete);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(reason);
  });

  it("an SPS cut off by the end of the head is not guessed at", () => {
    const r = sniffContent(new Uint8Array([0, 0, 1, 0x67, 0x42]), false);
    expect(r.ok).toBe(false);
  });

  it("the message names the file, the reason and what is accepted", () => {
    expect(refusalMessage("notes.264", "it is text, not a recording")).toBe(
      "“notes.264” was not stored: it is text, not a recording. Cairn accepts raw H.264 streams, MP4/MOV and JPEG, recognised by their bytes (the file name's extension does not count).",
    );
  });
});
