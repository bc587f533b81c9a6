// PATCH/DELETE /api/finding-categories/:id: rename, re-file or archive a category (DELETE archives; findings keep it)
import { withOrg, readJson, idParam, ok } from "@/lib/api/with-org";
import { categoryPatch } from "@/lib/findings/category-input";
import { updateCategory } from "@/lib/findings/finding-categories";

type P = { id: string };

export const PATCH = withOrg<P>({ permission: "findings.write" }, async ({ req, params, member }) =>
  ok(await updateCategory(member.organisationId, idParam(params.id, "Category not found"), await readJson(req, categoryPatch))),
);

export const DELETE = withOrg<P>({ permission: "findings.write" }, async ({ params, member }) =>
  ok(await updateCategory(member.organisationId, idParam(params.id, "Category not found"), { archived: true })),
);
