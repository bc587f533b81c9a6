// GET /api/sites: list the organisation's sites (?clientId=, ?assetKind=); POST /api/sites: create one
import { sites } from "@/db/schema";
import { clientScopeCondition } from "@/lib/auth/client-scope";
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { siteInput } from "@/lib/validation/work";
import { siteListQuery } from "@/lib/validation/list-filters";
import { createSite, listSites } from "@/lib/filing/sites";

export const GET = withOrg({ permission: "workspace.read" }, async ({ req, member }) =>
  ok(await listSites(member.organisationId, parseQuery(req, siteListQuery), clientScopeCondition(member, sites.clientId))),
);

export const POST = withOrg({ permission: "sites.write" }, async ({ req, member }) =>
  created(await createSite(member.organisationId, await readJson(req, siteInput))),
);
