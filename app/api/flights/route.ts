// GET /api/flights: list the organisation's flights (?jobId= ?siteId= ?clientId= ?pilotId=); POST /api/flights: log one
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { flightInput } from "@/lib/validation/work";
import { flightListQuery } from "@/lib/validation/list-filters";
import { createFlight, listFlights } from "@/lib/work/flights";

export const GET = withOrg({ permission: "workspace.read" }, async ({ req, member }) =>
  ok(await listFlights(member.organisationId, parseQuery(req, flightListQuery))),
);

export const POST = withOrg({ permission: "flights.write" }, async ({ req, member }) =>
  created(await createFlight(member, await readJson(req, flightInput))),
);
