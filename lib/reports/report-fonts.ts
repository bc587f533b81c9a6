// The report's type. Text: IBM Plex Sans (LOOK.md), read from the @fontsource package (latin subset,
// WOFF). Exact figures (timecodes, hashes, coordinates): the PDF core font Courier, not Plex Mono,
// because the PDF library's font engine (fontkit) fails on the @fontsource Plex Mono WOFF files
// ("Offset is outside the bounds of the DataView" as soon as a space is laid out; checked on
// @react-pdf/renderer 4.9) and their WOFF2 files alike.
// Words are never hyphenated: a SHA-256 split by a hyphen would no longer be the digest.
import { createRequire } from "node:module";
import path from "node:path";
import type * as ReactPdf from "@react-pdf/renderer";

let registered = false;

export function registerReportFonts(pdf: typeof ReactPdf): void {
  if (registered) return;
  const require = createRequire(path.join(process.cwd(), "package.json"));
  const file = (name: string) => require.resolve(`@fontsource/ibm-plex-sans/files/${name}`);
  pdf.Font.register({
    family: "Plex Sans",
    fonts: [
      { src: file("ibm-plex-sans-latin-400-normal.woff"), fontWeight: 400 },
      { src: file("ibm-plex-sans-latin-600-normal.woff"), fontWeight: 600 },
    ],
  });
  pdf.Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}
