import { describe, expect, it } from "vitest";
import { csvDocument, csvField, csvRecord, guardFormula } from "@/lib/csv/write-csv";

// Expected values below are the examples of RFC 4180, section 2, and OWASP's "CSV Injection" rule.

describe("RFC 4180 quoting", () => {
  it("writes the RFC's own example of an escaped double quote", () => {
    // RFC 4180 section 2, rule 7: "aaa","b""bb","ccc"
    expect(csvRecord(["aaa", 'b"bb', "ccc"], "all-text")).toBe('"aaa","b""bb","ccc"\r\n');
    // rule 5: fields may or may not be enclosed in double quotes; "needed" quotes only the second
    expect(csvRecord(["aaa", 'b"bb', "ccc"])).toBe('aaa,"b""bb",ccc\r\n');
  });

  it("keeps a line break inside a quoted field, as the RFC's rule 6 example does", () => {
    // RFC 4180 section 2, rule 6: "aaa","b CRLF bb","ccc" CRLF zzz,yyy,xxx
    const doc = csvDocument(["a", "b", "c"], [["aaa", "b\r\nbb", "ccc"]], "all-text");
    expect(doc).toBe('"a","b","c"\r\n"aaa","b\r\nbb","ccc"\r\n');
    expect(csvDocument(["a", "b", "c"], [["aaa", "b\r\nbb", "ccc"]])).toBe('a,b,c\r\naaa,"b\r\nbb",ccc\r\n');
  });

  it.each([
    ["comma", "gusty, 12 kt, from the west", '"gusty, 12 kt, from the west"'],
    ["double quote", 'b"bb', '"b""bb"'],
    ["CRLF", "line 1\r\nline 2", '"line 1\r\nline 2"'],
    ["bare LF", "line 1\nline 2", '"line 1\nline 2"'],
    ["bare CR", "a\rb", '"a\rb"'],
    ["nothing to quote", "upload", "upload"],
    ["empty text", "", ""],
  ])("quotes a field only when needed by default (%s)", (_label, value, expected) => {
    // RFC 4180 section 2, rule 6: fields containing line breaks, double quotes or commas are quoted
    expect(csvField(value)).toBe(expected);
  });

  it("quotes every text field in all-text mode, and never a number", () => {
    expect(csvField("upload", "all-text")).toBe('"upload"');
    expect(csvField("", "all-text")).toBe('""');
    expect(csvField(12.5, "all-text")).toBe("12.5");
  });

  it("ends every record, the last one too, with CRLF", () => {
    // RFC 4180 section 2, rules 1 and 2 (the last record may end with CRLF)
    const doc = csvDocument(["x", "y"], [[1, 2], [3, 4]], "all-text");
    expect(doc.split("\r\n")).toEqual(['"x","y"', "1,2", "3,4", ""]);
    expect(doc.replace(/\r\n/g, "")).not.toMatch(/[\r\n]/);
  });

  it("writes numbers bare and missing values as empty fields", () => {
    expect(csvRecord([587.045, -2.61955, 0, 734003200, null, undefined, ""], "all-text")).toBe('587.045,-2.61955,0,734003200,,,""\r\n');
  });

  it("writes NaN and Infinity as empty fields instead of text that looks like a figure", () => {
    expect(csvRecord([Number.NaN, Number.POSITIVE_INFINITY])).toBe(",\r\n");
  });

  it("writes a date as ISO 8601 UTC and an object as JSON, quoted as text", () => {
    expect(csvField(new Date(Date.UTC(2026, 2, 14, 9, 30, 0, 125)))).toBe("2026-03-14T09:30:00.125Z");
    expect(csvField({ a: 1, b: "x,y" })).toBe('"{""a"":1,""b"":""x,y""}"');
    expect(csvField(["-i", "in.264"])).toBe('"[""-i"",""in.264""]"');
    expect(csvField(true)).toBe("true");
  });

  it("refuses a record whose width differs from the header", () => {
    // RFC 4180 section 2, rule 4: each line should contain the same number of fields
    expect(() => csvDocument(["a", "b"], [["only one"]])).toThrow(/1 fields, the header has 2/);
  });
});

describe("formula-injection guard", () => {
  // OWASP "CSV Injection" / ASVS 5.0, requirement 1.2.10: a leading = + - @ tab or NUL is escaped
  // with a single quote. The leading carriage return is our addition (common practice, no published source).
  it.each([
    ["=HYPERLINK(\"http://example.invalid\",\"click\")", "'=HYPERLINK(\"http://example.invalid\",\"click\")"],
    ["+1+1", "'+1+1"],
    ["-2+3+cmd|' /C calc'!A0", "'-2+3+cmd|' /C calc'!A0"],
    ["@SUM(1+1)", "'@SUM(1+1)"],
    ["\t=1+1", "'\t=1+1"],
    ["\r=1+1", "'\r=1+1"],
    ["\0=1+1", "'\0=1+1"],
  ])("prefixes %j with a single quote", (input, guarded) => {
    expect(guardFormula(input)).toBe(guarded);
  });

  it("leaves ordinary text alone, including a formula sign that is not first", () => {
    for (const text of ["Camera pitched up", "1+1=2", "a@b.example", " =not first", ""]) expect(guardFormula(text)).toBe(text);
  });

  it.each(["needed", "all-text"] as const)("guards before quoting (%s), so a quoted formula with a comma and quote is both safe and well-formed", (quoting) => {
    expect(csvField('=A1,"x"', quoting)).toBe(`"'=A1,""x"""`);
  });

  it("guards a text field that needs no quotes, and one that starts with CR", () => {
    expect(csvField("-2")).toBe("'-2");
    expect(csvField("@SUM(A1)")).toBe("'@SUM(A1)");
    expect(csvField("\r=1+1")).toBe(`"'\r=1+1"`);
    expect(csvField("\0=1+1")).toBe("'\0=1+1");
  });

  it("does not touch negative numbers, which are data, not text", () => {
    // a bare -2.61955 is a number to every spreadsheet; quoting it would turn longitudes into text
    expect(csvField(-2.61955)).toBe("-2.61955");
    expect(csvField(-2.61955, "all-text")).toBe("-2.61955");
  });
});
