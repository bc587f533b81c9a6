// Server-side list helper: organisation filter first, then search, archived toggle, whitelisted sort, paging.
import { and, asc, desc, ilike, isNotNull, isNull, or, sql, type SQL, type AnyColumn } from "drizzle-orm";
import type { z } from "zod";
import type { listQuery } from "./with-org";

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
export const totalCount = sql<number>`count(*) over ()`.mapWith(Number);
