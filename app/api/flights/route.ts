// GET /api/flights: list the organisation's flights (?jobId= ?siteId= ?clientId= ?pilotId=); POST /api/flights: log one
import { sites } from "@/db/schema";
import { clientScopeCondition } from "@/lib/auth/client-scope";
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { flightInput } from "@/lib/validation/work";
import { flightListQuery } from "@/lib/validation/list-filters";
import { createFlight, listFlights } from "@/lib/filing/flights";

export const GET = withOrg({ permission: "workspace.read" }, async ({ req, member }) =>
  ok(await listFlights(member.organisationId, parseQuery(req, flightListQuery), clientScopeCondition(member, sites.clientId))),
);

export const POST = withOrg({ permission: "flights.write" }, async ({ req, member }) =>
  created(await createFlight(member, await readJson(req, flightInput))),
);
