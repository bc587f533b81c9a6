// A finding category as an organisation edits it; the categories editor
// (components/findings/categories-editor.tsx) validates with the same schema.
import { z } from "zod";
import { ASSET_KINDS } from "@/lib/validation/work";
import { name } from "@/lib/validation/common";

export const categoryInput = z
  .object({
    name: name(80),
    // null (or "" from the form's "Any asset"): offered for every kind of asset
    assetKind: z.preprocess((v) => (v === "" ? null : v), z.enum(ASSET_KINDS).nullable().optional()),
  })
  .strict();
export const categoryPatch = categoryInput.partial().extend({ archived: z.boolean().optional() }).strict();

export type CategoryInput = z.infer<typeof categoryInput>;
export type CategoryPatch = z.infer<typeof categoryPatch>;

/** GET /api/finding-categories: filter by asset kind; archived=1 lists the archived ones */
export const categoriesQuery = z.object({ assetKind: z.enum(ASSET_KINDS).optional(), archived: z.enum(["0", "1"]).default("0") });
