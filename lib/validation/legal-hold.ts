// Setting or releasing a job's legal hold: both need a reason (the case, claim or request it concerns,
// or why it is over), written into the custody log with the act. The form adds a confirmation for a
// release, since deletion becomes possible again. Browser-safe: the form and PUT /api/jobs/:id/hold
// validate with the same schema.
import { z } from "zod";
import { plainText } from "./common";

export const LEGAL_HOLD_REASON_MAX = 500;

const reason = (hold: boolean) =>
  plainText(LEGAL_HOLD_REASON_MAX).min(1, hold ? "Give the reason for the hold (case, claim or request reference)" : "Say why the hold is released (case closed, claim settled, request withdrawn)");

export const legalHoldInput = z.discriminatedUnion("hold", [
  z.object({ hold: z.literal(true), reason: reason(true) }).strict(),
  z.object({ hold: z.literal(false), reason: reason(false) }).strict(),
]);
export type LegalHoldInput = z.infer<typeof legalHoldInput>;

/** The release form: the reason, and a tick that the person knows deletion becomes possible again. */
export const releaseHoldForm = z.object({
  reason: reason(false),
  confirm: z.boolean().refine((v) => v, "Tick this to confirm the release"),
});
export const setHoldForm = z.object({ reason: reason(true) });
