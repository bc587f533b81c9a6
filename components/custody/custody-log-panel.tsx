"use client";
// The custody log of a recording, a job or the whole organisation: newest first by default, filtered
// by recording, kind of event, person and date, one keyset page at a time (GET /api/custody), on the
// shared table (components/ui/resource-table.tsx, DataTable), with everything in plain words. The
// filters live in the address (?eventType=…&actor=…&from=…&to=…&order=…&recordingId=…), so a filtered
// log can be linked to. Verify and export: custody-chain-check.tsx.
// Embed: <CustodyLogPanel recordingId={id} /> or <CustodyLogPanel jobId={id} /> or <CustodyLogPanel /> (custody.read).
import { useCallback, useMemo, useState } from "react";
import { useSearchParams } from "next/navigation";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import type { ColumnDef } from "@tanstack/react-table";
import { HashText } from "@/components/ui/hash-text";
import { EmptyState } from "@/components/ui/empty-state";
import { DataTable } from "@/components/ui/resource-table";
import { fetchJson } from "@/components/fetch-json";
import type { CustodyListItem } from "@/lib/custody/list-custody-events";
import { CUSTODY_EVENT_LABELS, custodyEventLabel, custodyPurposeLabel, describeCustodySubject } from "./custody-event-labels";
import { CustodyChainCheck } from "./custody-chain-check";

/** Events per page (the API serves at most 200). */
export const CUSTODY_PAGE_SIZE = 50;

type Answer = { items: CustodyListItem[]; total: number; totalIsLowerBound?: boolean; nextCursor: string | null };
type Choices = { people: { userId: string; name: string; role: string }[]; recordings: { id: string; name: string; createdAt: string }[] };
type Filters = { eventType: string; actor: string; from: string; to: string; order: "newest" | "oldest"; recordingId: string };

const NO_FILTERS: Filters = { eventType: "", actor: "", from: "", to: "", order: "newest", recordingId: "" };
const when = (iso: string) => iso.replace("T", " ").replace(/\.\d+Z$|Z$/, "");
const ROLE_WORD: Record<string, string> = { owner: "owner", pilot: "pilot", reviewer: "reviewer", client: "client" };

function actorOf(e: CustodyListItem): string {
  if (e.actorShareLinkId) return "Client, through a share link";
  const role = e.actorRole ? ` (${ROLE_WORD[e.actorRole] ?? e.actorRole})` : "";
  if (e.actorName) return `${e.actorName}${role}`;
  if (e.actorUserId) return `Former member${role}`;
  return "Cairn (system)";
}

function readFilters(p: URLSearchParams | null): Filters {
  if (!p) return NO_FILTERS;
  return {
    eventType: p.get("eventType") ?? "",
    actor: p.get("actor") ?? "",
    from: p.get("from") ?? "",
    to: p.get("to") ?? "",
    order: p.get("order") === "oldest" ? "oldest" : "newest",
    recordingId: p.get("recordingId") ?? "",
  };
}

function writeFilters(f: Filters) {
  const p = new URLSearchParams(window.location.search);
  for (const [k, v] of Object.entries(f)) {
    if (v && !(k === "order" && v === "newest")) p.set(k, v);
    else p.delete(k);
  }
  const qs = p.toString();
  window.history.replaceState(window.history.state, "", `${window.location.pathname}${qs ? `?${qs}` : ""}${window.location.hash}`);
}

const inputClass = "min-h-10 rounded-md border border-line bg-white px-2 text-sm text-ink dark:bg-paper-2";

