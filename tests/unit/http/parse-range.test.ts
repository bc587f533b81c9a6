import { describe, expect, it } from "vitest";
import { parseRange, type RangeResult } from "@/lib/http/parse-range";
import { buildRangeResponseHeaders } from "@/lib/http/build-range-response-headers";

// Cases from RFC 9110 section 14.1.2 ("Byte Ranges"), whose examples assume a 10000-byte
// representation; the rest from the satisfiability and ignoring rules of 14.1.2 and 14.2.
const LENGTH = 10_000;

const cases: Array<[string, string | null, number, RangeResult]> = [
  ["RFC 9110 14.1.2: bytes=0-499, the first 500 bytes", "bytes=0-499", LENGTH, { kind: "partial", start: 0, end: 499 }],
  ["RFC 9110 14.1.2: bytes=500-999, the second 500 bytes", "bytes=500-999", LENGTH, { kind: "partial", start: 500, end: 999 }],
  ["RFC 9110 14.1.2: bytes=-500, the final 500 bytes (suffix)", "bytes=-500", LENGTH, { kind: "partial", start: 9500, end: 9999 }],
  ["RFC 9110 14.1.2: bytes=9500-, from 9500 to the end (open end)", "bytes=9500-", LENGTH, { kind: "partial", start: 9500, end: 9999 }],
  ["RFC 9110 14.1.2: last-pos past the end is clamped to length - 1", "bytes=9000-20000", LENGTH, { kind: "partial", start: 9000, end: 9999 }],
  ["RFC 9110 14.1.2: suffix longer than the representation takes all of it", "bytes=-20000", LENGTH, { kind: "partial", start: 0, end: 9999 }],
  ["RFC 9110 14.1.2: single last byte", "bytes=9999-9999", LENGTH, { kind: "partial", start: 9999, end: 9999 }],
  ["Safari's first probe: bytes=0-1 (docs/library-notes.md)", "bytes=0-1", LENGTH, { kind: "partial", start: 0, end: 1 }],
  ["RFC 9110 14.1: range unit is case-insensitive", "Bytes=0-499", LENGTH, { kind: "partial", start: 0, end: 499 }],
  ["RFC 9110 5.6.1: empty list elements are ignored", "bytes=, 0-499 ,", LENGTH, { kind: "partial", start: 0, end: 499 }],
  ["RFC 9110 14.1.2: first-pos at the length is unsatisfiable (416)", "bytes=10000-", LENGTH, { kind: "unsatisfiable" }],
  ["RFC 9110 14.1.2: first-pos past the length is unsatisfiable (416)", "bytes=20000-20100", LENGTH, { kind: "unsatisfiable" }],
  ["RFC 9110 14.1.2: zero suffix-length is unsatisfiable (416)", "bytes=-0", LENGTH, { kind: "unsatisfiable" }],
  ["RFC 9110 14.1.2: every int-range of an empty representation is unsatisfiable", "bytes=0-1", 0, { kind: "unsatisfiable" }],
  ["RFC 9110 14.1.2: an empty representation satisfies a suffix only as the whole", "bytes=-500", 0, { kind: "full" }],
  ["no Range header: 200 with the whole representation", null, LENGTH, { kind: "full" }],
  ["RFC 9110 14.1.2 example bytes=0-0,-1 (two ranges): ignored per 14.2, served whole", "bytes=0-0,-1", LENGTH, { kind: "full" }],
  ["RFC 9110 14.2: several ranges may be ignored", "bytes=0-99, 200-299", LENGTH, { kind: "full" }],
  ["RFC 9110 14.1.1: last-pos below first-pos is invalid, ignored", "bytes=500-400", LENGTH, { kind: "full" }],
  ["RFC 9110 14.2: an unknown range unit is ignored", "items=0-5", LENGTH, { kind: "full" }],
  ["malformed: no unit", "0-499", LENGTH, { kind: "full" }],
  ["malformed: no range-spec", "bytes=", LENGTH, { kind: "full" }],
  ["malformed: bare dash", "bytes=-", LENGTH, { kind: "full" }],
  ["malformed: signs and letters", "bytes=+1-2", LENGTH, { kind: "full" }],
  ["malformed: whitespace inside a range-spec", "bytes=0 - 499", LENGTH, { kind: "full" }],
  ["malformed: whitespace around =", "bytes = 0-499", LENGTH, { kind: "full" }],
  ["huge last-pos (beyond 2^53) still clamps", "bytes=0-99999999999999999999999", LENGTH, { kind: "partial", start: 0, end: 9999 }],
  ["huge first-pos is unsatisfiable", "bytes=99999999999999999999999-", LENGTH, { kind: "unsatisfiable" }],
];

