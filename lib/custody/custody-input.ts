// The inputs of the custody routes.
import { z } from "zod";

/** GET /api/custody/export?format=&recordingId=|jobId= */
export const custodyExportQuery = z.object({
  format: z.enum(["csv", "json"]).default("csv"),
  recordingId: z.string().uuid().optional(),
  jobId: z.string().uuid().optional(),
});

/** GET /api/custody/filters?jobId=: the people and recordings to filter a log by */
export const custodyFiltersQuery = z.object({ jobId: z.string().uuid("Not a valid id").optional() });
