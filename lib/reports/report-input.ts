// The inputs of the report routes.
import { z } from "zod";

/** GET /api/reports?jobId= */
export const reportsQuery = z.object({ jobId: z.string().uuid("Ask for the reports of a job (jobId)") });
/** POST /api/reports: build a new version of the job's report */
export const reportBuildInput = z.object({ jobId: z.string().uuid("Unknown job") }).strict();
