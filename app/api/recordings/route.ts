// GET /api/recordings?flightId=|jobId=: the organisation's recordings of a flight or a job, filtered, sorted and paged
import { recordings } from "@/db/schema";
import { jobScopeCondition } from "@/lib/auth/client-scope";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { listRecordings, recordingListQuery } from "@/lib/recordings/list-recordings";

export const GET = withOrg({ permission: "recordings.read" }, async ({ req, member }) =>
  ok(await listRecordings(member.organisationId, parseQuery(req, recordingListQuery), jobScopeCondition(member, recordings.jobId))),
);
