// GET /api/evidence-packages/:id: one package's state, progress, size and SHA-256
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { getPackageView } from "@/lib/evidence-packages/list-evidence-packages";

type P = { id: string };

export const GET = withOrg<P>({ permission: "packages.download" }, async ({ params, member }) =>
  ok(await getPackageView(member.organisationId, idParam(params.id, "Evidence package not found"))),
);
