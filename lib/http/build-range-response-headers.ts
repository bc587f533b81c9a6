// Status and headers for a GET answered after parseRange (RFC 9110 sections 14.3, 14.4, 15.3.7, 15.5.17).
import type { RangeResult } from "./parse-range";
import { contentLengthHeaders } from "./content-length-carrier";

export interface RangeResponseHead {
  readonly status: 200 | 206 | 416;
  readonly headers: Readonly<Record<string, string>>;
}

export function buildRangeResponseHeaders(range: RangeResult, length: number): RangeResponseHead {
  if (!Number.isSafeInteger(length) || length < 0) throw new RangeError(`representation length must be a non-negative integer, got ${length}`);
  // Accept-Ranges on every answer, so a client that first asked without Range learns it may seek (14.3).
  const acceptRanges = { "Accept-Ranges": "bytes" };
  switch (range.kind) {
    case "full":
      return { status: 200, headers: { ...acceptRanges, ...contentLengthHeaders(length) } };
    case "partial": {
      if (!(range.start >= 0 && range.start <= range.end && range.end < length)) {
        throw new RangeError(`range ${range.start}-${range.end} does not fit a representation of ${length} bytes`);
      }
      return {
        status: 206,
        headers: {
          ...acceptRanges,
          "Content-Range": `bytes ${range.start}-${range.end}/${length}`,
          ...contentLengthHeaders(range.end - range.start + 1),
        },
      };
    }
    case "unsatisfiable":
      // 416 carries "bytes */LENGTH" so the client learns the current length (15.5.17, 14.4).
      return { status: 416, headers: { ...acceptRanges, "Content-Range": `bytes */${length}`, ...contentLengthHeaders(0) } };
  }
}
