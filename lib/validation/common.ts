// Building blocks shared by the client forms and the route handlers (the same schema validates both).
import { z } from "zod";

// PostgreSQL text cannot hold the NUL character: refuse it here (422) rather than fail in the database (500).
const NO_NUL = [(s: string) => !s.includes("\u0000"), "Contains a NUL character"] as const;
export const plainText = (max: number) => z.string().trim().max(max, `At most ${max} characters`).refine(...NO_NUL);

export const name = (max = 120) => z.string().trim().min(1, "Required").max(max, `At most ${max} characters`).refine(...NO_NUL);
export const optionalText = (max = 2000) =>
  plainText(max)
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
