// GET/HEAD /api/evidence-packages/:id/download: the built package as a ZIP download, with Range (a cut
// download resumes); one custody event per download from byte 0
import { withOrg, idParam } from "@/lib/api/with-org";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { loadServablePackage, servePackageDownload } from "@/lib/evidence-packages/serve-evidence-package";

type P = { id: string };

const handle = withOrg<P>({ permission: "packages.download" }, async ({ req, params, member }) => {
  const file = await loadServablePackage(member.organisationId, idParam(params.id, "Evidence package not found"));
  return servePackageDownload(req, file, { userId: member.userId, role: member.role }, requestFacts(req));
});

export const GET = handle;
export const HEAD = handle;
