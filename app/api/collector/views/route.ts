// GET /api/collector/views?recordingId=: who watched a recording, when, and how playback went
import { z } from "zod";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { listPlaybackViews } from "@/lib/playback-analytics/list-playback-views";

const query = z.object({ recordingId: z.string().uuid() });

// who watched is the crew's business: a client account is refused (views.read)
export const GET = withOrg({ permission: "views.read" }, async ({ req, member }) =>
  ok(await listPlaybackViews(member.organisationId, parseQuery(req, query).recordingId)),
);
