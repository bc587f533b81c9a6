// GET /api/range-checks/chart?flightId=&by=: slant ranges per link event, grouped by one setup variable
import { z } from "zod";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { flightFilter } from "@/lib/validation/range-checks";
import { CHART_DIMENSIONS, aggregateRangeChart } from "@/lib/range-checks/aggregate-range-chart";
import { loadRangeChartRows } from "@/lib/range-checks/load-range-check-export";

const query = flightFilter.extend({ by: z.enum(CHART_DIMENSIONS, { message: "Compare by camera orientation, antenna orientation, aircraft or site" }).default("cameraOrientation") });

export const GET = withOrg({ permission: "range.read" }, async ({ req, member }) => {
  const { flightId, by } = parseQuery(req, query);
  return ok(aggregateRangeChart(await loadRangeChartRows(member.organisationId, flightId), by));
});
