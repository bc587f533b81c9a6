// POST /api/retention/jobs/:id/final-package {}: the final evidence package offered before disposal
// (the whole job); it is kept to its own keep date when the job's other files are disposed of
import { finalPackageInput } from "@/lib/validation/retention";
import { withOrg, readJson, idParam, created } from "@/lib/api/with-org";
import { requestEvidencePackage } from "@/lib/evidence-packages/request-evidence-package";
import { getPackageView } from "@/lib/evidence-packages/list-evidence-packages";
import { FINAL_PACKAGE_PURPOSE } from "@/lib/retention/list-disposals";

type P = { id: string };

export const POST = withOrg<P>({ permission: "retention.manage" }, async ({ req, params, member }) => {
  const jobId = idParam(params.id, "Job not found");
  await readJson(req, finalPackageInput);
  const asked = await requestEvidencePackage(member, { jobId, purpose: FINAL_PACKAGE_PURPOSE });
  return created(await getPackageView(member.organisationId, asked.id));
});
