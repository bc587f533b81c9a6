/**
 * The one CSV writer (custody log export, range check export). CSV as RFC 4180 ("Common Format and
 * MIME Type for CSV Files", section 2) writes it: records end in CRLF, fields are separated by commas,
 * a field in double quotes may hold commas, CR, LF and double quotes, and a double quote inside it is
 * written twice.
 *
 * Quoting: "needed" quotes a field only when it holds a comma, a double quote, CR or LF (rule 6);
 * "all-text" quotes every text field, needed or not (RFC 4180 allows it), so a reader never has to
 * guess. Numbers are written bare either way, so spreadsheets read them as numbers; NaN and Infinity
 * are written as an empty field (a bug upstream; "NaN" is not a figure). Dates are written as
 * ISO 8601 UTC, other objects as JSON.
 *
 * Spreadsheets run a cell that starts with = + - or @ as a formula; a note typed as "=HYPERLINK(...)"
 * would otherwise run on the office PC that opens the export. OWASP ("CSV Injection"; ASVS 5.0
 * requirement 1.2.10) asks for RFC 4180 escaping plus a single quote before a leading = + - @ tab or
 * NUL; a leading carriage return is guarded too, because some spreadsheets strip it and then see the
 * formula behind it (common practice, no published source). Every text field is guarded, numbers are
 * not: a bare -2.61955 is data.
 */

export type CsvValue = string | number | boolean | Date | object | null | undefined;

export type CsvQuoting = "needed" | "all-text";

const FORMULA_START = /^[=+\-@\t\r\0]/;
const NEEDS_QUOTES = /[",\r\n]/;

/** Text that a spreadsheet would run as a formula gets a leading single quote. */
export function guardFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

function textOf(value: Exclude<CsvValue, number | null | undefined>): string {
  if (typeof value === "string") return value;
  if (value instanceof Date) return value.toISOString();
  if (typeof value === "object") return JSON.stringify(value);
  return String(value);
}

/** One field: numbers bare, text guarded and quoted (see CsvQuoting), missing values empty. */
export function csvField(value: CsvValue, quoting: CsvQuoting = "needed"): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  const text = guardFormula(textOf(value));
  return quoting === "all-text" || NEEDS_QUOTES.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** One record ended by CRLF (RFC 4180 rule 2; the last record of a file is ended too). */
export function csvRecord(values: readonly CsvValue[], quoting: CsvQuoting = "needed"): string {
  return `${values.map((v) => csvField(v, quoting)).join(",")}\r\n`;
}

/** A whole file: header record, then data records; every record must have the header's width. */
export function csvDocument(header: readonly string[], rows: readonly (readonly CsvValue[])[], quoting: CsvQuoting = "needed"): string {
  const width = header.length;
  for (const row of rows) {
    if (row.length !== width) throw new Error(`CSV record has ${row.length} fields, the header has ${width}`);
  }
  return [header, ...rows].map((r) => csvRecord(r, quoting)).join("");
}
