// The inputs of the playback analytics routes.
import { z } from "zod";
import { keysetParams } from "@/lib/validation/page-params";

/** GET /api/collector/views: one recording's views, paged */
export const playbackViewsQuery = keysetParams(200).extend({ recordingId: z.string().uuid() });
