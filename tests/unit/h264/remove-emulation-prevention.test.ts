import { describe, expect, it } from "vitest";
import { removeEmulationPrevention } from "@/lib/h264/remove-emulation-prevention";

const hex = (s: string) => Uint8Array.from(Buffer.from(s.replace(/\s+/g, ""), "hex"));
const toHex = (u: Uint8Array) => Buffer.from(u).toString("hex");

describe("removeEmulationPrevention (ITU-T H.264 7.4.1.1)", () => {
  // 7.4.1.1: within a NAL unit the byte sequences 0x000000, 0x000001, 0x000002 and 0x000003 are
  // written as 0x00000300, 0x00000301, 0x00000302 and 0x00000303.
  it.each([
    ["00000300", "000000"],
    ["00000301", "000001"],
    ["00000302", "000002"],
    ["00000303", "000003"],
  ])("%s -> %s", (escaped, rbsp) => {
    expect(toHex(removeEmulationPrevention(hex(`65 ${escaped} 80`)))).toBe(`65${rbsp}80`);
  });

  it("handles escapes back to back (00 00 03 00 00 03)", () => {
    expect(toHex(removeEmulationPrevention(hex("67 00 00 03 00 00 03 01")))).toBe("670000000001");
  });

  it("drops a final 0x03 after cabac_zero_word bytes (7.3.1: next_bits(24) == 0x000003 at the end)", () => {
    expect(toHex(removeEmulationPrevention(hex("65 88 00 00 03")))).toBe("65880000");
  });

  it("keeps 0x03 that is not preceded by two zero bytes", () => {
    expect(toHex(removeEmulationPrevention(hex("65 00 03 00 01 03 03")))).toBe("65000300010303");
  });

  it("returns the input itself when there is nothing to remove", () => {
    const input = hex("67 42 c0 15 d9");
    expect(removeEmulationPrevention(input)).toBe(input);
  });

  it("recovers the SPS that ffmpeg's trace_headers decodes (x264 1920x1080 SPS with three escapes)", () => {
    // Bytes of an SPS written by libx264 (Debian ffmpeg 5.1); ffmpeg trace_headers reads
    // num_units_in_tick = 1 and time_scale = 60 from the bits these escapes protect.
    const nal = hex("6742c028da01e0089f970110000003001000000303c0f1832a");
    expect(toHex(removeEmulationPrevention(nal))).toBe("6742c028da01e0089f97011000000010000003c0f1832a");
  });

  // Round trip against an escaper written from the 7.4.1.1 rule: after two zero bytes, any byte
  // 0x00..0x03 gets a 0x03 in front of it.
  it("undoes the encoder-side escaping of random payloads", () => {
    let seed = 12345;
    const rand = () => (seed = (seed * 1103515245 + 12345) >>> 0) >>> 24;
    for (let trial = 0; trial < 200; trial++) {
      const rbsp: number[] = [0x41];
      for (let i = 0; i < 300; i++) rbsp.push(rand() < 128 ? 0 : rand() & 3);
      rbsp.push(0x80);
      const escaped: number[] = [];
      let zeros = 0;
      for (const b of rbsp) {
        if (zeros >= 2 && b <= 3) {
          escaped.push(3);
          zeros = 0;
        }
        escaped.push(b);
        zeros = b === 0 ? zeros + 1 : 0;
      }
      expect(Array.from(removeEmulationPrevention(Uint8Array.from(escaped)))).toEqual(rbsp);
    }
  });
});
