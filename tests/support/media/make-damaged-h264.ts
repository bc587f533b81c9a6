// Damaged raw H.264 for tests: a clean counter stream (make-processed-recording.ts, the 0-based frame
// number burned in) with whole pictures cut out and slice data scrambled at chosen frames, in Node.
// Pictures are found by their NAL unit headers (ITU-T H.264 Annex B start codes; nal_unit_type 1 and 5
// are coded slices, 6-9 are SEI/SPS/PPS/AUD and belong to the next picture). x264 writes one slice per
// picture by default, so slice n is picture n in decoding order (no B-frames: also display order).
import { scrambleFrom } from "@/db/seed/damage-demo-stream";
import { readFile, writeFile } from "node:fs/promises";
import path from "node:path";
import { MEDIA_CACHE_DIR } from "./make-h264";

type Nal = { start: number; end: number; type: number; header: number };

/** NAL units of an Annex B stream: [start, end) covers the start code and the payload. */
export function splitNalUnits(data: Buffer): Nal[] {
  const starts: Array<{ at: number; header: number }> = [];
  for (let i = 0; i + 3 < data.length; i++) {
    if (data[i] === 0 && data[i + 1] === 0 && data[i + 2] === 1) {
      const at = i > 0 && data[i - 1] === 0 ? i - 1 : i;
      starts.push({ at, header: i + 3 });
      i += 2;
    }
  }
  return starts.map((s, n) => ({ start: s.at, end: n + 1 < starts.length ? starts[n + 1].at : data.length, type: data[s.header] & 0x1f, header: s.header }));
}

/** Byte ranges of each picture: its slice plus the parameter sets and SEI in front of it. */
export function pictureRanges(data: Buffer): Array<{ start: number; end: number; sliceHeader: number; idr: boolean }> {
  const out: Array<{ start: number; end: number; sliceHeader: number; idr: boolean }> = [];
  let pendingStart: number | null = null;
  for (const nal of splitNalUnits(data)) {
    if (nal.type === 1 || nal.type === 5) {
      out.push({ start: pendingStart ?? nal.start, end: nal.end, sliceHeader: nal.header, idr: nal.type === 5 });
      pendingStart = null;
    } else if (pendingStart === null) {
      pendingStart = nal.start;
    }
  }
  return out;
}

export type Damage = {
  /** Pictures (0-based, decoding order of the clean stream; not 0) cut out whole: they never reached the recorder. */
  remove: number[];
  /** Pictures whose slice data is overwritten in the middle (the header stays readable). */
  scramble: number[];
};

/** Writes the clean stream with `damage` applied and returns its path (cached by name). */
export async function makeDamagedH264(cleanPath: string, damage: Damage, name: string): Promise<string> {
  const data = await readFile(cleanPath);
  const pictures = pictureRanges(data);
  for (const n of [...damage.remove, ...damage.scramble]) {
    if (n <= 0 || n >= pictures.length) throw new Error(`picture ${n} is not in the stream (${pictures.length} pictures)`);
    // picture 0 (refused above) carries the stream's first parameter sets; a later IDR may go, as a
    // whole lost group of pictures does
    if (pictures[n].idr && damage.scramble.includes(n)) throw new Error(`picture ${n} is an IDR picture; scramble P pictures only`);
  }
  const removed = new Set(damage.remove);
  const scrambled = new Set(damage.scramble);
  const parts: Buffer[] = [data.subarray(0, pictures[0].start)];
  pictures.forEach((p, n) => {
    if (removed.has(n)) return;
    const bytes = Buffer.from(data.subarray(p.start, p.end));
    if (scrambled.has(n)) {
      // keep the first bytes of the slice (its header, so the picture is still seen), overwrite a
      // stretch of the data after it with pseudo-random bytes that are never zero, so no start code
      // can appear (a fixed seed: the same stream every run)
      const from = p.sliceHeader - p.start + 6;
      scrambleFrom(bytes, from, n);
    }
    parts.push(bytes);
  });
  const out = path.join(MEDIA_CACHE_DIR, `${name}.264`);
  await writeFile(out, Buffer.concat(parts));
  return out;
}
