// A note holding markup renders as the characters typed (React escapes text), checked with
// react-dom/server's own serializer.
import { describe, expect, it } from "vitest";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { FindingNote } from "@/components/findings/finding-note";

describe("FindingNote", () => {
  it("renders HTML in a note as text, never as elements", () => {
    const note = `<img src=x onerror="alert(1)"><script>alert(2)</script>`;
    const html = renderToStaticMarkup(createElement(FindingNote, { note }));
    expect(html).not.toContain("<img");
    expect(html).not.toContain("<script");
    expect(html).toContain("&lt;img src=x onerror=&quot;alert(1)&quot;&gt;&lt;script&gt;alert(2)&lt;/script&gt;");
  });
});
