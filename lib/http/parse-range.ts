// Range request parsing per RFC 9110 section 14 (HTTP Semantics, "Range Requests").
//
// Choices the RFC leaves to the server, and ours:
// - Only a single byte range is served. Several ranges would need a multipart/byteranges body;
//   RFC 9110 14.2 lets a server ignore Range, so a multi-range request gets the full 200 answer.
//   Media players ask for one range at a time.
// - A Range that does not parse (unknown unit, bad syntax, last-pos < first-pos) is ignored the
//   same way (14.2: a server MAY ignore a Range with an invalid ranges-specifier).
// - A syntactically valid single range that is not satisfiable (14.1.2) answers 416.
// - Range applies to GET only (14.2); the route decides that and does not call this for HEAD/POST.
// - If-Range is the route's business too: when its validator fails, it must not call this.

export type RangeResult =
  | { readonly kind: "full" }
  | { readonly kind: "partial"; readonly start: number; readonly end: number } // inclusive byte positions
  | { readonly kind: "unsatisfiable" };

const FULL: RangeResult = { kind: "full" };
const UNSATISFIABLE: RangeResult = { kind: "unsatisfiable" };

// range-unit "=" range-set, range-unit a token compared case-insensitively (14.1).
const SPECIFIER = /^([!#$%&'*+.^_`|~0-9A-Za-z-]+)=(.*)$/s;
// int-range = first-pos "-" [ last-pos ]; suffix-range = "-" suffix-length (14.1.2)
const INT_RANGE = /^(\d+)-(\d*)$/;
const SUFFIX_RANGE = /^-(\d+)$/;

// Digits beyond 2^53 lose precision as numbers; they only ever compare as "larger than the
// representation", which is all such values need to do.
const toNumber = (digits: string) => Number(digits);

export function parseRange(header: string | null | undefined, length: number): RangeResult {
  if (!Number.isSafeInteger(length) || length < 0) throw new RangeError(`representation length must be a non-negative integer, got ${length}`);
  if (header == null) return FULL;

  const specifier = SPECIFIER.exec(header.trim());
  if (!specifier || specifier[1].toLowerCase() !== "bytes") return FULL;

  // range-set = 1#range-spec: a list, where OWS surrounds commas and empty elements are legal (RFC 9110 5.6.1).
  const specs = specifier[2].split(",").map((s) => s.trim()).filter((s) => s !== "");
  if (specs.length !== 1) return FULL;
  const spec = specs[0];

  const suffix = SUFFIX_RANGE.exec(spec);
  if (suffix) {
    const suffixLength = toNumber(suffix[1]);
    if (suffixLength === 0) return UNSATISFIABLE; // 14.1.2: a suffix-range is satisfiable only if non-zero
    // A zero-length representation satisfies "-N" only as the whole (empty) representation, which
    // Content-Range cannot express as FIRST-LAST: serve it whole.
    if (length === 0) return FULL;
    // "If the selected representation is shorter than the specified suffix-length, the entire
    // representation is used" (14.1.2).
    return { kind: "partial", start: Math.max(0, length - suffixLength), end: length - 1 };
  }

  const int = INT_RANGE.exec(spec);
  if (!int) return FULL;
  const first = toNumber(int[1]);
  const last = int[2] === "" ? undefined : toNumber(int[2]);
  if (last !== undefined && last < first) return FULL; // invalid range-spec (14.1.1)
  if (first >= length) return UNSATISFIABLE; // int-range satisfiable only when first-pos < length (14.1.2)
  // An absent last-pos, or one at or past the end, means "to the end" (14.1.2).
  const end = last === undefined || last >= length ? length - 1 : last;
  return { kind: "partial", start: first, end };
}
