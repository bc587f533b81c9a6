"use client";
// A dense, sortable, filterable, paginated table over one of our JSON list endpoints
// (`{ items, total }`). Sorting, search and paging happen on the server.
//
// Narrow screens: a column may say `meta: { hideBelow: "md" }` (sm 640 px, md 768, lg 1024, xl 1280,
// 2xl 1536: Tailwind's breakpoints). Below that width its cells leave the row and each row gets a
// "Details" button (aria-expanded) that opens a row underneath listing the hidden columns as label and
// value. Key columns carry no hideBelow and always stay. `DataTable` is the same table over rows the
// caller already holds (share links, views, invitations) or fetches with its own filters (recordings).
import { countPhrase } from "@/components/ui/count-phrase";
import { useQuery, keepPreviousData } from "@tanstack/react-query";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type OnChangeFn, type Row, type RowData, type SortingState } from "@tanstack/react-table";
import { Fragment, useId, useState } from "react";
import { EmptyState } from "./empty-state";
import { fetchJson } from "@/components/fetch-json";

/** `nextCursor` is absent from lists that are not keyset-paged (members): their pager goes by the count alone. */
export type ListResult<T> = { items: T[]; total: number; totalIsLowerBound?: boolean; nextCursor?: string | null };
export type Breakpoint = "sm" | "md" | "lg" | "xl" | "2xl";

declare module "@tanstack/react-table" {
  interface ColumnMeta<TData extends RowData, TValue> {
    /** below this screen width the column moves into the row's details */
    hideBelow?: Breakpoint;
    /** classes for the column's cells and header (alignment, width, wrapping) */
    className?: string;
    /** the label in the row's details when the header is not plain text */
    label?: string;
  }
}

const ORDER: Breakpoint[] = ["sm", "md", "lg", "xl", "2xl"];
// whole class names, so Tailwind finds them in the source
const CELL_FROM: Record<Breakpoint, string> = {
  sm: "hidden sm:table-cell",
  md: "hidden md:table-cell",
  lg: "hidden lg:table-cell",
  xl: "hidden xl:table-cell",
  "2xl": "hidden 2xl:table-cell",
};
const ONLY_BELOW: Record<Breakpoint, string> = { sm: "sm:hidden", md: "md:hidden", lg: "lg:hidden", xl: "xl:hidden", "2xl": "2xl:hidden" };

const widest = (bps: (Breakpoint | undefined)[]): Breakpoint | null =>
  bps.reduce<Breakpoint | null>((w, b) => (b && (!w || ORDER.indexOf(b) > ORDER.indexOf(w)) ? b : w), null);

