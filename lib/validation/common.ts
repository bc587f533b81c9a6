// Building blocks shared by the client forms and the route handlers (the same schema validates both).
import { z } from "zod";

export const name = (max = 120) => z.string().trim().min(1, "Required").max(max, `At most ${max} characters`);
export const optionalText = (max = 2000) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters`)
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
export const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use the form 2026-03-14").refine((s) => !Number.isNaN(Date.parse(s)), "Not a real date");
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
