// A finding may only point at a category of its own organisation. An archived category stays valid
// for findings that already carry it, but is not offered for new ones.
import "server-only";
import { and, eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { findingCategories } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";

export async function checkCategory(tx: DbOrTx, organisationId: string, categoryId: string, allowArchived: boolean): Promise<void> {
  const [row] = await tx
    .select({ id: findingCategories.id, archivedAt: findingCategories.archivedAt })
    .from(findingCategories)
    .where(and(eq(findingCategories.id, categoryId), eq(findingCategories.organisationId, organisationId)));
  if (!row) throw new ApiError("unprocessable", "Some fields are not valid", { categoryId: ["Choose a category from the list"] });
  if (row.archivedAt && !allowArchived) throw new ApiError("unprocessable", "Some fields are not valid", { categoryId: ["This category is archived; choose another"] });
}
