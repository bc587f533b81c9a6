// Asking for an evidence package (POST /api/evidence-packages) and letting a share link carry one
// (PUT /api/evidence-packages/:id/share). Browser-safe: the job page's form validates with the same schema.
import { z } from "zod";
import { optionalText } from "./common";

/** The purpose of the package the disposal page offers (lib/retention/dispose-job.ts keeps it). */
export const FINAL_PACKAGE_PURPOSE = "Final package before disposal";

export const PACKAGE_MAX_CHOSEN_RECORDINGS = 1000;

export const packageRequestInput = z
  .object({
    jobId: z.string().uuid("Unknown job"),
    flightId: z.string().uuid("Unknown flight").nullish(),
    recordingIds: z.array(z.string().uuid("Unknown recording")).min(1, "Choose at least one recording").max(PACKAGE_MAX_CHOSEN_RECORDINGS, `At most ${PACKAGE_MAX_CHOSEN_RECORDINGS} recordings`).nullish(),
    // the final package before disposal is asked for on the disposal page only (it outlives the disposal)
    purpose: optionalText(300).refine((p) => p !== FINAL_PACKAGE_PURPOSE, "This purpose is kept for the final package of the disposal page"),
  })
  .strict();
export type PackageRequestInput = z.infer<typeof packageRequestInput>;

export const packageShareInput = z.object({ shareLinkId: z.string().uuid("Unknown share link").nullable() }).strict();

/** GET /api/evidence-packages?jobId= */
export const packagesQuery = z.object({ jobId: z.string().uuid("Ask for the packages of a job (jobId)") });
