import { describe, expect, it } from "vitest";
import contentDisposition from "next/dist/compiled/content-disposition";
import { buildContentDisposition } from "@/lib/http/build-content-disposition";

// Independent reader: jshttp's content-disposition parser, as vendored by next
// (next/dist/compiled/content-disposition). It decodes filename* (RFC 8187) and prefers it over
// filename, as RFC 6266 section 4.3 asks of recipients.
const parse = (header: string) => contentDisposition.parse(header);

function params(header: string): Record<string, string> {
  // Raw parameter split, to look at the two names separately (values here hold no ";").
  const out: Record<string, string> = {};
  for (const part of header.split(";").slice(1)) {
    const eq = part.indexOf("=");
    out[part.slice(0, eq).trim().toLowerCase()] = part.slice(eq + 1).trim();
  }
  return out;
}

describe("buildContentDisposition (RFC 6266, RFC 8187)", () => {
  it("RFC 6266 section 5 example: '€ rates' encodes as UTF-8''%e2%82%ac%20rates", () => {
    // Example header in RFC 6266 section 5 (recalled from memory):
    //   Content-Disposition: attachment; filename="EURO rates"; filename*=utf-8''%e2%82%ac%20rates
    const header = buildContentDisposition("€ rates");
    const p = params(header);
    expect(p["filename*"].toLowerCase()).toBe("utf-8''%e2%82%ac%20rates");
    expect(p.filename).toBe('"rates"');
    expect(parse(header)).toEqual({ type: "attachment", parameters: { filename: "€ rates" } });
    // The parser reads the RFC's own header the same way it reads ours.
    expect(parse(`attachment; filename="EURO rates"; filename*=utf-8''%e2%82%ac%20rates`).parameters.filename).toBe("€ rates");
  });

  it("RFC 8187 section 3.2.3 example: '£ and € rates' (recalled from memory)", () => {
    // RFC 8187 3.2.3: title*=UTF-8''%c2%a3%20and%20%e2%82%ac%20rates decodes to "£ and € rates".
    const p = params(buildContentDisposition("£ and € rates"));
    expect(p["filename*"].toLowerCase()).toBe("utf-8''%c2%a3%20and%20%e2%82%ac%20rates");
  });

  it("RFC 6266 section 5 example: a plain ASCII name survives both forms", () => {
    // RFC 6266 5: Content-Disposition: Attachment; filename=example.html
    const header = buildContentDisposition("example.html");
    expect(header).toBe(`attachment; filename="example.html"; filename*=UTF-8''example.html`);
    expect(parse(header).parameters.filename).toBe("example.html");
  });

  it("inline type, as in RFC 6266 section 5's INLINE example", () => {
    expect(parse(buildContentDisposition("an example.html", "inline"))).toEqual({ type: "inline", parameters: { filename: "an example.html" } });
  });

  it("escapes quotes in the fallback (quoted-string, RFC 9110 5.6.4) and percent-encodes them in filename*", () => {
    const header = buildContentDisposition('pier "north" span.mp4');
    expect(params(header).filename).toBe('"pier \\"north\\" span.mp4"');
    expect(params(header)["filename*"]).toBe("UTF-8''pier%20%22north%22%20span.mp4");
    expect(parse(header).parameters.filename).toBe('pier "north" span.mp4');
  });

  it("strips control characters from both forms and path separators from the name", () => {
    const header = buildContentDisposition("a\r\nb\u0000c\u0085/..\\x.jpg");
    expect(header).not.toMatch(/[\u0000-\u001f\u007f-\u009f]/);
    expect(parse(header).parameters.filename).toBe("abc_.._x.jpg");
  });

  it("keeps non-ASCII letters out of the fallback but folds accents to their base letter", () => {
    const header = buildContentDisposition("Prüfbericht Brücke Süd.pdf");
    expect(params(header).filename).toBe('"Prufbericht Brucke Sud.pdf"');
    expect(params(header).filename).toMatch(/^[\u0020-\u007e]+$/);
    expect(parse(header).parameters.filename).toBe("Prüfbericht Brücke Süd.pdf");
  });

  it("a name with no ASCII letters falls back to download + extension", () => {
    const header = buildContentDisposition("点検報告.pdf");
    expect(params(header).filename).toBe('"download.pdf"');
    expect(parse(header).parameters.filename).toBe("点検報告.pdf");
  });

  it("RFC 6266 appendix D: no %XX sequence in the fallback; '%' and \"'\" are encoded in filename*", () => {
    const header = buildContentDisposition("100%AB it's.txt");
    expect(params(header).filename).toBe(`"100_AB it's.txt"`);
    expect(params(header)["filename*"]).toBe("UTF-8''100%25AB%20it%27s.txt");
    expect(parse(header).parameters.filename).toBe("100%AB it's.txt");
  });

  it("round-trips names of many scripts through the independent parser", () => {
    const names = ["flight 03 — ridge.264", "Ωmega;test.mp4", "emoji 🛰 trace.vtt", "tab\tname.csv", "a=b,c.txt", "naïve café.jpg"];
    for (const name of names) {
      const expected = name.normalize("NFC").replace(/[\u0000-\u001f\u007f-\u009f]/g, "");
      expect(parse(buildContentDisposition(name)).parameters.filename).toBe(expected);
    }
  });
});
