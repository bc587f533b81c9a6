// GET /api/range-checks/trace-events?flightId=: the link events the flight's signal traces show
import { z } from "zod";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { listTraceEvents } from "@/lib/range-checks/list-trace-events";

const query = z.object({ flightId: z.string().uuid("Choose a flight from the list") });

export const GET = withOrg({ permission: "range.read" }, async ({ req, member }) =>
  ok(await listTraceEvents(member.organisationId, parseQuery(req, query).flightId)),
);
