// Streaming splitter for ITU-T H.264 Annex B byte streams: finds start codes (0x000001, or 0x00000001
// with its zero_byte) across chunk boundaries and hands out NAL units with their byte offsets.
// Only a bounded prefix of each NAL unit is kept, so a multi-gigabyte file is scanned in constant memory.

export interface NalUnit {
  /** Byte offset in the stream of the NAL unit's first byte (its header byte). */
  offset: number;
  /** Byte offset of the start code in front of it (of the zero_byte for a 4-byte start code). */
  startCodeOffset: number;
  startCodeLength: 3 | 4;
  /** NAL unit size in bytes, header included; start code and trailing zero bytes excluded. */
  size: number;
  forbiddenZeroBit: number;
  nalRefIdc: number;
  nalUnitType: number;
  /** The first min(size, prefixBytes) bytes of the NAL unit, header byte first (a private copy). */
  prefix: Uint8Array;
}

export interface ScanOptions {
  /** Bytes of each NAL unit to keep (headers live at the front). Default 512. */
  prefixBytes?: number;
}

export interface ScanStats {
  /** Bytes before the first start code (Annex B allows only zero bytes there). */
  leadingBytes: number;
  /** Start codes immediately followed by another start code. */
  emptyNalUnits: number;
  totalBytes: number;
}

const DEFAULT_PREFIX_BYTES = 512;
const START_CODE = Buffer.from([0, 0, 1]);

function asBuffer(chunk: Uint8Array): Buffer {
  return Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength);
}

/**
 * Push-style splitter: feed chunks of any size with push(), then call end(). NAL units are emitted as
 * soon as the start code that ends them is seen.
 */
export class AnnexBSplitter {
  private readonly prefixCapacity: number;
  private position = 0; // stream offset of the next byte pushed
  private carriedZeros = 0; // zero bytes at the end of everything pushed so far (after the last 0x01 of a start code)
  private inNal = false;
  private nalOffset = 0;
  private startCodeOffset = 0;
  private startCodeLength: 3 | 4 = 3;
  private prefix: Uint8Array;
  private prefixLength = 0;
  readonly stats: ScanStats = { leadingBytes: 0, emptyNalUnits: 0, totalBytes: 0 };

  constructor(options: ScanOptions = {}) {
    this.prefixCapacity = Math.max(1, options.prefixBytes ?? DEFAULT_PREFIX_BYTES);
    this.prefix = new Uint8Array(this.prefixCapacity);
  }

  push(input: Uint8Array, emit: (nal: NalUnit) => void): void {
    const chunk = asBuffer(input);
    const len = chunk.length;
    if (len === 0) return;
    let i = 0;
    for (;;) {
      const one = this.findStartCodeOne(chunk, i);
      if (one < 0) break;
      // Zero bytes in front of the 0x01: two belong to the start code, a third is its zero_byte,
      // any further ones are trailing_zero_8bits of the previous NAL unit.
      let zeros = 0;
      let k = one - 1;
      while (k >= i && chunk[k] === 0) {
        zeros++;
        k--;
      }
      if (k < i && i === 0) zeros += this.carriedZeros;
      const startCodeAt = this.position + one - 2 - (zeros >= 3 ? 1 : 0);
      const nalEnd = this.position + one - zeros;
      if (this.inNal) {
        this.appendToPrefix(chunk, i, Math.max(i, one - zeros));
        this.emitCurrent(nalEnd, emit);
      } else {
        this.stats.leadingBytes = startCodeAt;
      }
      this.inNal = true;
      this.startCodeOffset = startCodeAt;
      this.startCodeLength = zeros >= 3 ? 4 : 3;
      this.nalOffset = this.position + one + 1;
      this.prefixLength = 0;
      this.carriedZeros = 0;
      i = one + 1;
    }
    if (this.inNal) this.appendToPrefix(chunk, i, len);
    let trailing = 0;
    let k = len - 1;
    while (k >= i && chunk[k] === 0) {
      trailing++;
      k--;
    }
    this.carriedZeros = k < i && i === 0 ? this.carriedZeros + trailing : trailing;
    this.position += len;
    this.stats.totalBytes = this.position;
    if (!this.inNal) this.stats.leadingBytes = this.position;
  }

  /** Flushes the last NAL unit. Trailing zero bytes at the end of the stream are not part of it. */
  end(emit: (nal: NalUnit) => void): void {
    if (this.inNal) this.emitCurrent(this.position - this.carriedZeros, emit);
    this.inNal = false;
  }

  /** Index in `chunk` of the 0x01 byte of the next start code at or after `from`, or -1. */
  private findStartCodeOne(chunk: Buffer, from: number): number {
    if (from === 0 && this.carriedZeros > 0) {
      // Start codes that began in an earlier chunk.
      if (this.carriedZeros >= 2 && chunk[0] === 1) return 0;
      if (chunk.length >= 2 && chunk[0] === 0 && chunk[1] === 1) return 1;
    }
    const at = chunk.indexOf(START_CODE, from);
    return at < 0 ? -1 : at + 2;
  }

  private appendToPrefix(chunk: Buffer, start: number, end: number): void {
    const room = this.prefixCapacity - this.prefixLength;
    if (room <= 0 || end <= start) return;
    const take = Math.min(room, end - start);
    this.prefix.set(chunk.subarray(start, start + take), this.prefixLength);
    this.prefixLength += take;
  }

  private emitCurrent(nalEnd: number, emit: (nal: NalUnit) => void): void {
    const size = nalEnd - this.nalOffset;
    if (size <= 0) {
      this.stats.emptyNalUnits++;
      return;
    }
    // The prefix may hold zero bytes that turned out to be the next start code: trim to the NAL size.
    const keep = Math.min(this.prefixLength, size);
    const prefix = new Uint8Array(keep);
    prefix.set(this.prefix.subarray(0, keep));
    const header = prefix[0];
    emit({
      offset: this.nalOffset,
      startCodeOffset: this.startCodeOffset,
      startCodeLength: this.startCodeLength,
      size,
      forbiddenZeroBit: header >>> 7,
      nalRefIdc: (header >>> 5) & 0x03,
      nalUnitType: header & 0x1f,
      prefix,
    });
  }
}

/** Async generator over a Node Readable (or any async iterable of byte chunks), one NAL unit at a time. */
export async function* scanAnnexB(
  source: AsyncIterable<Uint8Array>,
  options: ScanOptions = {},
): AsyncGenerator<NalUnit, ScanStats, undefined> {
  const splitter = new AnnexBSplitter(options);
  const ready: NalUnit[] = [];
  const collect = (nal: NalUnit) => {
    ready.push(nal);
  };
  for await (const chunk of source) {
    splitter.push(chunk, collect);
    for (let n = 0; n < ready.length; n++) yield ready[n];
    ready.length = 0;
  }
  splitter.end(collect);
  for (let n = 0; n < ready.length; n++) yield ready[n];
  return splitter.stats;
}
