// GET /api/share-links/options?jobId=: what can be shared from a job (recordings, findings, approved
// report versions), for the share form
import { z } from "zod";
import { withOrg, parseQuery, ok } from "@/lib/api/with-org";
import { ApiError } from "@/lib/api/errors";
import { listShareOptions } from "@/lib/sharing/list-share-options";

const query = z.object({ jobId: z.string().optional() });

export const GET = withOrg({ permission: "shares.manage" }, async ({ req, member }) => {
  const { jobId } = parseQuery(req, query);
  if (!jobId || !z.string().uuid().safeParse(jobId).success) throw new ApiError("not_found", "Job not found");
  return ok(await listShareOptions(member.organisationId, jobId));
});