export function CustodyLogPanel({ recordingId, jobId }: { recordingId?: string; jobId?: string }) {
  // read through Next (not window) so the server's HTML and the browser's first render agree
  const search = useSearchParams();
  const [filters, setFilters] = useState<Filters>(() => readFilters(search ? new URLSearchParams(search.toString()) : null));
  // the cursors that opened each page so far: [undefined] is the first page
  const [cursors, setCursors] = useState<(string | undefined)[]>([undefined]);
  const [brokenId, setBrokenId] = useState<string | null>(null);
  const pageIndex = cursors.length - 1;

  const scope = recordingId ? `recordingId=${recordingId}` : jobId ? `jobId=${jobId}` : "";
  const params = new URLSearchParams();
  if (recordingId) params.set("recordingId", recordingId);
  else if (filters.recordingId) params.set("recordingId", filters.recordingId);
  if (jobId && !params.has("recordingId")) params.set("jobId", jobId);
  if (filters.eventType) params.set("eventType", filters.eventType);
  if (filters.actor) params.set("actor", filters.actor);
  if (filters.from) params.set("from", filters.from);
  if (filters.to) params.set("to", filters.to);
  params.set("order", filters.order);
  params.set("pageSize", String(CUSTODY_PAGE_SIZE));
  const cursor = cursors[pageIndex];
  if (cursor) params.set("cursor", cursor);

  const list = useQuery({
    queryKey: ["custody", params.toString()],
    queryFn: () => fetchJson<Answer>(`/api/custody?${params}`),
    placeholderData: keepPreviousData,
  });
  const choices = useQuery({
    queryKey: ["custody-filters", jobId ?? ""],
    queryFn: () => fetchJson<Choices>(`/api/custody/filters${jobId ? `?jobId=${jobId}` : ""}`),
    staleTime: 60_000,
  });

  const change = (patch: Partial<Filters>) => {
    const next = { ...filters, ...patch };
    setFilters(next);
    setCursors([undefined]);
    writeFilters(next);
  };
  const filtered = filters.eventType || filters.actor || filters.from || filters.to || filters.recordingId;
  const onBroken = useCallback((id: string | null) => setBrokenId(id), []);

  const columns = useMemo<ColumnDef<CustodyListItem, unknown>[]>(
    () => [
      {
        id: "when",
        header: "When (UTC)",
        cell: ({ row: { original: e } }) => <span className="whitespace-nowrap font-mono text-xs">{when(e.occurredAt)}</span>,
      },
      {
        id: "event",
        header: "Event",
        cell: ({ row: { original: e } }) => (
          <>
            <span className="font-medium">{custodyEventLabel(e.eventType)}</span>
            {e.id === brokenId && <span className="ml-1 text-xs font-semibold text-bad">Broken here</span>}
            <span className="block text-xs text-ink-2">{describeCustodySubject(e)}</span>
          </>
        ),
      },
      {
        id: "who",
        header: "Who, from where",
        meta: { hideBelow: "md" },
        cell: ({ row: { original: e } }) => (
          <>
            {actorOf(e)}
            {(e.clientAddress || e.userAgent) && (
              <span className="block max-w-[16rem] truncate text-xs text-ink-2" title={e.userAgent ?? undefined}>
                {e.clientAddress ?? "address unknown"}
                {e.userAgent ? ` · ${e.userAgent}` : ""}
              </span>
            )}
          </>
        ),
      },
      {
        id: "detail",
        header: "Purpose and detail",
        meta: { hideBelow: "lg" },
        cell: ({ row: { original: e } }) => (
          <>
            {custodyPurposeLabel(e.purpose) ?? <span className="text-ink-2">—</span>}
            {!recordingId && !jobId && e.jobTitle && <span className="block text-xs text-ink-2">Job: {e.jobTitle}</span>}
            {e.tool && <span className="block font-mono text-xs text-ink-2">{e.tool}</span>}
            {e.originalSha256 && (
              <span className="block text-xs">
                {e.evidenceType === "report" ? "report PDF" : "original"} SHA-256 <HashText value={e.originalSha256} />
              </span>
            )}
          </>
        ),
      },
      {
        id: "seq",
        header: "Event no.",
        meta: { hideBelow: "sm", label: "Event number in the chain" },
        cell: ({ row: { original: e } }) => <span className="font-mono">{e.seq}</span>,
      },
      {
        id: "hash",
        header: "Hash",
        meta: { hideBelow: "xl" },
        cell: ({ row: { original: e } }) => <HashText value={e.hash} label="Event hash" />,
      },
    ],
    [brokenId, recordingId, jobId],
  );

  const data = list.data;
  const first = pageIndex * CUSTODY_PAGE_SIZE + 1;
  const last = pageIndex * CUSTODY_PAGE_SIZE + (data?.items.length ?? 0);
  const newerLabel = filters.order === "newest" ? "Newer events" : "Earlier events";
  const olderLabel = filters.order === "newest" ? "Older events" : "Later events";

  return (
    <div className="flex min-w-0 flex-col gap-4" data-testid="custody-log">
      <CustodyChainCheck filter={scope} onBroken={onBroken} />

      <form className="flex flex-wrap items-end gap-3 rounded-md border border-line bg-paper-2/40 p-3" aria-label="Filter the custody log" onSubmit={(e) => e.preventDefault()}>
        {!recordingId && (
          <label className="flex min-w-0 flex-col gap-1 text-sm">
            <span className="font-medium">Recording</span>
            <select className={`${inputClass} max-w-64`} value={filters.recordingId} onChange={(e) => change({ recordingId: e.target.value })}>
              <option value="">{jobId ? "Every recording of the job" : "Every recording"}</option>
              {choices.data?.recordings.map((r) => (
                <option key={r.id} value={r.id}>
                  {r.name} · {r.createdAt.slice(0, 10)}
                </option>
              ))}
            </select>
          </label>
        )}
        <label className="flex min-w-0 flex-col gap-1 text-sm">
          <span className="font-medium">Kind of event</span>
          <select className={`${inputClass} max-w-64`} value={filters.eventType} onChange={(e) => change({ eventType: e.target.value })}>
            <option value="">Every kind</option>
            {Object.entries(CUSTODY_EVENT_LABELS).map(([type, label]) => (
              <option key={type} value={type}>
                {label}
              </option>
            ))}
          </select>
        </label>
        <label className="flex min-w-0 flex-col gap-1 text-sm">
          <span className="font-medium">Person</span>
          <select className={`${inputClass} max-w-64`} value={filters.actor} onChange={(e) => change({ actor: e.target.value })}>
            <option value="">Anyone</option>
            {choices.data?.people.map((p) => (
              <option key={p.userId} value={p.userId}>
                {p.name} ({ROLE_WORD[p.role] ?? p.role})
              </option>
            ))}
            <option value="share">A client, through a share link</option>
            <option value="system">Cairn (system)</option>
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">From (UTC)</span>
          <input type="date" className={inputClass} value={filters.from} max={filters.to || undefined} onChange={(e) => change({ from: e.target.value })} />
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">To (UTC)</span>
          <input type="date" className={inputClass} value={filters.to} min={filters.from || undefined} onChange={(e) => change({ to: e.target.value })} />
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Order</span>
          <select className={inputClass} value={filters.order} onChange={(e) => change({ order: e.target.value === "oldest" ? "oldest" : "newest" })}>
            <option value="newest">Newest first</option>
            <option value="oldest">Oldest first (chain order)</option>
          </select>
        </label>
        {filtered && (
          <button type="button" className="min-h-10 rounded-md border border-line px-3 text-sm hover:bg-paper-2" onClick={() => change({ ...NO_FILTERS, order: filters.order })}>
            Clear filters
          </button>
        )}
        <span className="ml-auto text-sm text-ink-2" aria-live="polite" data-testid="custody-count">
          {list.isFetching ? "Loading…" : data ? (data.total === 0 ? "No events" : `Events ${first.toLocaleString("en-US")}–${last.toLocaleString("en-US")} of ${data.totalIsLowerBound ? "at least " : ""}${data.total.toLocaleString("en-US")}`) : ""}
        </span>
      </form>

      {list.isError ? (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          Could not load the custody log: {(list.error as Error).message}
        </p>
      ) : list.isLoading || !data ? (
        <div className="h-32 animate-pulse rounded-md bg-paper-2" role="status" aria-label="Loading the custody log" />
      ) : data.total === 0 && !filtered ? (
        <EmptyState title="No custody events yet" next="Uploading, processing, viewing, sharing and deleting evidence each add an event here." />
      ) : (
        <DataTable<CustodyListItem>
          data={data.items}
          columns={columns}
          caption={`Custody events, ${filters.order === "newest" ? "newest first" : "oldest first"}`}
          getRowId={(e) => e.id}
          rowAttributes={(e) => ({ "data-event-type": e.eventType, "data-seq": String(e.seq), ...(e.id === brokenId ? { "data-broken": "true" } : {}) })}
          noMatch="No event matches these filters."
          testId="custody-table"
        />
      )}

      {(pageIndex > 0 || data?.nextCursor) && (
        <nav className="flex flex-wrap items-center gap-2 text-sm" aria-label="Pages of the custody log">
          <button type="button" className="min-h-10 rounded-md border border-line px-3 disabled:opacity-40" disabled={pageIndex === 0} onClick={() => setCursors([undefined])}>
            {filters.order === "newest" ? "Newest" : "Oldest"}
          </button>
          <button type="button" className="min-h-10 rounded-md border border-line px-3 disabled:opacity-40" disabled={pageIndex === 0} onClick={() => setCursors(cursors.slice(0, -1))}>
            ← {newerLabel}
          </button>
          <span className="tabular">Page {pageIndex + 1}</span>
          <button
            type="button"
            className="min-h-10 rounded-md border border-line px-3 disabled:opacity-40"
            disabled={!data?.nextCursor || list.isFetching}
            onClick={() => data?.nextCursor && setCursors([...cursors, data.nextCursor])}
          >
            {olderLabel} →
          </button>
        </nav>
      )}
    </div>
  );
}
