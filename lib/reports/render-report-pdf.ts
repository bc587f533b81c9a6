// Renders a report's data to PDF bytes. Stills are read from the store here, once each.
// @react-pdf/renderer is loaded with a dynamic import(): the worker runs as CommonJS under tsx, where
// a static import becomes a require() that cannot load the library's import-only dependencies.
import "server-only";
import { createElement } from "react";
import type { ReactElement } from "react";
import type { DocumentProps } from "@react-pdf/renderer";
import { readStoredBytes } from "@/lib/storage/store";
import { makeReportDocument } from "./report-document";
import { registerReportFonts } from "./report-fonts";
import type { ReportData } from "./report-data";

export async function renderReportPdf(data: ReportData): Promise<Buffer> {
  const pdf = await import("@react-pdf/renderer");
  registerReportFonts(pdf);
  const stills = new Map<string, Buffer>();
  for (const f of data.findings) if (f.still?.storageKey) stills.set(f.id, await readStoredBytes(f.still.storageKey));
  const ReportDocument = makeReportDocument(pdf);
  const doc = createElement(ReportDocument, { data, stills }) as unknown as ReactElement<DocumentProps>;
  return pdf.renderToBuffer(doc);
}
