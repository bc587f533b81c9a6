// PATCH /api/flights/:id/order: the pilot's order of the flight's files ({ recordingIds: [...] },
// every file exactly once), or back to the recorder's order ({ recorderOrder: true })
import { flightOrderInput } from "@/lib/flight-timeline/flight-order-input";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { FLIGHT_NOT_FOUND, loadFlightTimeline } from "@/lib/flight-timeline/load-flight-timeline";
import { setFlightOrder } from "@/lib/flight-timeline/set-flight-order";

type P = { id: string };

export const PATCH = withOrg<P>({ permission: "recordings.order" }, async ({ req, params, member }) => {
  const id = idParam(params.id, FLIGHT_NOT_FOUND);
  await setFlightOrder(member.organisationId, id, await readJson(req, flightOrderInput));
  return ok(await loadFlightTimeline(member.organisationId, id));
});
