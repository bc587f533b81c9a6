// PUT /api/evidence-packages/:id/share {shareLinkId}: a share link of the same job carries the package
// (its holder may download it); {shareLinkId: null} takes it off every link
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { packageShareInput } from "@/lib/validation/evidence-packages";
import { setPackageShare } from "@/lib/evidence-packages/share-evidence-package";

type P = { id: string };

export const PUT = withOrg<P>({ permission: "shares.manage" }, async ({ req, params, member }) => {
  const id = idParam(params.id, "Evidence package not found");
  const { shareLinkId } = await readJson(req, packageShareInput);
  return ok(await setPackageShare(member, id, shareLinkId, requestFacts(req)));
});
