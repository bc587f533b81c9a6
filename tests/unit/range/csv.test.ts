import { describe, expect, it } from "vitest";
import { csvDocument, csvField, csvRecord, guardFormula } from "@/lib/range/csv";

describe("RFC 4180 quoting", () => {
  it("writes the RFC's own example of an escaped double quote", () => {
    // RFC 4180 section 2, rule 7: "aaa","b""bb","ccc"
    expect(csvRecord(["aaa", 'b"bb', "ccc"])).toBe('"aaa","b""bb","ccc"');
  });

  it("keeps a line break inside a quoted field, as the RFC's rule 6 example does", () => {
    // RFC 4180 section 2, rule 6: "aaa","b CRLF bb","ccc" CRLF zzz,yyy,xxx
    const doc = csvDocument(["a", "b", "c"], [["aaa", "b\r\nbb", "ccc"]]);
    expect(doc).toBe('"a","b","c"\r\n"aaa","b\r\nbb","ccc"\r\n');
  });

  it("quotes commas, so a note with commas stays one field", () => {
    // RFC 4180 section 2, rule 6: fields containing commas are enclosed in double quotes
    expect(csvField("gusty, 12 kt, from the west")).toBe('"gusty, 12 kt, from the west"');
  });

  it("ends every record, the last one too, with CRLF", () => {
    // RFC 4180 section 2, rules 1 and 2 (the last record may end with CRLF)
    const doc = csvDocument(["x", "y"], [[1, 2], [3, 4]]);
    expect(doc.split("\r\n")).toEqual(['"x","y"', "1,2", "3,4", ""]);
    expect(doc.replace(/\r\n/g, "")).not.toMatch(/[\r\n]/);
  });

  it("writes numbers bare and missing values as empty fields", () => {
    expect(csvRecord([587.045, -2.61955, 0, null, undefined, ""])).toBe('587.045,-2.61955,0,,,""');
  });

  it("writes NaN and Infinity as empty fields instead of text that looks like a figure", () => {
    expect(csvRecord([Number.NaN, Number.POSITIVE_INFINITY])).toBe(",");
  });

  it("refuses a record whose width differs from the header", () => {
    // RFC 4180 section 2, rule 4: each line should contain the same number of fields
    expect(() => csvDocument(["a", "b"], [["only one"]])).toThrow(/1 fields, the header has 2/);
  });
});

describe("formula-injection guard", () => {
  // OWASP ASVS 5.0, requirement 1.2.10: a leading = + - @ tab or NUL is escaped with a single quote.
  // The leading carriage return is our addition (common practice, no published source).
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

  it("guards before quoting, so a quoted formula with a comma and quote is both safe and well-formed", () => {
    expect(csvField('=A1,"x"')).toBe(`"'=A1,""x"""`);
  });

  it("does not touch negative numbers, which are data, not text", () => {
    // a bare -2.61955 is a number to every spreadsheet; quoting it would turn longitudes into text
    expect(csvField(-2.61955)).toBe("-2.61955");
  });
});
