// GET /api/range-checks?flightId=: list range checks (one flight, or all); POST /api/range-checks: log one
import { withOrg, readJson, parseQuery, listQuery, created, ok } from "@/lib/api/with-org";
import { flightFilter, rangeCheckCreateInput } from "@/lib/validation/range-checks";
import { createRangeCheck, listRangeChecks } from "@/lib/range-checks/range-checks";

export const GET = withOrg({ permission: "range.read" }, async ({ req, member }) =>
  ok(await listRangeChecks(member.organisationId, parseQuery(req, listQuery.extend(flightFilter.shape)))),
);

export const POST = withOrg({ permission: "rangechecks.write" }, async ({ req, member }) =>
  created(await createRangeCheck(member, await readJson(req, rangeCheckCreateInput))),
);
