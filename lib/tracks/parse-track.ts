// One entry for any track file: the bytes must be UTF-8 text; a file whose first visible character is
// "<" is read as GPX 1.1, anything else as CSV. Nothing is stored here: a refusal leaves no trace.
import { parseCsvTrack } from "./parse-csv-track";
import { parseGpx } from "./parse-gpx";
import { MAX_TRACK_BYTES, type ParseResult } from "./track-types";

export function parseTrack(bytes: Uint8Array): ParseResult {
  if (bytes.byteLength > MAX_TRACK_BYTES) {
    return { ok: false, format: null, problems: [{ line: null, point: null, reason: `the file is ${formatMiB(bytes.byteLength)}; a track may be at most ${formatMiB(MAX_TRACK_BYTES)}` }] };
  }
  if (bytes.byteLength === 0) return { ok: false, format: null, problems: [{ line: null, point: null, reason: "the file is empty" }] };
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return { ok: false, format: null, problems: [{ line: null, point: null, reason: "the file is not UTF-8 text: a track is a GPX 1.1 or CSV text file" }] };
  }
  const start = text.replace(/^\uFEFF/, "").trimStart();
  return start.startsWith("<") ? parseGpx(text) : parseCsvTrack(text);
}

export const formatMiB = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MiB`;
