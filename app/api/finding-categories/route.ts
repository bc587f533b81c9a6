// GET /api/finding-categories[?assetKind=&archived=1]: the organisation's categories; POST: add one
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { categoriesQuery, categoryInput } from "@/lib/findings/category-input";
import { createCategory, listCategories } from "@/lib/findings/finding-categories";

export const GET = withOrg({ permission: "findings.read" }, async ({ req, member }) => {
  const q = parseQuery(req, categoriesQuery);
  return ok(await listCategories(member.organisationId, { assetKind: q.assetKind, archived: q.archived === "1" }));
});

export const POST = withOrg({ permission: "findings.write" }, async ({ req, member }) =>
  created(await createCategory(member.organisationId, await readJson(req, categoryInput))),
);
