// JPEG size from the frame header. Bytes laid out by hand after ITU-T T.81: SOI FFD8 (B.1.1.3),
// APPn/DQT/DHT segments with 2-byte lengths (B.1.1.4), SOF0 FFC0 Lf P Y X (B.2.2, Table B.2).
import { describe, expect, it } from "vitest";
import { jpegSizeOf } from "@/lib/processing/read-jpeg-size";

const app0 = [0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x02, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00];
const dht = [0xff, 0xc4, 0x00, 0x04, 0x00, 0x00]; // DHT must not be read as a frame header
// SOF0: length 17, precision 8, height 240 (0x00F0), width 432 (0x01B0), 3 components
const sof0 = [0xff, 0xc0, 0x00, 0x11, 0x08, 0x00, 0xf0, 0x01, 0xb0, 0x03, 0x01, 0x22, 0x00, 0x02, 0x11, 0x01, 0x03, 0x11, 0x01];
const sos = [0xff, 0xda, 0x00, 0x08, 0x01, 0x01, 0x00, 0x00, 0x3f, 0x00];

describe("jpegSizeOf", () => {
  it("reads width and height from SOF0 after other segments", () => {
    expect(jpegSizeOf(Uint8Array.from([0xff, 0xd8, ...app0, ...dht, ...sof0, ...sos]))).toEqual({ width: 432, height: 240 });
  });

  it("reads a progressive frame header (SOF2) and skips fill bytes", () => {
    const sof2 = [...sof0];
    sof2[1] = 0xc2;
    expect(jpegSizeOf(Uint8Array.from([0xff, 0xd8, 0xff, ...app0, ...sof2]))).toEqual({ width: 432, height: 240 });
  });

  it("gives null for what is not a JPEG or has no frame header before the scan", () => {
    expect(jpegSizeOf(Uint8Array.from([0x89, 0x50, 0x4e, 0x47]))).toBeNull();
    expect(jpegSizeOf(Uint8Array.from([0xff, 0xd8, ...app0, ...sos]))).toBeNull();
    expect(jpegSizeOf(Uint8Array.from([0xff, 0xd8, ...app0.slice(0, 6)]))).toBeNull();
  });
});
