// GET/PATCH/DELETE /api/sites/:id: read, edit, archive one site (DELETE archives; nothing is erased)
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { sitePatch } from "@/lib/validation/work";
import { getSiteOrThrow, updateSite } from "@/lib/filing/sites";

type P = { id: string };
const NOT_FOUND = "Site not found";

export const GET = withOrg<P>({ permission: "workspace.read" }, async ({ params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  await requireInScope(member, "site", id, NOT_FOUND);
  return ok(await getSiteOrThrow(member.organisationId, id));
}
);

export const PATCH = withOrg<P>({ permission: "sites.write" }, async ({ req, params, member }) => {
  const id = idParam(params.id, NOT_FOUND);
  return ok(await updateSite(member.organisationId, id, await readJson(req, sitePatch)));
});

export const DELETE = withOrg<P>({ permission: "sites.write" }, async ({ params, member }) =>
  ok(await updateSite(member.organisationId, idParam(params.id, NOT_FOUND), { archived: true })),
);
