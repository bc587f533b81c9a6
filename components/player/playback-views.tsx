"use client";
// Who watched this recording, when, and how playback went (from the app's own analytics collector).
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";

type ViewRow = { id: string; viewerName: string | null; shareLinkLabel: string | null; startedAt: string; lastBeaconAt: string; watchTimeMs: number; startupTimeMs: number | null; rebufferCount: number; rebufferMs: number };

const seconds = (ms: number | null) => (ms === null ? "—" : `${(ms / 1000).toFixed(1)} s`);

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
        <div className="overflow-x-auto rounded-md border border-line">
          <table className="tabular w-full text-sm" data-testid="playback-views">
            <thead className="bg-paper-2 text-left">
              <tr>
                <th className="px-3 py-1.5 font-medium">Viewer</th>
                <th className="px-3 py-1.5 font-medium">Started</th>
                <th className="px-3 py-1.5 font-medium">Watch time</th>
                <th className="px-3 py-1.5 font-medium">Startup time</th>
                <th className="px-3 py-1.5 font-medium">Rebuffering</th>
              </tr>
            </thead>
            <tbody>
              {q.data.items.map((v) => (
                <tr key={v.id} className="border-t border-line/60">
                  <td className="px-3 py-1.5">{v.viewerName ?? (v.shareLinkLabel ? `Share link: ${v.shareLinkLabel}` : "Unknown")}</td>
                  <td className="px-3 py-1.5 font-mono text-xs">{new Date(v.startedAt).toISOString().replace("T", " ").slice(0, 19)} UTC</td>
                  <td className="px-3 py-1.5 font-mono">{seconds(v.watchTimeMs)}</td>
                  <td className="px-3 py-1.5 font-mono">{seconds(v.startupTimeMs)}</td>
                  <td className="px-3 py-1.5 font-mono">
                    {v.rebufferCount} × · {seconds(v.rebufferMs)}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