describe("parseRange (RFC 9110 section 14)", () => {
  it.each(cases)("%s", (_name, header, length, expected) => {
    expect(parseRange(header, length)).toEqual(expected);
  });

  it("refuses a negative or fractional representation length", () => {
    expect(() => parseRange("bytes=0-1", -1)).toThrow(RangeError);
    expect(() => parseRange("bytes=0-1", 1.5)).toThrow(RangeError);
  });
});

describe("buildRangeResponseHeaders (RFC 9110 14.3, 14.4, 15.3.7, 15.5.17)", () => {
  it("206 for the first 500 bytes: Content-Range bytes 0-499/10000, Content-Length 500", () => {
    expect(buildRangeResponseHeaders(parseRange("bytes=0-499", LENGTH), LENGTH)).toEqual({
      status: 206,
      headers: { "Accept-Ranges": "bytes", "Content-Range": "bytes 0-499/10000", "Content-Length": "500", "x-cairn-content-length": "500" },
    });
  });

  it("206 for Safari's bytes=0-1 probe carries exactly 2 bytes", () => {
    const head = buildRangeResponseHeaders(parseRange("bytes=0-1", LENGTH), LENGTH);
    expect(head.status).toBe(206);
    expect(head.headers["Content-Range"]).toBe("bytes 0-1/10000");
    expect(head.headers["Content-Length"]).toBe("2");
  });

  it("416 with Content-Range bytes */LENGTH when unsatisfiable", () => {
    expect(buildRangeResponseHeaders(parseRange("bytes=10000-", LENGTH), LENGTH)).toEqual({
      status: 416,
      headers: { "Accept-Ranges": "bytes", "Content-Range": "bytes */10000", "Content-Length": "0", "x-cairn-content-length": "0" },
    });
  });

  it("200 with the full length and Accept-Ranges when there is no usable Range", () => {
    expect(buildRangeResponseHeaders(parseRange(null, LENGTH), LENGTH)).toEqual({
      status: 200,
      headers: { "Accept-Ranges": "bytes", "Content-Length": "10000", "x-cairn-content-length": "10000" },
    });
    expect(buildRangeResponseHeaders(parseRange("bytes=-1", 0), 0)).toEqual({
      status: 200,
      headers: { "Accept-Ranges": "bytes", "Content-Length": "0", "x-cairn-content-length": "0" },
    });
  });

  it("Content-Length always equals the span Content-Range names, for every single range of a small file", () => {
    const length = 37;
    for (let first = 0; first < length + 3; first++) {
      for (let last = first; last < length + 3; last++) {
        const range = parseRange(`bytes=${first}-${last}`, length);
        const head = buildRangeResponseHeaders(range, length);
        if (first >= length) {
          expect(head.status).toBe(416);
          continue;
        }
        const match = /^bytes (\d+)-(\d+)\/(\d+)$/.exec(head.headers["Content-Range"]);
        expect(match).not.toBeNull();
        const [, a, b, total] = match!.map(Number);
        expect([a, b, total]).toEqual([first, Math.min(last, length - 1), length]);
        expect(Number(head.headers["Content-Length"])).toBe(b - a + 1);
      }
    }
  });

  it("refuses a partial range that does not fit the length", () => {
    expect(() => buildRangeResponseHeaders({ kind: "partial", start: 5, end: 10 }, 10)).toThrow(RangeError);
  });
});
