// Damage applied to a generated demo stream, the way a fading radio link damages a controller's
// recording: pictures that never arrived are cut out whole, pictures that arrived scrambled keep their
// slice header and get noise in their slice data. Access units are found by lib/h264's own stream
// parser (their byte offsets in the signal trace). Frame numbers are the clean stream's 0-based
// decoding-order indexes.
import { readFile, writeFile } from "node:fs/promises";
import { probeH264File } from "@/lib/h264/probe-stream";

export interface DemoDamage {
  /** Pictures lost on the link. */
  remove: number[];
  /** Pictures whose slices arrived scrambled (IDR or P). */
  scramble: number[];
}

export const frames = (from: number, to: number): number[] => Array.from({ length: to - from }, (_, i) => from + i);

function firstSliceHeader(data: Buffer, from: number, to: number): number | null {
  for (let i = from; i + 3 < to; i++) {
    if (data[i] === 0 && data[i + 1] === 0 && data[i + 2] === 1) {
      const type = data[i + 3] & 0x1f;
      if (type === 1 || type === 5) return i + 3;
    }
  }
  return null;
}

export async function damageDemoStream(clean: string, out: string, damage: DemoDamage): Promise<void> {
  const data = await readFile(clean);
  const { trace } = await probeH264File(clean);
  const starts = Array.from(trace.offsets);
  const removed = new Set(damage.remove);
  const scrambled = new Set(damage.scramble);
  const parts: Buffer[] = [data.subarray(0, starts[0])];
  starts.forEach((start, n) => {
    const end = n + 1 < starts.length ? starts[n + 1] : data.length;
    if (removed.has(n)) return;
    const bytes = Buffer.from(data.subarray(start, end));
    const header = scrambled.has(n) ? firstSliceHeader(data, start, end) : null;
    if (header !== null) {
      // the slice header stays readable; noise without zero bytes (no start code) after it
      const from = header - start + 8;
      scrambleFrom(bytes, from, n);
    }
    parts.push(bytes);
  });
  await writeFile(out, Buffer.concat(parts));
}

/**
 * Overwrites a stretch of a NAL unit, from byte `from` to about half of what follows, with
 * pseudo-random bytes that are never zero, so no start code can appear in them; the seed is fixed
 * (salted with `salt`), so the same stream is damaged the same way every run.
 */
export function scrambleFrom(bytes: Buffer, from: number, salt: number): void {
  const to = Math.min(bytes.length - 2, from + Math.max(16, Math.floor((bytes.length - from) / 2)));
  let seed = 0x9e3779b9 ^ salt;
  for (let i = from; i < to; i++) {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    bytes[i] = 1 + ((seed >>> 16) % 255);
  }
}
