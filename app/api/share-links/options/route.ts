// GET /api/share-links/options?jobId=: what can be shared from a job (recordings, findings, approved
// report versions), for the share form
import { jobIdOrNull, shareOptionsQuery } from "@/lib/sharing/share-link-input";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { ApiError } from "@/lib/api/errors";
import { listShareOptions } from "@/lib/sharing/list-share-options";

export const GET = withOrg({ permission: "shares.manage" }, async ({ req, member }) => {
  const jobId = jobIdOrNull(parseQuery(req, shareOptionsQuery).jobId);
  if (!jobId) throw new ApiError("not_found", "Job not found");
  return ok(await listShareOptions(member.organisationId, jobId));
});
