// Custody log exports.
// JSON: every stored field exactly as hashed, plus prevHash and hash, with the hashing rule written
// into the file, so anyone can recompute each event's hash without Cairn (a filtered trail is not
// contiguous: each event's own hash can be recomputed; the links between them only in a full export).
// CSV (RFC 4180: comma-separated, CRLF line ends, fields with a comma, quote or line break quoted,
// quotes doubled) for spreadsheets. Text cells that a spreadsheet would run as a formula get a
// leading apostrophe (OWASP, "CSV Injection"); the JSON export is the exact record.
import type { CustodyEvent } from "@/db/schema/types";

export type ExportedEvent = CustodyEvent & { actorName: string | null };

export const HASH_RULE =
  "hash = lowercase hex SHA-256 over UTF-8( prevHash + \"\\n\" + JCS(event without prevHash, hash and actorName) ), JCS = RFC 8785 JSON Canonicalization Scheme, dates as ISO-8601 UTC with milliseconds, absent values as null; the first event's prevHash is 64 zeros";

export const CSV_COLUMNS = [
  "seq",
  "id",
  "occurredAt",
  "eventType",
  "evidenceType",
  "evidenceId",
  "jobId",
  "originalSha256",
  "originalSize",
  "actorUserId",
  "actorName",
  "actorRole",
  "actorShareLinkId",
  "clientAddress",
  "userAgent",
  "storageLocation",
  "purpose",
  "tool",
  "toolArgs",
  "outputSha256",
  "details",
  "prevHash",
  "hash",
] as const;

const FORMULA_START = /^[=+\-@\t\r]/;

export function csvCell(value: unknown): string {
  let text: string;
  if (value === null || value === undefined) text = "";
  else if (value instanceof Date) text = value.toISOString();
  else if (typeof value === "object") text = JSON.stringify(value);
  else text = String(value);
  if (typeof value === "string" && FORMULA_START.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function custodyCsvHeader(): string {
  return CSV_COLUMNS.join(",") + "\r\n";
}

export function custodyCsvRow(e: ExportedEvent): string {
  return CSV_COLUMNS.map((c) => csvCell(e[c])).join(",") + "\r\n";
}

export function custodyJsonEvent(e: ExportedEvent) {
  const { actorName, ...stored } = e;
  return { ...stored, occurredAt: e.occurredAt.toISOString(), actorName };
}
