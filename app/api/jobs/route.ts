// GET /api/jobs: list the organisation's jobs (?status=planned,fieldwork ?clientId= ?siteId= ?pilotId= ?reviewerId=);
// POST /api/jobs: create one
import { sites } from "@/db/schema";
import { clientScopeCondition } from "@/lib/auth/client-scope";
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { jobInput } from "@/lib/validation/work";
import { jobListQuery } from "@/lib/validation/list-filters";
import { createJob, listJobs } from "@/lib/filing/jobs";

export const GET = withOrg({ permission: "workspace.read" }, async ({ req, member }) =>
  ok(await listJobs(member.organisationId, parseQuery(req, jobListQuery), clientScopeCondition(member, sites.clientId))),
);

export const POST = withOrg({ permission: "jobs.write" }, async ({ req, member }) =>
  created(await createJob(member.organisationId, await readJson(req, jobInput))),
);
