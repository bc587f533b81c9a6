/**
 * CSV as RFC 4180 ("Common Format and MIME Type for CSV Files", section 2) writes it: records end in
 * CRLF, fields are separated by commas, a field in double quotes may hold commas, CR, LF and double
 * quotes, and a double quote inside it is written twice.
 *
 * Every text field is quoted, needed or not (RFC 4180 allows it), so a reader never has to guess;
 * numbers are written bare so spreadsheets read them as numbers.
 *
 * Spreadsheets run a cell that starts with = + - or @ as a formula; a note typed as "=HYPERLINK(...)"
 * would otherwise run on the office PC that opens the export. OWASP ASVS 5.0 requirement 1.2.10 asks
 * for RFC 4180 escaping plus a single quote before a leading = + - @ tab or NUL; a leading carriage
 * return is guarded too, because some spreadsheets strip it and then see the formula behind it.
 */

export type CsvValue = string | number | null | undefined;

const FORMULA_START = /^[=+\-@\t\r\0]/;

/** Text that a spreadsheet would run as a formula gets a leading single quote. */
export function guardFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** One field: numbers bare, text guarded and quoted, missing values empty. */
export function csvField(value: CsvValue): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") {
    // NaN or Infinity in an export is a bug upstream; an empty cell is honest, "NaN" is not a figure.
    if (!Number.isFinite(value)) return "";
    return String(value);
  }
  return `"${guardFormula(value).replace(/"/g, '""')}"`;
}

export function csvRecord(values: readonly CsvValue[]): string {
  return values.map(csvField).join(",");
}

/** A whole file: header record, then data records, every record (the last too) ended by CRLF. */
export function csvDocument(header: readonly string[], rows: readonly (readonly CsvValue[])[]): string {
  const width = header.length;
  for (const row of rows) {
    if (row.length !== width) throw new Error(`CSV record has ${row.length} fields, the header has ${width}`);
  }
  return [header, ...rows].map((r) => `${csvRecord(r)}\r\n`).join("");
}
