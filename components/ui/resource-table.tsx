"use client";
// A dense, sortable, filterable, paginated table over one of our JSON list endpoints
// (`{ items, total }`). Sorting, search and paging happen on the server.
import { useQuery, keepPreviousData } from "@tanstack/react-query";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from "@tanstack/react-table";
import { useState } from "react";
import { EmptyState } from "./empty-state";
import { fetchJson } from "@/components/fetch-json";

export type ListResult<T> = { items: T[]; total: number };

export function ResourceTable<T>({
  endpoint,
  columns,
  queryKey,
  empty,
  extraParams = {},
  searchLabel = "Filter",
  initialSort,
  showArchivedToggle = true,
  refetchInterval,
}: {
  endpoint: string;
  columns: ColumnDef<T, unknown>[];
  queryKey: string;
  empty: { title: string; next: string; action?: React.ReactNode };
  extraParams?: Record<string, string>;
  searchLabel?: string;
  initialSort?: SortingState;
  showArchivedToggle?: boolean;
  refetchInterval?: number | false;
}) {
  const [sorting, setSorting] = useState<SortingState>(initialSort ?? []);
  const [q, setQ] = useState("");
  const [page, setPage] = useState(1);
  const [archived, setArchived] = useState(false);
  const pageSize = 25;
  const params = new URLSearchParams({
    ...extraParams,
    page: String(page),
    pageSize: String(pageSize),
    ...(q ? { q } : {}),
    ...(sorting[0] ? { sort: sorting[0].id, dir: sorting[0].desc ? "desc" : "asc" } : {}),
    archived: archived ? "1" : "0",
  });
  const query = useQuery({
    queryKey: [queryKey, params.toString()],
    queryFn: () => fetchJson<ListResult<T>>(`${endpoint}?${params}`),
    placeholderData: keepPreviousData,
    refetchInterval,
  });
  const table = useReactTable({
    data: query.data?.items ?? [],
    columns,
    state: { sorting },
    manualSorting: true,
    onSortingChange: (u) => {
      setSorting(u);
      setPage(1);
    },
    getCoreRowModel: getCoreRowModel(),
  });
  const total = query.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">{searchLabel}</span>
          <input
            type="search"
            value={q}
            onChange={(e) => {
              setQ(e.target.value);
              setPage(1);
            }}
            className="min-h-10 w-64 rounded-md border border-line bg-white px-3 text-sm dark:bg-paper-2"
            placeholder="Type to filter"
          />
        </label>
        {showArchivedToggle && (
          <label className="flex min-h-10 items-center gap-2 text-sm">
            <input type="checkbox" checked={archived} onChange={(e) => setArchived(e.target.checked)} className="h-4 w-4" />
            Show archived
          </label>
        )}
        <span className="ml-auto text-sm text-ink-2" aria-live="polite">
          {query.isFetching ? "Loading…" : `${total} ${total === 1 ? "row" : "rows"}`}
        </span>
      </div>
      {query.isError ? (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          Could not load this list: {(query.error as Error).message}
        </p>
      ) : query.isLoading ? (
        <div className="h-32 animate-pulse rounded-md bg-paper-2" aria-label="Loading" />
      ) : total === 0 && !q ? (
        <EmptyState {...empty} />
      ) : (
        <div className="overflow-x-auto rounded-md border border-line">
          <table className="tabular w-full border-collapse text-sm">
            <thead className="bg-paper-2">
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((h) => {
                    const sorted = h.column.getIsSorted();
                    return (
                      <th
                        key={h.id}
                        scope="col"
                        aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                        className="border-b border-line px-3 py-2 text-left font-medium"
                      >
                        {h.column.getCanSort() ? (
                          <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:underline">
                            {flexRender(h.column.columnDef.header, h.getContext())}
                            <span aria-hidden className="text-xs">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                          </button>
                        ) : (
                          flexRender(h.column.columnDef.header, h.getContext())
                        )}
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.length === 0 ? (
                <tr>
                  <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-2">
                    Nothing matches “{q}”.
                  </td>
                </tr>
              ) : (
                table.getRowModel().rows.map((row) => (
                  <tr key={row.id} className="border-b border-line/60 last:border-0 hover:bg-paper-2/60">
                    {row.getVisibleCells().map((cell) => (
                      <td key={cell.id} className="px-3 py-2 align-top">
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    ))}
                  </tr>
                ))
              )}
            </tbody>
          </table>
        </div>
      )}
      {pages > 1 && (
        <nav className="flex items-center gap-2 text-sm" aria-label="Pages">
          <button type="button" className="rounded border border-line px-3 py-1 disabled:opacity-40" disabled={page <= 1} onClick={() => setPage(page - 1)}>
            Previous
          </button>
          <span className="tabular">
            Page {page} of {pages}
          </span>
          <button type="button" className="rounded border border-line px-3 py-1 disabled:opacity-40" disabled={page >= pages} onClick={() => setPage(page + 1)}>
            Next
          </button>
        </nav>
      )}
    </div>
  );
}
