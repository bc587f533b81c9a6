// GET /api/custody[?recordingId= | ?jobId=]: a custody trail, or the organisation's whole log, newest first
// by default, filtered by kind of event (eventType=a,b), person (actor=<user id>|system|share) and UTC
// dates (from=, to=), one keyset page at a time (cursor = the previous answer's nextCursor; pageSize <= 200)
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { listCustodyEvents } from "@/lib/custody/list-custody-events";
import { custodyListQuery } from "@/lib/validation/custody-list";

export const GET = withOrg({ permission: "custody.read" }, async ({ req, member }) => {
  const q = parseQuery(req, custodyListQuery);
  return ok(
    await listCustodyEvents(
      member.organisationId,
      { recordingId: q.recordingId, jobId: q.jobId, eventTypes: q.eventType, actor: q.actor, from: q.from, to: q.to },
      { order: q.order, cursor: q.cursor, pageSize: q.pageSize },
    ),
  );
});