export function DataTable<T>({
  data,
  columns,
  sorting,
  onSortingChange,
  caption,
  getRowId,
  rowAttributes,
  noMatch = "Nothing matches.",
  testId,
}: {
  data: T[];
  columns: ColumnDef<T, unknown>[];
  sorting?: SortingState;
  onSortingChange?: OnChangeFn<SortingState>;
  /** read by screen readers: what the rows are */
  caption?: string;
  getRowId?: (row: T, index: number) => string;
  /** extra attributes on a row's <tr> (data-* for tests and links) */
  rowAttributes?: (row: T) => Record<string, string | undefined>;
  noMatch?: React.ReactNode;
  testId?: string;
}) {
  const [open, setOpen] = useState<Set<string>>(new Set());
  const baseId = useId();
  const table = useReactTable({
    data,
    columns,
    state: { sorting: sorting ?? [] },
    manualSorting: true,
    enableSorting: Boolean(onSortingChange),
    onSortingChange,
    getRowId,
    getCoreRowModel: getCoreRowModel(),
  });
  const leafColumns = table.getAllLeafColumns();
  const folding = widest(leafColumns.map((c) => c.columnDef.meta?.hideBelow));
  const span = leafColumns.length + (folding ? 1 : 0);
  const toggle = (id: string) =>
    setOpen((prev) => {
      const next = new Set(prev);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  const cellClass = (meta: { hideBelow?: Breakpoint; className?: string } | undefined) =>
    `${meta?.hideBelow ? CELL_FROM[meta.hideBelow] : ""} ${meta?.className ?? ""}`;
  const labelOf = (row: Row<T>, columnId: string) => {
    const col = table.getColumn(columnId)!;
    const h = col.columnDef.header;
    return col.columnDef.meta?.label ?? (typeof h === "string" ? h : columnId);
  };

  return (
    // never wider than the screen less the page's side padding: a wide table scrolls in its own box; "relative"
    // keeps the screen-reader-only header texts (absolutely placed) inside that box, or they widen the page
    <div className="relative max-w-[calc(100vw-2rem)] overflow-x-auto rounded-md border border-line" data-testid={testId}>
      <table className="tabular w-full border-collapse text-sm">
        {caption && <caption className="sr-only">{caption}</caption>}
        <thead className="bg-paper-2">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>
              {hg.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th
                    key={h.id}
                    scope="col"
                    aria-sort={h.column.getCanSort() ? (sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none") : undefined}
                    className={`border-b border-line px-3 py-2 text-left font-medium ${cellClass(h.column.columnDef.meta)}`}
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
              {folding && (
                <th scope="col" className={`border-b border-line px-3 py-2 text-left font-medium ${ONLY_BELOW[folding]}`}>
                  <span className="sr-only">More about the row</span>
                </th>
              )}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.length === 0 ? (
            <tr>
              <td colSpan={span} className="px-3 py-6 text-center text-ink-2">
                {noMatch}
              </td>
            </tr>
          ) : (
            table.getRowModel().rows.map((row) => {
              const expanded = open.has(row.id);
              const detailsId = `${baseId}-details-${row.id}`;
              const hidden = row.getVisibleCells().filter((c) => c.column.columnDef.meta?.hideBelow);
              return (
                <Fragment key={row.id}>
                  <tr className={`align-top hover:bg-paper-2/60 ${expanded ? "" : "border-b border-line/60 last:border-0"}`} {...(rowAttributes?.(row.original) ?? {})}>
                    {row.getVisibleCells().map((cell) => (
                      <td key={cell.id} className={`px-3 py-2 ${cellClass(cell.column.columnDef.meta)}`}>
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    ))}
                    {folding && (
                      <td className={`px-3 py-2 text-right ${ONLY_BELOW[folding]}`}>
                        <button
                          type="button"
                          className="inline-flex min-h-9 items-center gap-1 rounded border border-line px-2 text-xs whitespace-nowrap hover:bg-paper-2"
                          aria-expanded={expanded}
                          aria-controls={detailsId}
                          onClick={() => toggle(row.id)}
                          data-testid="row-details-toggle"
                        >
                          <span aria-hidden>{expanded ? "▴" : "▾"}</span>
                          Details
                        </button>
                      </td>
                    )}
                  </tr>
                  {folding && expanded && (
                    <tr id={detailsId} className={`border-b border-line/60 bg-paper-2/40 ${ONLY_BELOW[folding]}`}>
                      <td colSpan={span} className="px-3 pb-3 pt-1">
                        <dl className="grid grid-cols-[minmax(6rem,auto)_1fr] gap-x-3 gap-y-1">
                          {hidden.map((cell) => {
                            const bp = cell.column.columnDef.meta!.hideBelow!;
                            return (
                              <div key={cell.id} className={`col-span-2 grid grid-cols-subgrid ${ONLY_BELOW[bp]}`}>
                                <dt className="text-ink-2">{labelOf(row, cell.column.id)}</dt>
                                <dd className="min-w-0 break-words">{flexRender(cell.column.columnDef.cell, cell.getContext())}</dd>
                              </div>
                            );
                          })}
                        </dl>
                      </td>
                    </tr>
                  )}
                </Fragment>
              );
            })
          )}
        </tbody>
      </table>
    </div>
  );
}

/**
 * Previous / next under a paged list. `nextCursor` is the list's own word on whether a page follows
 * this one (null: none); it matters when the count is only a lower bound (`atLeast`), so `pages` may be
 * short of the end. A list that answers no cursor at all (undefined) is paged by its count alone.
 */
export function Pager({ page, pages, onPage, of, atLeast = false, nextCursor }: { page: number; pages: number; onPage: (p: number) => void; of?: string; atLeast?: boolean; nextCursor?: string | null }) {
  const hasNext = nextCursor === undefined ? page < pages : nextCursor !== null;
  if (pages <= 1 && !hasNext && page <= 1) return null;
  return (
    // one page can hold several paged lists: each navigation landmark gets its own name
    <nav className="flex items-center gap-2 text-sm" aria-label={of ? `Pages of ${of.toLowerCase()}` : "Pages"}>
      <button type="button" className="min-h-9 rounded border border-line px-3 py-1 disabled:opacity-40" disabled={page <= 1} onClick={() => onPage(page - 1)}>
        Previous
      </button>
      <span className="tabular">
        Page {page} of {atLeast ? `at least ${Math.max(pages, page).toLocaleString("en-US")}` : pages}
      </span>
      <button type="button" className="min-h-9 rounded border border-line px-3 py-1 disabled:opacity-40" disabled={!hasNext} onClick={() => onPage(page + 1)}>
        Next
      </button>
    </nav>
  );
}

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
  caption,
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
  caption?: string;
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
  const total = query.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));

  return (
    <div className="flex min-w-0 flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex min-w-0 flex-col gap-1 text-sm">
          <span className="font-medium">{searchLabel}</span>
          <input
            type="search"
            value={q}
            onChange={(e) => {
              setQ(e.target.value);
              setPage(1);
            }}
            className="min-h-10 w-64 max-w-full rounded-md border border-line bg-white px-3 text-sm dark:bg-paper-2"
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
          {query.isFetching ? "Loading…" : countPhrase({ total, totalIsLowerBound: query.data?.totalIsLowerBound }, "row", "rows")}
        </span>
      </div>
      {query.isError ? (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          Could not load this list: {(query.error as Error).message}
        </p>
      ) : query.isLoading ? (
        <div className="h-32 animate-pulse rounded-md bg-paper-2" role="status" aria-label="Loading" />
      ) : total === 0 && !q ? (
        <EmptyState {...empty} />
      ) : (
        <DataTable<T>
          data={query.data?.items ?? []}
          columns={columns}
          caption={caption}
          sorting={sorting}
          onSortingChange={(u) => {
            setSorting(u);
            setPage(1);
          }}
          noMatch={<>Nothing matches “{q}”.</>}
        />
      )}
      <Pager page={page} pages={pages} onPage={setPage} of={caption ?? searchLabel} atLeast={query.data?.totalIsLowerBound} nextCursor={query.data?.nextCursor} />
    </div>
  );
}
