// GET /api/flights/:id/timeline: the flight's files in order as one timeline, with the gaps between
// files and a summary of the link over the whole flight
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { FLIGHT_NOT_FOUND, loadFlightTimeline } from "@/lib/flight-timeline/load-flight-timeline";

type P = { id: string };

export const GET = withOrg<P>({ permission: "recordings.read" }, async ({ params, member }) => {
  const id = idParam(params.id, FLIGHT_NOT_FOUND);
  await requireInScope(member, "flight", id, FLIGHT_NOT_FOUND);
  return ok(await loadFlightTimeline(member.organisationId, id));
}
);
