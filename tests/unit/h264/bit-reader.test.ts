import { describe, expect, it } from "vitest";
import { RbspBitReader, RbspOverrunError, RbspSyntaxError } from "@/lib/h264/bit-reader";

/** Packs a string of '0'/'1' into bytes (MSB first), zero-padded to a whole byte. */
function bits(s: string): Uint8Array {
  const clean = s.replace(/\s+/g, "");
  const out = new Uint8Array(Math.ceil(clean.length / 8));
  for (let i = 0; i < clean.length; i++) if (clean[i] === "1") out[i >> 3] |= 0x80 >>> (i & 7);
  return out;
}

describe("RbspBitReader Exp-Golomb", () => {
  // ITU-T H.264 section 9.1, Table 9-2: Exp-Golomb bit strings and codeNum in explicit form
  // (values recalled from memory; they follow from equation 9-2, codeNum = 2^leadingZeroBits - 1 + suffix).
  const table92: Array<[string, number]> = [
    ["1", 0],
    ["010", 1],
    ["011", 2],
    ["00100", 3],
    ["00101", 4],
    ["00110", 5],
    ["00111", 6],
    ["0001000", 7],
    ["0001001", 8],
    ["0001010", 9],
  ];
  it.each(table92)("ue(v) reads %s as codeNum %i", (bitString, codeNum) => {
    const r = new RbspBitReader(bits(bitString + "1"));
    expect(r.readUe()).toBe(codeNum);
    expect(r.bitPosition).toBe(bitString.length);
  });

  // Table 9-1 (prefix/suffix ranges): 0001 xxx covers 7..14, 00001 xxxx covers 15..30, 000001 xxxxx 31..62.
  it.each([
    ["0001111", 14],
    ["000010000", 15],
    ["000011111", 30],
    ["00000100000", 31],
    ["00000111111", 62],
  ] as Array<[string, number]>)("ue(v) range ends: %s -> %i", (bitString, codeNum) => {
    expect(new RbspBitReader(bits(bitString)).readUe()).toBe(codeNum);
  });

  // Table 9-3 (se(v)): codeNum k maps to (-1)^(k+1) * Ceil(k / 2): 0, 1, -1, 2, -2, 3, -3.
  it.each([
    ["1", 0],
    ["010", 1],
    ["011", -1],
    ["00100", 2],
    ["00101", -2],
    ["00110", 3],
    ["00111", -3],
  ] as Array<[string, number]>)("se(v) reads %s as %i", (bitString, value) => {
    expect(new RbspBitReader(bits(bitString)).readSe()).toBe(value);
  });

  it("reads a sequence of codes back to back", () => {
    const r = new RbspBitReader(bits("1 010 011 00100 0001000 1"));
    expect([r.readUe(), r.readUe(), r.readUe(), r.readUe(), r.readUe(), r.readBit()]).toEqual([0, 1, 2, 3, 7, 1]);
  });

  it("reads the largest 32-bit code (2^32 - 2 with 31 leading zeros)", () => {
    const r = new RbspBitReader(bits("0".repeat(31) + "1" + "1".repeat(31)));
    expect(r.readUe()).toBe(2 ** 32 - 2);
  });

  it("refuses a code with more than 32 leading zeros", () => {
    const r = new RbspBitReader(new Uint8Array(8));
    expect(() => r.readUe()).toThrow(RbspSyntaxError);
  });

  it("throws when a code runs past the end", () => {
    // 7 leading zeros need 7 suffix bits after the 1; the byte ends first.
    const r = new RbspBitReader(bits("00000001"));
    expect(() => r.readUe()).toThrow(RbspOverrunError);
  });
});

describe("RbspBitReader fixed-length reads", () => {
  it("reads u(n) across byte boundaries, MSB first", () => {
    const r = new RbspBitReader(Uint8Array.from([0b10110011, 0b01010101, 0xff, 0x00, 0x80, 0x00]));
    expect(r.readBits(3)).toBe(0b101);
    expect(r.readBits(7)).toBe(0b1001101);
    expect(r.readBits(6)).toBe(0b010101);
    expect(r.readBits(32)).toBe(0xff008000 >>> 0);
  });

  it("returns 32-bit values without turning them negative", () => {
    expect(new RbspBitReader(Uint8Array.from([0xff, 0xff, 0xff, 0xff])).readBits(32)).toBe(4294967295);
  });

  it("stops at the declared length", () => {
    const r = new RbspBitReader(Uint8Array.from([0xaa, 0xbb]), 1);
    expect(r.readBits(8)).toBe(0xaa);
    expect(() => r.readBit()).toThrow(RbspOverrunError);
  });

  it("more_rbsp_data() is false only at the rbsp_stop_one_bit (section 7.2)", () => {
    // payload bits 1 0 1, then stop bit 1 and alignment zeros: 1011 0000
    const r = new RbspBitReader(Uint8Array.from([0b10110000]));
    expect(r.moreRbspData()).toBe(true);
    r.readBits(3);
    expect(r.moreRbspData()).toBe(false);
  });

  it("more_rbsp_data() ignores trailing zero bytes (cabac_zero_words)", () => {
    const r = new RbspBitReader(Uint8Array.from([0b11000000, 0x00, 0x00]));
    r.readBit();
    expect(r.moreRbspData()).toBe(false);
  });
});
