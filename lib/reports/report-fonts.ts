// The report's type (docs/look.md). Text: IBM Plex Sans, read from the @fontsource package (latin
// subset, WOFF). Exact figures (timecodes, hashes, coordinates): IBM Plex Mono, from a TrueType file
// shipped beside this module: the PDF library's font engine (fontkit) fails on the @fontsource Plex
// Mono WOFF and WOFF2 files ("Offset is outside the bounds of the DataView" as soon as a space is
// laid out; seen on @react-pdf/renderer 4.9), but reads the same font unpacked.
// fonts/ibm-plex-mono-latin-400-normal.ttf is app/fonts/ibm-plex-mono-latin-400-normal.woff2 unpacked
// by Debian's woff2_decompress (package woff2 1.0.2); licence: app/fonts/LICENSE-IBM-Plex.txt (OFL 1.1).
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
  pdf.Font.register({ family: "Plex Mono", src: path.join(process.cwd(), "lib/reports/fonts/ibm-plex-mono-latin-400-normal.ttf") });
  pdf.Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}
