import { describe, expect, it } from "vitest";
import { buildRangeResponseHeaders } from "@/lib/http/build-range-response-headers";
import { parseRange } from "@/lib/http/parse-range";
import { countsAsDownload } from "@/lib/custody/counts-as-download";

// What a request for a 1000-byte file answers (RFC 9110 section 14, through our parser and header
// builder), and whether that answer is one download.
function answer(method: string, range: string | null) {
  const parsed = method === "GET" ? parseRange(range, 1000) : ({ kind: "full" } as const);
  const head = buildRangeResponseHeaders(parsed, 1000);
  return countsAsDownload(method, head.status, head.headers["Content-Range"] ?? null);
}

describe("countsAsDownload: a download is logged once, from byte 0", () => {
  it.each([
    ["a plain GET (200, whole file)", "GET", null, true],
    ["bytes=0- (206 from the first byte)", "GET", "bytes=0-", true],
    ["bytes=0-99 (206 from the first byte)", "GET", "bytes=0-99", true],
    ["a suffix range longer than the file (RFC 9110 14.1.2: the whole file, from byte 0)", "GET", "bytes=-5000", true],
    ["several ranges (ignored: the whole file, 200)", "GET", "bytes=0-9,20-29", true],
    ["a Range that does not parse (ignored: the whole file, 200)", "GET", "bytes=x-y", true],
    ["a resuming client's later range", "GET", "bytes=500-", false],
    ["a player's seek", "GET", "bytes=100-199", false],
    ["a suffix range inside the file", "GET", "bytes=-100", false],
    ["an unsatisfiable range (416)", "GET", "bytes=5000-", false],
    ["HEAD", "HEAD", null, false],
  ])("%s", (_label, method, range, expected) => {
    expect(answer(method, range)).toBe(expected);
  });

  it("reads Content-Range as RFC 9110 14.4 writes it", () => {
    expect(countsAsDownload("GET", 206, "bytes 0-0/1")).toBe(true);
    expect(countsAsDownload("GET", 206, "bytes 10-20/100")).toBe(false);
    expect(countsAsDownload("GET", 206, null)).toBe(false);
    expect(countsAsDownload("POST", 200, null)).toBe(false);
  });
});
