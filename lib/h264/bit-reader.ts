// Reads RBSP bits MSB-first as ITU-T H.264 section 7.2 defines u(n), ue(v) and se(v)
// (Exp-Golomb, section 9.1). The input must already be free of emulation prevention bytes.

export class RbspOverrunError extends Error {
  constructor(message = "read past the end of the RBSP") {
    super(message);
    this.name = "RbspOverrunError";
  }
}

export class RbspSyntaxError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "RbspSyntaxError";
  }
}

// H.264 never codes an Exp-Golomb value needing more than 32 leading zeros (values fit in 32 bits);
// more than that means the bits are not a valid code, usually a corrupt slice.
const MAX_LEADING_ZEROS = 32;

export class RbspBitReader {
  private readonly data: Uint8Array;
  private readonly bitLength: number;
  private pos = 0;

  constructor(data: Uint8Array, byteLength = data.length) {
    this.data = data;
    this.bitLength = Math.min(byteLength, data.length) * 8;
  }

  get bitPosition(): number {
    return this.pos;
  }

  get bitsLeft(): number {
    return this.bitLength - this.pos;
  }

  get byteAligned(): boolean {
    return (this.pos & 7) === 0;
  }

  readBit(): number {
    if (this.pos >= this.bitLength) throw new RbspOverrunError();
    const bit = (this.data[this.pos >>> 3] >>> (7 - (this.pos & 7))) & 1;
    this.pos++;
    return bit;
  }

  readFlag(): boolean {
    return this.readBit() === 1;
  }

  /** u(n) for 0 <= n <= 32; returns an unsigned value (never negative, even for n = 32). */
  readBits(n: number): number {
    if (n < 0 || n > 32) throw new RangeError(`readBits(${n}): n must be 0..32`);
    if (this.pos + n > this.bitLength) throw new RbspOverrunError();
    let result = 0;
    let remaining = n;
    // Take as many bits as the current byte offers per step instead of one bit at a time.
    while (remaining > 0) {
      const bitInByte = this.pos & 7;
      const available = 8 - bitInByte;
      const take = available < remaining ? available : remaining;
      const bits = (this.data[this.pos >>> 3] >>> (available - take)) & ((1 << take) - 1);
      // Multiplication instead of << keeps 32-bit values positive.
      result = result * (1 << take) + bits;
      this.pos += take;
      remaining -= take;
    }
    return result;
  }

  skipBits(n: number): void {
    if (n < 0) throw new RangeError("skipBits: negative count");
    if (this.pos + n > this.bitLength) throw new RbspOverrunError();
    this.pos += n;
  }

  /** ue(v), section 9.1: codeNum = 2^leadingZeroBits - 1 + read_bits(leadingZeroBits). */
  readUe(): number {
    let leadingZeros = 0;
    while (this.readBit() === 0) {
      leadingZeros++;
      if (leadingZeros > MAX_LEADING_ZEROS) throw new RbspSyntaxError("Exp-Golomb code longer than 32 leading zeros");
    }
    if (leadingZeros === 0) return 0;
    return 2 ** leadingZeros - 1 + this.readBits(leadingZeros);
  }

  /** se(v), section 9.1.1 / Table 9-3: codeNum k maps to (-1)^(k+1) * Ceil(k / 2). */
  readSe(): number {
    const k = this.readUe();
    if (k === 0) return 0; // not -0
    return k % 2 === 1 ? (k + 1) / 2 : -(k / 2);
  }

  /**
   * more_rbsp_data() (section 7.2): true while bits remain before the rbsp_stop_one_bit.
   * Only meaningful when the reader holds the complete RBSP of a NAL unit.
   */
  moreRbspData(): boolean {
    if (this.pos >= this.bitLength) return false;
    const stopBit = this.stopBitPosition();
    return stopBit >= 0 && this.pos < stopBit;
  }

  private stopBitPosition(): number {
    let byteIndex = (this.bitLength >>> 3) - 1;
    while (byteIndex >= 0 && this.data[byteIndex] === 0) byteIndex--;
    if (byteIndex < 0) return -1;
    const byte = this.data[byteIndex];
    let lowest = 0;
    while (((byte >>> lowest) & 1) === 0) lowest++;
    return byteIndex * 8 + (7 - lowest);
  }
}
