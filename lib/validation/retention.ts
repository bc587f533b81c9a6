// Retention settings (PUT /api/retention) and the owner's confirmation of a disposal
// (POST /api/retention/jobs/:id/disposal). Browser-safe: the disposal page validates with the same schemas.
import { z } from "zod";
import { plainText } from "./common";
import { MAX_RETENTION_DAYS } from "@/lib/retention/retention-period";

const days = z
  .number({ error: "Give a number of days" })
  .int("Whole days only")
  .min(1, "At least 1 day")
  .max(MAX_RETENTION_DAYS, `At most ${MAX_RETENTION_DAYS} days`)
  .nullable();

export const retentionInput = z.discriminatedUnion("target", [
  z.object({ target: z.literal("organisation"), days }).strict(),
  z.object({ target: z.literal("client"), id: z.string().uuid("Unknown client"), days }).strict(),
  z.object({ target: z.literal("job"), id: z.string().uuid("Unknown job"), days }).strict(),
]);
export type RetentionInput = z.infer<typeof retentionInput>;

export const disposalInput = z.object({ confirmTitle: plainText(300).min(1, "Type the job's title to confirm") }).strict();

/** GET /api/retention?horizonDays=: what falls due within that many days */
export const disposalsQuery = z.object({ horizonDays: z.coerce.number().int().min(0).max(3650).default(90) });
/** POST /api/retention/jobs/:id/final-package: no fields */
export const finalPackageInput = z.object({}).strict();
