// GET /api/range-checks/export.csv?flightId=: range checks of one flight (or all flights) as RFC 4180 CSV
import { withOrg, parseQuery } from "@/lib/api/with-org";
import { flightFilter } from "@/lib/validation/range-checks";
import { buildRangeChecksCsv } from "@/lib/range-checks/build-range-checks-csv";
import { loadRangeCheckExportRows } from "@/lib/range-checks/load-range-check-export";

export const GET = withOrg({ permission: "range.read" }, async ({ req, member }) => {
  const { flightId } = parseQuery(req, flightFilter);
  const csv = buildRangeChecksCsv(await loadRangeCheckExportRows(member.organisationId, flightId));
  const stamp = new Date().toISOString().slice(0, 10);
  const name = flightId ? `range-checks-flight-${flightId.slice(0, 8)}-${stamp}.csv` : `range-checks-all-flights-${stamp}.csv`;
  return new Response(csv, {
    headers: {
      // RFC 4180 section 3: text/csv with the optional header parameter saying the first record names the fields
      "Content-Type": "text/csv; charset=utf-8; header=present",
      "Content-Disposition": `attachment; filename="${name}"`,
      "Cache-Control": "no-store",
    },
  });
});
