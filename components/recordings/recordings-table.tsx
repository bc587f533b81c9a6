"use client";
// The recordings of a flight or a job: name, size, kind, duration when known, processing state
// with live progress (the list refreshes every few seconds while anything is waiting or being
// processed), hash, tags (add/remove), and the original's download. Filters and sorting run on
// the server (GET /api/recordings). On a narrow screen name and state stay in the row; the rest
// moves into the row's details (DataTable in components/ui/resource-table.tsx).
import { countPhrase } from "@/components/ui/count-phrase";
import { keepPreviousData, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { fetchJson } from "@/components/fetch-json";
import type { ColumnDef, SortingState } from "@tanstack/react-table";
import { EmptyState } from "@/components/ui/empty-state";
import { DataTable, Pager } from "@/components/ui/resource-table";
import { HashText } from "@/components/ui/hash-text";
import { formatBytes } from "@/lib/uploads/format-bytes";
import { formatClockTime } from "@/lib/timecode/format-clock-time";

export type RecordingRow = {
  id: string;
  originalName: string;
  relativePath: string | null;
  sizeBytes: number;
  kind: "raw_h264" | "mp4" | "mov" | "jpeg";
  sha256: string;
  durationSec: number | null;
  state: "waiting" | "processing" | "ready" | "failed";
  progress: number;
  failureReason: string | null;
  duplicateOfId: string | null;
  flightId: string;
  flownOn: string;
  jobId: string;
  jobTitle: string;
  sequenceIndex: number;
  recorderModifiedAt: string | null;
  createdAt: string;
  uploadedByName: string | null;
  tags: string[];
};

const KIND_LABELS: Record<RecordingRow["kind"], string> = { raw_h264: "Raw H.264", mp4: "MP4", mov: "MOV", jpeg: "JPEG still" };
const STATE_LABELS: Record<RecordingRow["state"], string> = { waiting: "Waiting", processing: "Processing", ready: "Ready", failed: "Failed" };
const LIVE_REFRESH_MS = 3_000; // while a recording is waiting or processing

type SortKey = "sequence" | "name" | "size" | "kind" | "duration" | "state" | "recordedAt" | "uploadedAt";

/** The processing state in words, with a shape (colour only repeats what the words say). */
export function RecordingState({ row }: { row: Pick<RecordingRow, "state" | "progress" | "failureReason"> }) {
  if (row.state === "processing") {
    const pct = Math.max(0, Math.min(100, Math.round(row.progress)));
    return (
      <span className="inline-flex min-w-36 flex-col gap-1">
        <span>
          <span aria-hidden className="mr-1">◐</span>Processing {pct} %
        </span>
        <span role="progressbar" aria-label="Processing" aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100} className="h-1.5 w-full rounded bg-paper-2">
          <span className="block h-1.5 rounded bg-lake" style={{ width: `${pct}%` }} />
        </span>
      </span>
    );
  }
  if (row.state === "failed") {
    return (
      <span className="font-medium text-bad">
        <span aria-hidden className="mr-1">✕</span>Failed{row.failureReason ? `: ${row.failureReason}` : ""}
      </span>
    );
  }
  if (row.state === "ready") {
    return (
      <span className="text-good">
        <span aria-hidden className="mr-1">●</span>Ready
      </span>
    );
  }
  return (
    <span className="text-ink-2">
      <span aria-hidden className="mr-1">○</span>Waiting
    </span>
  );
}

function TagCell({ row, canTag, onChange }: { row: RecordingRow; canTag: boolean; onChange: () => void }) {
  const [draft, setDraft] = useState("");
  const [error, setError] = useState<string | null>(null);
  const mutate = useMutation({
    mutationFn: (m: { op: "add" | "remove"; name: string }) =>
      m.op === "add"
        ? fetchJson(`/api/recordings/${row.id}/tags`, { method: "POST", json: { name: m.name } })
        : fetchJson(`/api/recordings/${row.id}/tags?name=${encodeURIComponent(m.name)}`, { method: "DELETE" }),
    onSuccess: () => {
      setError(null);
      onChange();
    },
    onError: (e: Error) => setError(e.message),
  });
  return (
    <div className="flex min-w-40 flex-wrap items-center gap-1">
      {row.tags.map((t) => (
        <span key={t} className="inline-flex items-center gap-1 rounded-full border border-line bg-paper-2 px-2 py-0.5 text-xs">
          {t}
          {canTag && (
            <button type="button" aria-label={`Remove tag ${t} from ${row.originalName}`} className="rounded px-0.5 hover:bg-line" onClick={() => mutate.mutate({ op: "remove", name: t })}>
              ×
            </button>
          )}
        </span>
      ))}
      {canTag && (
        <form
          onSubmit={(e) => {
            e.preventDefault();
            if (draft.trim()) mutate.mutate({ op: "add", name: draft });
            setDraft("");
          }}
        >
          <input
            value={draft}
            onChange={(e) => setDraft(e.target.value)}
            maxLength={40}
            placeholder="Add tag"
            aria-label={`Add a tag to ${row.originalName}`}
            className="h-7 w-24 rounded border border-line bg-white px-2 text-xs dark:bg-paper-2"
          />
        </form>
      )}
      {error && (
        <span role="alert" className="w-full text-xs text-bad">
          {error}
        </span>
      )}
    </div>
  );
}

