// GET /api/collector/views?recordingId=[&cursor=&pageSize=]: who watched a recording, when, and how playback went
import { playbackViewsQuery } from "@/lib/playback-analytics/playback-input";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { listPlaybackViews } from "@/lib/playback-analytics/list-playback-views";

// who watched is the crew's business: a client account is refused (views.read)
export const GET = withOrg({ permission: "views.read" }, async ({ req, member }) => {
  const { recordingId, ...page } = parseQuery(req, playbackViewsQuery);
  return ok(await listPlaybackViews(member.organisationId, recordingId, page));
});
