import { describe, expect, it } from "vitest";
import { canonicalSerialize } from "@/lib/custody/canonical-serialize";

// Reference: the RFC 8785 (JCS) test data published by its author in the repository
// cyberphone/json-canonicalization, testdata/input/*.json -> testdata/output/*.json.
// Inputs are JSON texts (parsed with JSON.parse); expected outputs are written with \u escapes
// where the published file holds raw control characters.
const JCS_VECTORS: Array<[string, string, string]> = [
  [
    "values.json",
    String.raw`{
  "numbers": [1E30, 4.50, 333333333.33333329, 2e-3, 0.000000000000000000000000001],
  "escaping": "\u20ac$\u000F\u000aA'\u0042\u0022\u005c\\\"\/",
  "literals": [null, true, false]
}`,
    String.raw`{"escaping":"€$\u000f\nA'B\"\\\\\"/","literals":[null,true,false],"numbers":[1e+30,4.5,333333333.3333333,0.002,1e-27]}`,
  ],
  [
    "structures.json",
    String.raw`{
  "1": {"f": {"f": "hi","F": 5} ,"\n": 56.0},
  "10": { },
  "": "empty",
  "a": { },
  "111": [ { } ],
  "A": { }
}`,
    String.raw`{"":"empty","1":{"\n":56,"f":{"F":5,"f":"hi"}},"10":{},"111":[{}],"A":{},"a":{}}`,
  ],
  [
    "weird.json",
    String.raw`{
  "\u20ac": "Euro Sign",
  "1": "One",
  "\u0080": "Control\u007f",
  "\ud83d\ude02": "Smiley",
  "\u00f6": "Latin Small Letter O With Diaeresis",
  "\ufb33": "Hebrew Letter Dalet With Dagesh",
  "</script>": "Browser Challenge"
}`,
    '{"1":"One","</script>":"Browser Challenge","\u0080":"Control\u007f","\u00f6":"Latin Small Letter O With Diaeresis","\u20ac":"Euro Sign","\ud83d\ude02":"Smiley","\ufb33":"Hebrew Letter Dalet With Dagesh"}',
  ],
];

describe("canonicalSerialize (RFC 8785 JCS subset)", () => {
  it.each(JCS_VECTORS)("JCS test data %s", (_file, input, expected) => {
    expect(canonicalSerialize(JSON.parse(input))).toBe(expected);
  });

  it("does not depend on key insertion order, at any depth", () => {
    const a = { b: 1, a: { y: [3, { q: 1, p: 2 }], x: "s" }, c: null };
    const b = { c: null, a: { x: "s", y: [3, { p: 2, q: 1 }] }, b: 1 };
    expect(canonicalSerialize(a)).toBe(canonicalSerialize(b));
    expect(canonicalSerialize(a)).toBe('{"a":{"x":"s","y":[3,{"p":2,"q":1}]},"b":1,"c":null}');
  });

  it("keeps array order (it carries meaning)", () => {
    expect(canonicalSerialize([2, 1])).not.toBe(canonicalSerialize([1, 2]));
  });

  it("writes dates as ISO-8601 UTC with milliseconds", () => {
    expect(canonicalSerialize({ at: new Date(Date.UTC(2025, 2, 1, 9, 30, 0, 0)) })).toBe('{"at":"2025-03-01T09:30:00.000Z"}');
    expect(canonicalSerialize(new Date(Date.UTC(2025, 11, 31, 23, 59, 59, 7)))).toBe('"2025-12-31T23:59:59.007Z"');
  });

  it("writes missing members as null, so undefined and null hash alike", () => {
    expect(canonicalSerialize({ a: undefined, b: 1 })).toBe('{"a":null,"b":1}');
    expect(canonicalSerialize({ a: undefined })).toBe(canonicalSerialize({ a: null }));
    expect(canonicalSerialize([undefined])).toBe("[null]");
  });

  it("has no whitespace between tokens and parses back to the same value", () => {
    const value = { note: "crack at pier 3\nseen twice", sev: 4, tags: ["a b", "c"], ok: true };
    const text = canonicalSerialize(value);
    expect(text).toBe('{"note":"crack at pier 3\\nseen twice","ok":true,"sev":4,"tags":["a b","c"]}');
    expect(JSON.parse(text)).toEqual(value);
  });

  it.each([
    ["NaN", Number.NaN],
    ["Infinity", Number.POSITIVE_INFINITY],
    ["bigint", 1n],
    ["Map", new Map()],
    ["Buffer", Buffer.from("x")],
    ["function", () => 1],
    ["symbol", Symbol("s")],
    ["invalid Date", new Date(Number.NaN)],
    ["lone surrogate", "\ud800x"],
    ["lone surrogate key", { "\udc00": 1 }],
  ])("refuses %s", (_name, value) => {
    expect(() => canonicalSerialize({ v: value })).toThrow(TypeError);
  });

  it("refuses cycles but accepts a shared (non-cyclic) reference", () => {
    const cyclic: Record<string, unknown> = {};
    cyclic.self = cyclic;
    expect(() => canonicalSerialize(cyclic)).toThrow(/cyclic/);
    const shared = { k: 1 };
    expect(canonicalSerialize({ a: shared, b: shared })).toBe('{"a":{"k":1},"b":{"k":1}}');
  });
});
