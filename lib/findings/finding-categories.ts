// Finding categories of an organisation: listed with the ones for the asset at hand first,
// created, renamed, archived (never erased: findings keep pointing at them), and the default set
// restored without touching what the organisation already has.
import "server-only";
import { and, asc, eq, isNotNull, isNull, or, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { findingCategories, findings } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { DEFAULT_CATEGORIES } from "./default-categories";
import type { CategoryInput, CategoryPatch } from "./category-input";

type AssetKind = NonNullable<CategoryInput["assetKind"]>;

const columns = {
  id: findingCategories.id,
  name: findingCategories.name,
  assetKind: findingCategories.assetKind,
  archivedAt: findingCategories.archivedAt,
  createdAt: findingCategories.createdAt,
  updatedAt: findingCategories.updatedAt,
};

export async function listCategories(organisationId: string, opts: { assetKind?: AssetKind; archived?: boolean } = {}) {
  const rows = await db()
    .select({ ...columns, findingCount: db().$count(findings, and(eq(findings.categoryId, findingCategories.id), isNull(findings.deletedAt))) })
    .from(findingCategories)
    .where(
      and(
        eq(findingCategories.organisationId, organisationId),
        opts.archived ? isNotNull(findingCategories.archivedAt) : isNull(findingCategories.archivedAt),
        opts.assetKind ? or(isNull(findingCategories.assetKind), eq(findingCategories.assetKind, opts.assetKind)) : undefined,
      ),
    )
    // the asset's own categories first, then the general ones, each alphabetically
    .orderBy(sql`${findingCategories.assetKind} is null`, asc(findingCategories.name));
  return { items: rows, total: rows.length };
}

function uniqueViolation(err: unknown): boolean {
  const e = err as { code?: string; cause?: { code?: string } };
  return e?.code === "23505" || e?.cause?.code === "23505";
}

export async function createCategory(organisationId: string, input: CategoryInput) {
  try {
    const [row] = await db()
      .insert(findingCategories)
      .values({ organisationId, name: input.name, assetKind: input.assetKind ?? null })
      .returning(columns);
    return row;
  } catch (err) {
    if (uniqueViolation(err)) throw new ApiError("conflict", `A category named "${input.name}" exists already`, { name: ["This name is taken"] });
    throw err;
  }
}

export async function updateCategory(organisationId: string, id: string, input: CategoryPatch) {
  const { archived, ...rest } = input;
  try {
    const [row] = await db()
      .update(findingCategories)
      .set({ ...rest, ...(archived === undefined ? {} : { archivedAt: archived ? new Date() : null }), updatedAt: new Date() })
      .where(and(eq(findingCategories.id, id), eq(findingCategories.organisationId, organisationId)))
      .returning(columns);
    if (!row) throw notFound("Category not found");
    return row;
  } catch (err) {
    if (uniqueViolation(err)) throw new ApiError("conflict", `A category named "${input.name}" exists already`, { name: ["This name is taken"] });
    throw err;
  }
}

/** Adds the default categories the organisation lacks; existing ones (archived or not) stay as they are. */
export async function restoreDefaultCategories(organisationId: string) {
  const added = await db()
    .insert(findingCategories)
    .values(DEFAULT_CATEGORIES.map((c) => ({ ...c, organisationId })))
    .onConflictDoNothing({ target: [findingCategories.organisationId, findingCategories.name] })
    .returning({ id: findingCategories.id });
  return { added: added.length };
}
