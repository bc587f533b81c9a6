// GET /api/share-links/:id: one link with its opens, downloads and refused passcodes;
// DELETE: revoke it (effective from the very next request; nothing is erased)
import { withOrg, idParam, ok } from "@/lib/api/with-org";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { getShareLinkOrThrow } from "@/lib/sharing/list-share-links";
import { revokeShareLink } from "@/lib/sharing/revoke-share-link";

type P = { id: string };

export const GET = withOrg<P>({ permission: "shares.manage" }, async ({ params, member }) =>
  ok(await getShareLinkOrThrow(member.organisationId, idParam(params.id, "Share link not found"))),
);

export const DELETE = withOrg<P>({ permission: "shares.manage" }, async ({ req, params, member }) =>
  ok(await revokeShareLink(member, idParam(params.id, "Share link not found"), requestFacts(req))),
);
