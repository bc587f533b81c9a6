// GET /api/range-checks/chart?flightId=&by=: slant ranges per link event, grouped by one setup variable
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { rangeChartQuery } from "@/lib/validation/range-checks";
import { aggregateRangeChart } from "@/lib/range-checks/aggregate-range-chart";
import { loadRangeChartRows } from "@/lib/range-checks/load-range-check-export";

export const GET = withOrg({ permission: "range.read" }, async ({ req, member }) => {
  const { flightId, by } = parseQuery(req, rangeChartQuery);
  return ok(aggregateRangeChart(await loadRangeChartRows(member.organisationId, flightId), by));
});
