// GET/PATCH/DELETE /api/flights/:id: read (with job, site and pilot), edit, archive one flight
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { flightPatch } from "@/lib/validation/work";
import { getFlightOrThrow, updateFlight } from "@/lib/filing/flights";

type P = { id: string };
const NOT_FOUND = "Flight not found";

export const GET = withOrg<P>({ permission: "workspace.read" }, async ({ params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  await requireInScope(member, "flight", id, NOT_FOUND);
  return ok(await getFlightOrThrow(member.organisationId, id));
}
);

export const PATCH = withOrg<P>({ permission: "flights.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  return ok(await updateFlight(member.organisationId, id, await readJson(req, flightPatch)));
});

export const DELETE = withOrg<P>({ permission: "flights.write" }, async ({ params, member }) =>
  ok(await updateFlight(member.organisationId, idParam(params.id, NOT_FOUND), { archived: true })),
);
