// PATCH /api/flights/:id/order: the pilot's order of the flight's files ({ recordingIds: [...] },
// every file exactly once), or back to the recorder's order ({ recorderOrder: true })
import { z } from "zod";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { FLIGHT_NOT_FOUND, loadFlightTimeline } from "@/lib/flight-timeline/load-flight-timeline";
import { setFlightOrder } from "@/lib/flight-timeline/set-flight-order";

type P = { id: string };
const body = z.union([
  z.object({ recordingIds: z.array(z.string().uuid()).min(1).max(1000) }).strict(),
  z.object({ recorderOrder: z.literal(true) }).strict(),
]);

export const PATCH = withOrg<P>({ permission: "recordings.order" }, async ({ req, params, member }) => {
  const id = idParam(params.id, FLIGHT_NOT_FOUND);
  await setFlightOrder(member.organisationId, id, await readJson(req, body));
  return ok(await loadFlightTimeline(member.organisationId, id));
});
