// GET /api/evidence-packages?jobId=: a job's evidence packages, newest first; POST {jobId, flightId?,
// recordingIds?, purpose?}: ask for a new one (built in the background; refused first when it cannot be)
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { packageRequestInput, packagesQuery } from "@/lib/validation/evidence-packages";
import { requestEvidencePackage } from "@/lib/evidence-packages/request-evidence-package";
import { getPackageView, listJobPackages } from "@/lib/evidence-packages/list-evidence-packages";
import { getJobOrThrow } from "@/lib/filing/jobs";


export const GET = withOrg({ permission: "packages.download" }, async ({ req, member }) => {
  const { jobId } = parseQuery(req, packagesQuery);
  await getJobOrThrow(member.organisationId, jobId);
  const items = await listJobPackages(member.organisationId, jobId);
  return ok({ items, total: items.length });
});

export const POST = withOrg({ permission: "packages.build" }, async ({ req, member }) => {
  const input = await readJson(req, packageRequestInput);
  const asked = await requestEvidencePackage(member, input);
  return created(await getPackageView(member.organisationId, asked.id));
});
