// Building blocks shared by the client forms and the route handlers (the same schema validates both).
import { z } from "zod";

// The one rule for text that crosses a boundary (API bodies, query strings, upload metadata), so a
// bad character is a 422 naming the field instead of a database error:
//   - NUL: PostgreSQL text cannot hold it;
//   - an unpaired UTF-16 surrogate (\ud800 alone): not a Unicode scalar value, so it has no UTF-8
//     form (RFC 3629 section 3) and the database refuses the bytes;
//   - other C0 controls, DEL and C1 controls: invisible, and they break logs, CSV and e-mail headers.
// Tab, line feed and carriage return are allowed in multi-line fields (notes, scope, reasons) only.
// In a `u` regex a surrogate range matches only surrogates that are not part of a pair.
const SINGLE_LINE_BAD = /[\u0000-\u001f\u007f-\u009f]|[\ud800-\udfff]/u;
const MULTI_LINE_BAD = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]|[\ud800-\udfff]/u;

/** Why a text cannot be accepted, or null when it can. */
export function textProblem(s: string, multiline = false): string | null {
  const m = (multiline ? MULTI_LINE_BAD : SINGLE_LINE_BAD).exec(s);
  if (!m) return null;
  const code = m[0].codePointAt(0)!;
  const hex = `U+${code.toString(16).toUpperCase().padStart(4, "0")}`;
  if (code === 0) return "Contains a NUL character (U+0000)";
  if (code >= 0xd800 && code <= 0xdfff) return `Contains a broken character (unpaired surrogate ${hex})`;
  if (!multiline && (code === 0x09 || code === 0x0a || code === 0x0d)) return "Must be a single line (no tabs or line breaks)";
  return `Contains a control character (${hex})`;
}

/** A zod check applying textProblem: `z.string().superRefine(textRule())`. */
export const textRule =
  (multiline = false) =>
  (s: string, ctx: z.RefinementCtx) => {
    const problem = textProblem(s, multiline);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  };

/** Any text field: the text rule, then trimmed; `multiline` lets tabs and line breaks through. */
export const safeText = (multiline = false) => z.string().superRefine(textRule(multiline)).trim();

export const plainText = (max: number, multiline = false) => safeText(multiline).max(max, `At most ${max} characters`);

export const name = (max = 120) => safeText().min(1, "Required").max(max, `At most ${max} characters`);
export const optionalText = (max = 2000, multiline = false) =>
  plainText(max, multiline)
    .optional()
    .nullable()
    .transform((v) => (v ? v : null));
export const optionalEmail = z
  .union([z.literal(""), z.string().trim().toLowerCase().email("Not an e-mail address").max(320)])
  .optional()
  .nullable()
  .transform((v) => (v ? v : null));
export const uuid = z.string().uuid("Choose one from the list");
export const optionalUuid = z
  .union([z.literal(""), z.string().uuid("Choose one from the list")])
  .optional()
  .nullable()
  .transform((v) => (v ? v : null));
/** A calendar date written as ISO 8601 (YYYY-MM-DD) that exists: Date.parse alone accepts 2026-02-30. */
export function isRealIsoDate(s: string): boolean {
  const t = Date.parse(`${s}T00:00:00Z`);
  return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === s;
}
export const isoDate = z
  .string()
  // abort: a malformed date gets one message, not also "not a real date"
  .regex(/^(19|20|21)\d{2}-\d{2}-\d{2}$/, { message: "Use the form 2026-03-14 (years 1900 to 2199)", abort: true })
  .refine(isRealIsoDate, "Not a real date");
export const optionalIsoDate = z
  .union([z.literal(""), isoDate])
  .optional()
  .nullable()
  .transform((v) => (v ? v : null));

/** A number typed into a form (string) or sent as JSON (number); empty means "not given". */
export const optionalNumber = (min: number, max: number, what: string) =>
  z.preprocess(
    (v) => (v === "" || v === undefined || v === null ? null : typeof v === "string" ? Number(v) : v),
    z.number({ message: `${what} must be a number` }).finite(`${what} must be a number`).min(min, `${what} must be at least ${min}`).max(max, `${what} must be at most ${max}`).nullable(),
  );
export const latitude = optionalNumber(-90, 90, "Latitude");
export const longitude = optionalNumber(-180, 180, "Longitude");
