// Pixel size of a JPEG file from its frame header, without spawning a tool: markers are scanned from
// SOI to the first SOFn segment, whose payload is precision (1 byte), height (2), width (2)
// (ITU-T T.81 B.1.1 marker layout, B.2.2 frame header; SOF markers are FFC0-FFCF except DHT FFC4,
// JPG FFC8 and DAC FFCC).
import { readFileHead } from "@/lib/uploads/read-file-head";

const HEAD_BYTES = 64 * 1024; // frame headers sit well inside the first 64 KiB of ffmpeg's JPEGs

export function jpegSizeOf(bytes: Uint8Array): { width: number; height: number } | null {
  if (bytes.length < 4 || bytes[0] !== 0xff || bytes[1] !== 0xd8) return null;
  let i = 2;
  while (i + 4 <= bytes.length) {
    if (bytes[i] !== 0xff) return null;
    const marker = bytes[i + 1];
    if (marker === 0xff) {
      i++; // fill byte
      continue;
    }
    // standalone markers carry no length
    if (marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) {
      i += 2;
      continue;
    }
    const length = (bytes[i + 2] << 8) | bytes[i + 3];
    const isSof = marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;
    if (isSof) {
      if (i + 9 > bytes.length) return null;
      return { height: (bytes[i + 5] << 8) | bytes[i + 6], width: (bytes[i + 7] << 8) | bytes[i + 8] };
    }
    if (marker === 0xda) return null; // start of scan before any frame header
    i += 2 + length;
  }
  return null;
}

export async function readJpegSize(path: string): Promise<{ width: number; height: number } | null> {
  return jpegSizeOf(await readFileHead(path, HEAD_BYTES));
}
