"use client";
// Every version of a finding, oldest first: who changed what, and when. Deletions included.
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { Panel } from "@/components/ui/panel";
import { SEVERITY_SCALE, isSeverity } from "@/lib/findings/severity-scale";
import { FindingNote } from "./finding-note";

type Revision = { version: number; action: "created" | "updated" | "deleted"; snapshot: Record<string, unknown>; editedByName: string | null; createdAt: string };
const ACTION_WORD = { created: "Marked", updated: "Edited", deleted: "Deleted" } as const;

export function FindingHistory({ findingId, onClose }: { findingId: string; onClose(): void }) {
  const q = useQuery({ queryKey: ["finding-history", findingId], queryFn: () => fetchJson<{ items: Revision[] }>(`/api/findings/${findingId}/history`) });
  return (
    <Panel open title="Finding history" onClose={onClose}>
      {q.isLoading && <p>Loading…</p>}
      {q.error && <p role="alert">{q.error.message}</p>}
      <ol className="flex flex-col gap-3">
        {q.data?.items.map((r, i) => {
          const prev = i > 0 ? q.data!.items[i - 1].snapshot : null;
          const changed = prev ? Object.keys(r.snapshot).filter((k) => JSON.stringify(r.snapshot[k]) !== JSON.stringify(prev[k]) && k !== "nbiRating") : [];
          const sev = r.snapshot.severity;
          return (
            <li key={r.version} className="rounded-md border border-line p-3 text-sm">
              <p className="font-medium">
                Version {r.version}: {ACTION_WORD[r.action]} by {r.editedByName ?? "unknown"}
              </p>
              <p className="font-mono text-xs text-ink-2">{new Date(r.createdAt).toISOString().replace("T", " ").slice(0, 19)} UTC</p>
              {changed.length > 0 && <p className="mt-1 text-xs">Changed: {changed.join(", ")}</p>}
              <p className="mt-1 text-xs">
                {isSeverity(sev) ? SEVERITY_SCALE[sev].label : String(sev)} · frame {String(r.snapshot.startFrame)}
                {r.snapshot.endFrame != null ? ` to ${String(r.snapshot.endFrame)}` : ""}
              </p>
              <FindingNote note={String(r.snapshot.note ?? "")} className="mt-1" />
              {typeof r.snapshot.reason === "string" && r.snapshot.reason && <p className="mt-1 text-xs">Reason: {r.snapshot.reason}</p>}
            </li>
          );
        })}
      </ol>
    </Panel>
  );
}