/**
 * Embed in a flight page as `<RecordingsTable flightId={flight.id} canTag canDownload />`, in a job
 * page as `<RecordingsTable jobId={job.id} ... />` (the job view adds a Flight column).
 */
export function RecordingsTable({
  flightId,
  jobId,
  canTag = false,
  canDownload = false,
  empty = { title: "No recordings yet", next: "Upload the SD card's files on the Upload page; they appear here with their hashes as soon as they are stored." },
}: {
  flightId?: string;
  jobId?: string;
  canTag?: boolean;
  canDownload?: boolean;
  empty?: { title: string; next: string; action?: React.ReactNode };
}) {
  const client = useQueryClient();
  const [sort, setSort] = useState<{ key: SortKey; dir: "asc" | "desc" }>({ key: "sequence", dir: "asc" });
  const [q, setQ] = useState("");
  const [state, setState] = useState("");
  const [kind, setKind] = useState("");
  const [tag, setTag] = useState("");
  const [page, setPage] = useState(1);
  const pageSize = 50;
  const params = new URLSearchParams({
    ...(flightId ? { flightId } : {}),
    ...(jobId ? { jobId } : {}),
    ...(q ? { q } : {}),
    ...(state ? { state } : {}),
    ...(kind ? { kind } : {}),
    ...(tag ? { tag } : {}),
    sort: sort.key,
    dir: sort.dir,
    page: String(page),
    pageSize: String(pageSize),
  });
  const key = ["recordings", params.toString()];
  const query = useQuery({
    queryKey: key,
    queryFn: () => fetchJson<{ items: RecordingRow[]; total: number; totalIsLowerBound?: boolean; nextCursor?: string | null }>(`/api/recordings?${params}`),
    placeholderData: keepPreviousData,
    refetchInterval: (qr) => (qr.state.data?.items.some((r) => r.state === "waiting" || r.state === "processing") ? LIVE_REFRESH_MS : false),
  });
  const refresh = () => void client.invalidateQueries({ queryKey: ["recordings"] });
  const rows = query.data?.items ?? [];
  const total = query.data?.total ?? 0;
  const filtered = Boolean(q || state || kind || tag);

  const select = (label: string, value: string, set: (v: string) => void, options: [string, string][]) => (
    <label className="flex flex-col gap-1 text-sm">
      <span className="font-medium">{label}</span>
      <select
        value={value}
        onChange={(e) => {
          set(e.target.value);
          setPage(1);
        }}
        className="min-h-10 rounded-md border border-line bg-white px-2 text-sm dark:bg-paper-2"
      >
        <option value="">All</option>
        {options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </select>
    </label>
  );

  const sorting: SortingState = [{ id: sort.key, desc: sort.dir === "desc" }];
  const jobView = Boolean(jobId && !flightId);
  const offset = (page - 1) * pageSize;
  const columns: ColumnDef<RecordingRow, unknown>[] = [
    // a flight's page numbers its files in the card's order; a job's page numbers the rows of the list
    // (the flight column then says which file of which flight a row is)
    jobView
      ? { id: "row", header: "#", enableSorting: false, meta: { className: "w-10 text-ink-2" }, cell: (c) => offset + c.row.index + 1 }
      : { id: "sequence", header: "#", meta: { className: "w-10 text-ink-2" }, cell: (c) => c.row.original.sequenceIndex + 1 },
    {
      id: "name",
      header: "Name",
      cell: ({ row: { original: r } }) => (
        <>
          <Link href={`/recordings/${r.id}`} className="font-medium break-all text-lake underline-offset-2 hover:underline">
            {r.originalName}
          </Link>
          {r.relativePath && r.relativePath !== r.originalName && <span className="block font-mono text-xs break-all text-ink-2">{r.relativePath}</span>}
          {r.duplicateOfId && <span className="block text-xs text-ink-2">Same bytes as a recording already stored; no second copy kept</span>}
        </>
      ),
    },
    ...(jobView
      ? [
          {
            id: "flight",
            header: "Flight",
            enableSorting: false,
            meta: { hideBelow: "md", className: "whitespace-nowrap" },
            cell: (c) => (
              <span className="font-mono text-xs">
                {c.row.original.flownOn} · file {c.row.original.sequenceIndex + 1}
              </span>
            ),
          } satisfies ColumnDef<RecordingRow, unknown>,
        ]
      : []),
    { id: "kind", header: "Kind", meta: { hideBelow: "lg", className: "whitespace-nowrap" }, cell: (c) => KIND_LABELS[c.row.original.kind] },
    { id: "size", header: "Size", meta: { hideBelow: "sm", className: "text-right whitespace-nowrap" }, cell: (c) => formatBytes(c.row.original.sizeBytes) },
    {
      id: "duration",
      header: "Duration",
      meta: { hideBelow: "md", className: "text-right font-mono whitespace-nowrap" },
      cell: (c) => (c.row.original.durationSec != null ? formatClockTime(c.row.original.durationSec) : "—"),
    },
    { id: "state", header: "State", cell: (c) => <RecordingState row={c.row.original} /> },
    { id: "sha256", header: "SHA-256", enableSorting: false, meta: { hideBelow: "lg", className: "whitespace-nowrap" }, cell: (c) => <HashText value={c.row.original.sha256} /> },
    { id: "tags", header: "Tags", enableSorting: false, meta: { hideBelow: "xl" }, cell: (c) => <TagCell row={c.row.original} canTag={canTag} onChange={refresh} /> },
    ...(canDownload
      ? [
          {
            id: "original",
            header: "Original",
            enableSorting: false,
            meta: { hideBelow: "xl", className: "whitespace-nowrap" },
            cell: (c) => (
              <a href={`/api/recordings/${c.row.original.id}/original`} download className="text-lake underline">
                Download original
              </a>
            ),
          } satisfies ColumnDef<RecordingRow, unknown>,
        ]
      : []),
  ];

  return (
    <div className="flex flex-col gap-3" data-testid="recordings-table">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Find</span>
          <input
            type="search"
            value={q}
            onChange={(e) => {
              setQ(e.target.value);
              setPage(1);
            }}
            placeholder="Name, folder or SHA-256"
            className="min-h-10 w-60 rounded-md border border-line bg-white px-3 text-sm dark:bg-paper-2"
          />
        </label>
        {select("State", state, setState, Object.entries(STATE_LABELS))}
        {select("Kind", kind, setKind, Object.entries(KIND_LABELS))}
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Tag</span>
          <input
            value={tag}
            onChange={(e) => {
              setTag(e.target.value.trim());
              setPage(1);
            }}
            placeholder="Any tag"
            className="min-h-10 w-32 rounded-md border border-line bg-white px-3 text-sm dark:bg-paper-2"
          />
        </label>
        <span className="ml-auto text-sm text-ink-2" aria-live="polite">
          {query.isFetching && !query.data ? "Loading…" : countPhrase({ total, totalIsLowerBound: query.data?.totalIsLowerBound }, "recording", "recordings")}
        </span>
      </div>
      {query.isError ? (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          Could not load the recordings: {(query.error as Error).message}
        </p>
      ) : query.isLoading ? (
        <div className="h-32 animate-pulse rounded-md bg-paper-2" role="status" aria-label="Loading recordings" />
      ) : total === 0 && !filtered ? (
        <EmptyState {...empty} />
      ) : (
        <DataTable<RecordingRow>
          data={rows}
          columns={columns}
          caption="Recordings"
          getRowId={(r) => r.id}
          rowAttributes={(r) => ({ "data-recording-id": r.id })}
          sorting={sorting}
          onSortingChange={(u) => {
            const next = typeof u === "function" ? u(sorting) : u;
            setSort(next[0] ? { key: next[0].id as SortKey, dir: next[0].desc ? "desc" : "asc" } : { key: "sequence", dir: "asc" });
            setPage(1);
          }}
          noMatch="No recording matches these filters."
        />
      )}
      <Pager
        page={page}
        pages={Math.max(1, Math.ceil(total / pageSize))}
        onPage={setPage}
        of="recordings"
        atLeast={query.data?.totalIsLowerBound}
        nextCursor={query.data?.nextCursor}
      />
    </div>
  );
}
