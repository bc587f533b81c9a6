// GET /api/finding-categories[?assetKind=&archived=1]: the organisation's categories; POST: add one
import { z } from "zod";
import { withOrg, readJson, parseQuery, created, ok } from "@/lib/api/with-org";
import { ASSET_KINDS } from "@/lib/validation/work";
import { categoryInput } from "@/lib/findings/category-input";
import { createCategory, listCategories } from "@/lib/findings/finding-categories";

const query = z.object({ assetKind: z.enum(ASSET_KINDS).optional(), archived: z.enum(["0", "1"]).default("0") });

export const GET = withOrg({ permission: "findings.read" }, async ({ req, member }) => {
  const q = parseQuery(req, query);
  return ok(await listCategories(member.organisationId, { assetKind: q.assetKind, archived: q.archived === "1" }));
});

export const POST = withOrg({ permission: "findings.write" }, async ({ req, member }) =>
  created(await createCategory(member.organisationId, await readJson(req, categoryInput))),
);
