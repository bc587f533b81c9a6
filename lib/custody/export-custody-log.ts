// Custody log exports.
// JSON: every stored field exactly as hashed, plus prevHash and hash, with the hashing rule written
// into the file, so anyone can recompute each event's hash without Cairn (a filtered trail is not
// contiguous: each event's own hash can be recomputed; the links between them only in a full export).
// CSV for spreadsheets, written by lib/csv/write-csv.ts (RFC 4180, fields quoted where needed, text
// cells a spreadsheet would run as a formula guarded); the JSON export is the exact record.
import type { CustodyEvent } from "@/db/schema/types";
import { csvRecord } from "@/lib/csv/write-csv";

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

export function custodyCsvHeader(): string {
  return csvRecord(CSV_COLUMNS);
}

export function custodyCsvRow(e: ExportedEvent): string {
  return csvRecord(CSV_COLUMNS.map((c) => e[c]));
}

export function custodyJsonEvent(e: ExportedEvent) {
  const { actorName, ...stored } = e;
  return { ...stored, occurredAt: e.occurredAt.toISOString(), actorName };
}
