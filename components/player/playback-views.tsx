"use client";
// Who watched this recording, when, and how playback went (from the app's own analytics collector).
import { useQuery } from "@tanstack/react-query";
import type { ColumnDef } from "@tanstack/react-table";
import { fetchJson } from "@/components/fetch-json";
import { DataTable } from "@/components/ui/resource-table";

type ViewRow = { id: string; viewerName: string | null; shareLinkLabel: string | null; startedAt: string; lastBeaconAt: string; watchTimeMs: number; startupTimeMs: number | null; rebufferCount: number; rebufferMs: number };

const seconds = (ms: number | null) => (ms === null ? "—" : `${(ms / 1000).toFixed(1)} s`);

const COLUMNS: ColumnDef<ViewRow, unknown>[] = [
  { id: "viewer", header: "Viewer", cell: (c) => c.row.original.viewerName ?? (c.row.original.shareLinkLabel ? `Share link: ${c.row.original.shareLinkLabel}` : "Unknown") },
  {
    id: "started",
    header: "Started",
    meta: { hideBelow: "md", className: "font-mono text-xs whitespace-nowrap" },
    cell: (c) => `${new Date(c.row.original.startedAt).toISOString().replace("T", " ").slice(0, 19)} UTC`,
  },
  { id: "watch", header: "Watch time", meta: { className: "font-mono whitespace-nowrap" }, cell: (c) => seconds(c.row.original.watchTimeMs) },
  { id: "startup", header: "Startup time", meta: { hideBelow: "lg", className: "font-mono whitespace-nowrap" }, cell: (c) => seconds(c.row.original.startupTimeMs) },
  {
    id: "rebuffering",
    header: "Rebuffering",
    meta: { hideBelow: "lg", className: "font-mono whitespace-nowrap" },
    cell: (c) => `${c.row.original.rebufferCount} × · ${seconds(c.row.original.rebufferMs)}`,
  },
];

export function PlaybackViews({ recordingId }: { recordingId: string }) {
  const q = useQuery({
    queryKey: ["playback-views", recordingId],
    queryFn: () => fetchJson<{ items: ViewRow[] }>(`/api/collector/views?recordingId=${recordingId}`),
    refetchInterval: 15_000,
  });
  return (
    <section aria-labelledby="views-title" className="flex flex-col gap-2">
      <div className="flex items-center gap-2">
        <h2 id="views-title" className="text-base font-semibold">
          Views
        </h2>
        <button type="button" className="text-xs underline" onClick={() => q.refetch()}>
          Refresh
        </button>
      </div>
      {q.error && <p role="alert" className="text-sm">{q.error.message}</p>}
      {q.data && q.data.items.length === 0 && <p className="text-sm text-ink-2">No views recorded yet. Views appear here about ten seconds after someone starts playing.</p>}
      {q.data && q.data.items.length > 0 && (
        <DataTable<ViewRow> data={q.data.items} columns={COLUMNS} caption="Views of this recording" getRowId={(v) => v.id} testId="playback-views" />
      )}
    </section>
  );
}
