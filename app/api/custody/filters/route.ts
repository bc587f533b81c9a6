// GET /api/custody/filters[?jobId=]: the choices of the custody log's filters: the organisation's people,
// and the recordings a log can be narrowed to (a job's, or the organisation's newest)
import { custodyFiltersQuery } from "@/lib/custody/custody-input";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { listCustodyPeople, listCustodyRecordingChoices } from "@/lib/custody/list-custody-events";


export const GET = withOrg({ permission: "custody.read" }, async ({ req, member }) => {
  const q = parseQuery(req, custodyFiltersQuery);
  const [people, recordings] = await Promise.all([listCustodyPeople(member.organisationId), listCustodyRecordingChoices(member.organisationId, q.jobId)]);
  return ok({ people, recordings });
});
