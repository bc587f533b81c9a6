// Damage applied to a raw H.264 stream in Node, at access units found by ffprobe's packet positions
// (ffmpeg's own H.264 parser: a splitter independent of lib/h264). Frame numbers are the clean
// stream's 0-based decoding-order indexes (no B-frames: also display order).
import { scrambleFrom } from "@/db/seed/damage-demo-stream";
import { readFile, writeFile } from "node:fs/promises";
import { runTool } from "./make-h264";

export interface StreamDamage {
  /** Access units cut out whole: frames that never reached the recorder. */
  remove?: number[];
  /** Access units whose slice data is overwritten after the slice header (IDR or P alike). */
  scramble?: number[];
  /** Bytes of garbage (no start code in them) inserted before these access units. */
  garbageBefore?: number[];
  /** Keep only the first `truncateAt` bytes of the result. */
  truncateAt?: number;
  /** Drop everything before this access unit (e.g. a stream that starts without its SPS). */
  startAt?: number;
}

export const range = (from: number, to: number): number[] => Array.from({ length: to - from }, (_, i) => from + i);

/** Byte ranges [start, end) of each access unit of `file`, from ffprobe's packets. */
export async function accessUnitRanges(file: string): Promise<Array<[number, number]>> {
  const { stdout } = await runTool("ffprobe", ["-v", "error", "-f", "h264", "-show_entries", "packet=pos", "-of", "csv=p=0", file]);
  const positions = stdout.split("\n").map((l) => l.trim()).filter(Boolean).map(Number);
  const size = (await readFile(file)).length;
  return positions.map((pos, i) => [pos, i + 1 < positions.length ? positions[i + 1] : size]);
}

/** First slice NAL unit (type 1 or 5) header offset inside [from, to). */
function sliceHeaderAt(data: Buffer, from: number, to: number): number {
  for (let i = from; i + 3 < to; i++) {
    if (data[i] === 0 && data[i + 1] === 0 && data[i + 2] === 1) {
      const type = data[i + 3] & 0x1f;
      if (type === 1 || type === 5) return i + 3;
    }
  }
  throw new Error(`no slice in bytes ${from}..${to}`);
}

export async function damageH264(clean: string, out: string, damage: StreamDamage): Promise<string> {
  const data = Buffer.from(await readFile(clean));
  const units = await accessUnitRanges(clean);
  const removed = new Set(damage.remove ?? []);
  const scrambled = new Set(damage.scramble ?? []);
  const garbage = new Set(damage.garbageBefore ?? []);
  const parts: Buffer[] = [];
  units.forEach(([start, end], n) => {
    if (damage.startAt !== undefined && n < damage.startAt) return;
    if (garbage.has(n)) {
      let seed = 0x2545f491 ^ n;
      const junk = Buffer.alloc(97);
      for (let i = 0; i < junk.length; i++) {
        seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
        junk[i] = 1 + ((seed >>> 16) % 255); // never 0: no start code can appear
      }
      parts.push(junk);
    }
    if (removed.has(n)) return;
    const bytes = Buffer.from(data.subarray(start, end));
    if (scrambled.has(n)) {
      // The slice header stays readable (the picture is still seen); the data after it is noise.
      const from = sliceHeaderAt(data, start, end) - start + 8;
      scrambleFrom(bytes, from, n);
    }
    parts.push(bytes);
  });
  let result = Buffer.concat(parts);
  if (damage.truncateAt !== undefined) result = result.subarray(0, damage.truncateAt);
  await writeFile(out, result);
  return out;
}
