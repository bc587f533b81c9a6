import { describe, expect, it } from "vitest";
import { custodyCsvHeader, custodyCsvRow, CSV_COLUMNS, type ExportedEvent } from "@/lib/custody/export-custody-log";

// The cell rules (RFC 4180 quoting, the formula guard) are tested on the writer itself,
// tests/unit/csv/write-csv.test.ts; here, a custody event as a whole record.
describe("custody CSV export (RFC 4180)", () => {
  it("writes one header and one CRLF-terminated record per event, with the same field count", () => {
    const e = {
      seq: 7,
      id: "0b0e1c5e-8f1a-4d8e-9a43-6f1f0c2b7a11",
      organisationId: "0b0e1c5e-8f1a-4d8e-9a43-6f1f0c2b7a12",
      eventType: "download",
      evidenceType: "recording",
      evidenceId: null,
      jobId: null,
      originalSha256: "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad",
      originalSize: 3,
      actorUserId: null,
      actorName: "Ada, \"the owner\"",
      actorRole: "owner",
      actorShareLinkId: null,
      occurredAt: new Date(Date.UTC(2026, 2, 14)),
      clientAddress: "192.0.2.10",
      userAgent: "Mozilla/5.0 (X11; Linux x86_64)",
      storageLocation: "originals/x",
      purpose: "Client downloaded\nthe original",
      tool: null,
      toolArgs: ["-i", "in.264"],
      outputSha256: null,
      details: { reason: "x" },
      prevHash: "0".repeat(64),
      hash: "f".repeat(64),
    } as ExportedEvent;
    const header = custodyCsvHeader();
    const row = custodyCsvRow(e);
    expect(header.endsWith("\r\n")).toBe(true);
    expect(row.endsWith("\r\n")).toBe(true);
    expect(header.split(",")).toHaveLength(CSV_COLUMNS.length);
    // count fields with a small RFC 4180 reader: quoted fields may hold commas, quotes and line breaks
    const fields: string[] = [];
    let i = 0;
    const text = row.slice(0, -2);
    while (i <= text.length) {
      if (text[i] === '"') {
        let j = i + 1;
        let v = "";
        for (;;) {
          if (text[j] === '"' && text[j + 1] === '"') {
            v += '"';
            j += 2;
          } else if (text[j] === '"') break;
          else v += text[j++];
        }
        fields.push(v);
        i = j + 2;
      } else {
        const j = text.indexOf(",", i) === -1 ? text.length : text.indexOf(",", i);
        fields.push(text.slice(i, j));
        i = j + 1;
      }
    }
    expect(fields).toHaveLength(CSV_COLUMNS.length);
    expect(fields[CSV_COLUMNS.indexOf("actorName")]).toBe('Ada, "the owner"');
    expect(fields[CSV_COLUMNS.indexOf("purpose")]).toBe("Client downloaded\nthe original");
    expect(fields[CSV_COLUMNS.indexOf("toolArgs")]).toBe('["-i","in.264"]');
  });

  // OWASP "CSV Injection": a text cell a spreadsheet would evaluate gets a leading single quote
  it.each(["=HYPERLINK(\"x\")", "+1+1", "-2", "@SUM(A1)", "\0=1"])("defuses a formula-looking purpose %j", (purpose) => {
    const row = custodyCsvRow({ seq: 1, purpose, toolArgs: null, details: null } as unknown as ExportedEvent);
    const cell = row.split(",")[CSV_COLUMNS.indexOf("purpose")];
    expect(cell.replace(/^"|"$/g, "")).toBe(`'${purpose.replace(/"/g, '""')}`);
  });
});
