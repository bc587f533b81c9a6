// Server-side list helper: organisation filter first, then search, archived toggle, whitelisted sort, keyset paging.
import { and, asc, desc, ilike, isNotNull, isNull, or, sql, type SQL, type AnyColumn } from "drizzle-orm";
import type { z } from "zod";
import type { listQuery } from "./with-org";
import type { KeyPart } from "./keyset";

export type ListParams = z.infer<typeof listQuery>;

export function listWhere(opts: {
  orgFilter: SQL;
  params: ListParams;
  searchColumns: AnyColumn[];
  archivedColumn?: AnyColumn;
  extra?: (SQL | undefined)[];
}): SQL {
  const parts: (SQL | undefined)[] = [opts.orgFilter, ...(opts.extra ?? [])];
  if (opts.archivedColumn) parts.push(opts.params.archived === "1" ? isNotNull(opts.archivedColumn) : isNull(opts.archivedColumn));
  const q = opts.params.q?.trim();
  if (q) {
    // escape LIKE wildcards so a search for "50%" means the text "50%"
    const pattern = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    parts.push(or(...opts.searchColumns.map((c) => ilike(c, pattern))));
  }
  return and(...parts)!;
}

export function listOrder(params: ListParams, sortable: Record<string, AnyColumn | SQL>, fallback: SQL): SQL[] {
  const col = params.sort ? sortable[params.sort] : undefined;
  if (!col) return [fallback];
  return [params.dir === "desc" ? desc(col) : asc(col)];
}

export const pageOf = (params: ListParams) => ({ limit: params.pageSize, offset: (params.page - 1) * params.pageSize });

/** A sort key a list offers: its expression and SQL type; `notNull` when the column can never be NULL. */
export type SortKey = Omit<KeyPart, "dir">;

/**
 * The keyset ordering of a list request: the whitelisted `sort` in `dir`, then the row id as the last
 * tie-break (same direction); without a known sort, the list's own default keys (which end with an id).
 * `ordering` names it, so a cursor made for one order is refused by another.
 */
export function keysetOf(params: Pick<ListParams, "sort" | "dir">, sortable: Record<string, SortKey>, fallback: KeyPart[], id: AnyColumn): { ordering: string; keys: KeyPart[] } {
  const chosen = params.sort ? sortable[params.sort] : undefined;
  if (!chosen) return { ordering: "default", keys: fallback };
  return { ordering: `${params.sort}:${params.dir}`, keys: [{ ...chosen, dir: params.dir }, { expr: id, dir: params.dir, type: "uuid", notNull: true }] };
}

/** LIMIT/OFFSET of a keyset page: one row more than the page says whether another follows. */
export const keysetPage = (params: ListParams) => ({ limit: params.pageSize + 1, offset: params.cursor ? 0 : (params.page - 1) * params.pageSize });
export const totalCount = sql<number>`count(*) over ()`.mapWith(Number);
