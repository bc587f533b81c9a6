// GET /api/range-checks/trace-events?flightId=: the link events the flight's signal traces show
import { traceEventsQuery } from "@/lib/validation/range-checks";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { listTraceEvents } from "@/lib/range-checks/list-trace-events";

export const GET = withOrg({ permission: "range.read" }, async ({ req, member }) =>
  ok(await listTraceEvents(member.organisationId, parseQuery(req, traceEventsQuery).flightId)),
);
