// The text of a PDF as an independent reader sees it: pdfjs-dist 4 (legacy build, for Node), page by
// page, line ends kept, and how many raster images the pages paint. The standard-fonts folder lets it
// read the core fonts (Courier) a document may use without embedding them.
import path from "node:path";

export async function readPdfText(bytes: Uint8Array): Promise<{ text: string; pages: number; images: number }> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const standardFontDataUrl = `${path.resolve(__dirname, "../../node_modules/pdfjs-dist/standard_fonts")}/`;
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), disableFontFace: true, useSystemFonts: false, isEvalSupported: false, standardFontDataUrl }).promise;
  let text = "";
  let images = 0;
  for (let p = 1; p <= doc.numPages; p++) {
    const page = await doc.getPage(p);
    const content = await page.getTextContent();
    text += content.items.map((i) => ("str" in i ? i.str + (i.hasEOL ? "\n" : "") : "")).join("") + "\n";
    const ops = await page.getOperatorList();
    images += ops.fnArray.filter((fn) => fn === pdfjs.OPS.paintImageXObject).length;
  }
  const pages = doc.numPages;
  await doc.destroy();
  return { text, pages, images };
}
