// GET /api/share-links?jobId=[&cursor=&pageSize=]: a job's share links with opens and downloads; POST: create one
// (the response carries the link's address once: Cairn keeps only its hash)
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { jobIdOrNull, shareLinkInput, shareLinksQuery } from "@/lib/sharing/share-link-input";
import { createShareLink } from "@/lib/sharing/create-share-link";
import { listJobShareLinks } from "@/lib/sharing/list-share-links";
import { ApiError } from "@/lib/api/errors";

export const GET = withOrg({ permission: "shares.manage" }, async ({ req, member }) => {
  const { jobId: asked, ...page } = parseQuery(req, shareLinksQuery);
  const jobId = jobIdOrNull(asked);
  if (!jobId) throw new ApiError("not_found", "Job not found");
  return ok(await listJobShareLinks(member.organisationId, jobId, page));
});

export const POST = withOrg({ permission: "shares.manage" }, async ({ req, member }) =>
  created(await createShareLink(member, await readJson(req, shareLinkInput), requestFacts(req))),
);
