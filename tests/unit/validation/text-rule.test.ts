// The one text rule (lib/validation/common.ts): which characters a text field refuses. Code points
// and their classes from the Unicode Standard (C0 controls U+0000-U+001F, DEL U+007F, C1 controls
// U+0080-U+009F; surrogates U+D800-U+DFFF are not scalar values, section 3.9 D76).
import { describe, expect, it } from "vitest";
import { name, optionalText, textProblem } from "@/lib/validation/common";

describe("textProblem", () => {
  it("refuses NUL, every other C0 control, DEL and C1 controls", () => {
    expect(textProblem("a\u0000b")).toMatch(/NUL/);
    for (let c = 1; c < 0x20; c++) expect(textProblem(`a${String.fromCharCode(c)}b`), `U+${c.toString(16)}`).not.toBeNull();
    expect(textProblem("a\u007fb")).toMatch(/U\+007F/);
    expect(textProblem("a\u0085b")).toMatch(/U\+0085/);
    expect(textProblem("a\u009fb")).toMatch(/U\+009F/);
  });

  it("refuses unpaired surrogates, high or low, at either end, but not a surrogate pair", () => {
    for (const s of ["\ud800", "x\udbff", "\udc00x", "a\udfffb", "\ude00\ud83d"]) expect(textProblem(s), JSON.stringify(s)).toMatch(/unpaired surrogate/);
    expect(textProblem("\ud83d\ude00")).toBeNull(); // U+1F600 as a pair
    expect(textProblem("Tower \u{1F6F0} west")).toBeNull();
  });

  it("lets tab, line feed and carriage return through in multi-line fields only", () => {
    for (const c of ["\t", "\n", "\r"]) {
      expect(textProblem(`a${c}b`, true)).toBeNull();
      expect(textProblem(`a${c}b`, false)).toMatch(/single line/);
    }
    expect(textProblem("a\u000bb", true)).toMatch(/U\+000B/); // vertical tab is not a line break here
  });

  it("keeps ordinary text, accents and non-Latin scripts", () => {
    for (const s of ["Spillway footbridge", "Château d'eau", "塔", "Δ 12 m", "a\u00a0b"]) expect(textProblem(s), s).toBeNull();
  });

  it("is applied by the shared schemas, with the message on the field", () => {
    expect(name().safeParse("bad\u0000").error?.issues[0].message).toMatch(/NUL/);
    expect(optionalText(100, true).parse("line one\nline two")).toBe("line one\nline two");
    expect(optionalText(100).safeParse("line one\nline two").success).toBe(false);
  });
});
