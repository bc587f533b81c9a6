import { describe, expect, it } from "vitest";
import { csvCell, custodyCsvHeader, custodyCsvRow, CSV_COLUMNS, type ExportedEvent } from "@/lib/custody/export-custody-log";

// RFC 4180 section 2: records end with CRLF (rule 2); fields containing line breaks, double quotes
// or commas are enclosed in double quotes (rule 6); a double quote inside is escaped by doubling
// it (rule 7), e.g. the RFC's own example field "b""bb".
describe("custody CSV export (RFC 4180)", () => {
  it.each([
    ["plain", "upload", "upload"],
    ["comma", "a,b", '"a,b"'],
    ["quote (RFC 4180 rule 7 example)", 'b"bb', '"b""bb"'],
    ["CRLF inside", "line 1\r\nline 2", '"line 1\r\nline 2"'],
    ["null", null, ""],
    ["number", 734003200, "734003200"],
    ["date as ISO-8601 UTC", new Date(Date.UTC(2026, 2, 14, 9, 30, 0, 125)), "2026-03-14T09:30:00.125Z"],
    ["object as JSON", { a: 1, b: "x,y" }, '"{""a"":1,""b"":""x,y""}"'],
  ])("%s", (_label, value, expected) => {
    expect(csvCell(value)).toBe(expected);
  });

  // OWASP "CSV Injection": cells a spreadsheet would evaluate start with = + - @ tab or CR
  it.each(["=HYPERLINK(\"x\")", "+1+1", "-2", "@SUM(A1)"])("defuses a formula-looking text cell %s", (value) => {
    const cell = csvCell(value);
    expect(cell.replace(/^"|"$/g, "").startsWith("'")).toBe(true);
  });

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
});
