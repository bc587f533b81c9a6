// GET /api/retention[?horizonDays=]: the organisation's default retention period, its clients' own, and the closed jobs
// falling due for disposal within the horizon (default 90 days); PUT {target, id?, days}: set the
// organisation's default or a client's or a job's own period (days null clears an override)
import { withOrg, readJson, parseQuery, ok } from "@/lib/api/with-org";
import { disposalsQuery, retentionInput } from "@/lib/validation/retention";
import { listDisposals } from "@/lib/retention/list-disposals";
import { listClientRetention, readRetentionDefaults, setRetention } from "@/lib/retention/set-retention";


export const GET = withOrg({ permission: "retention.manage" }, async ({ req, member }) => {
  const { horizonDays } = parseQuery(req, disposalsQuery);
  const items = await listDisposals({ organisationId: member.organisationId, horizonDays }, new Date());
  return ok({ ...(await readRetentionDefaults(member.organisationId)), clients: await listClientRetention(member.organisationId), horizonDays, items, total: items.length });
});

export const PUT = withOrg({ permission: "retention.manage" }, async ({ req, member }) => ok(await setRetention(member.organisationId, await readJson(req, retentionInput))));
