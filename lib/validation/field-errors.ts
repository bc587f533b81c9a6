// A zod error as field messages keyed by path ("box.w", or "_" for the whole input): the shape of
// `fields` in every API error body (lib/api/errors.ts), and what forms show beside their fields.
import type { ZodError } from "zod";

export function fieldErrors(err: ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of err.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}
