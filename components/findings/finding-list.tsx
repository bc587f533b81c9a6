"use client";
// The findings of a recording beside the player, in time order: stone and severity word, category,
// moment, note and still. Clicking one jumps the player to its frame.
import { useState } from "react";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { Button } from "@/components/ui/button";
import { describeMoment, formatMoment } from "@/lib/findings/describe-moment";
import { SEVERITY_SCALE } from "@/lib/findings/severity-scale";
import type { FrameRate } from "@/lib/timecode/frame-rate";
import { FindingStone } from "./finding-stone";
import { FindingNote } from "./finding-note";
import { FindingStill } from "./finding-still";
import type { FindingItem } from "./finding-types";

export function FindingList({
  findings,
  rate,
  selectedId,
  canWrite,
  onSelect,
  onEdit,
  onHistory,
}: {
  findings: FindingItem[];
  rate: FrameRate;
  selectedId: string | null;
  canWrite: boolean;
  onSelect(f: FindingItem): void;
  onEdit(f: FindingItem): void;
  onHistory(f: FindingItem): void;
}) {
  return (
    <ol className="flex flex-col gap-2" aria-label="Findings in this recording" data-testid="finding-list">
      {findings.map((f) => (
        <FindingRow key={f.id} f={f} rate={rate} selected={selectedId === f.id} canWrite={canWrite} onSelect={onSelect} onEdit={onEdit} onHistory={onHistory} />
      ))}
    </ol>
  );
}

function FindingRow({ f, rate, selected, canWrite, onSelect, onEdit, onHistory }: { f: FindingItem; rate: FrameRate; selected: boolean; canWrite: boolean; onSelect(f: FindingItem): void; onEdit(f: FindingItem): void; onHistory(f: FindingItem): void }) {
  const qc = useQueryClient();
  const [confirming, setConfirming] = useState(false);
  const [reason, setReason] = useState("");
  const del = useMutation({
    mutationFn: () => fetchJson(`/api/findings/${f.id}`, { method: "DELETE", json: reason.trim() ? { reason: reason.trim() } : {} }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["findings"] }),
  });
  const level = SEVERITY_SCALE[f.severity];
  const start = describeMoment(f.startFrame, rate);
  return (
    <li className={`rounded-md border p-2 ${selected ? "border-lake bg-lake-soft" : "border-line"}`} data-testid="finding-item" data-finding-id={f.id}>
      {/* the still is a link of its own, so it sits beside the button rather than inside it (no nested controls);
          the button's name is its visible text, after "Go to" for screen readers */}
      <div className="flex w-full gap-3">
        <FindingStill finding={f} canWrite={canWrite} width={120} />
        <button type="button" className="flex min-w-0 flex-1 flex-col gap-0.5 text-left" onClick={() => onSelect(f)}>
          <span className="sr-only">Go to finding: </span>
          <span className="flex items-center gap-1.5">
            <FindingStone severity={f.severity} />
            <span className="font-semibold" data-testid="finding-severity">
              {level.label}
            </span>
            {f.categoryName && <span className="truncate text-sm text-ink-2">· {f.categoryName}</span>}
          </span>
          <span className="font-mono text-xs">{formatMoment(start)}</span>
          {f.endFrame !== null && <span className="font-mono text-xs">to {formatMoment(describeMoment(f.endFrame, rate))}</span>}
          <FindingNote note={f.note} className="line-clamp-3" />
        </button>
      </div>
      <div className="mt-1 flex flex-wrap items-center gap-1 text-xs">
        <span className="text-ink-2">
          v{f.version} · {f.createdBy?.name ?? "unknown"}
        </span>
        <span className="ml-auto flex gap-1">
          <button type="button" className="rounded px-1.5 py-0.5 underline hover:bg-paper-2" onClick={() => onHistory(f)}>
            History
          </button>
          {canWrite && (
            <>
              <button type="button" className="rounded px-1.5 py-0.5 underline hover:bg-paper-2" onClick={() => onEdit(f)}>
                Edit
              </button>
              <button type="button" className="rounded px-1.5 py-0.5 text-bad underline hover:bg-paper-2" onClick={() => setConfirming(true)}>
                Delete
              </button>
            </>
          )}
        </span>
      </div>
      {confirming && (
        <div className="mt-2 flex flex-col gap-2 rounded border border-bad bg-bad-soft p-2 text-sm">
          <p>The finding leaves the list and the next report; its history and the custody log keep it.</p>
          <label className="flex flex-col gap-1 text-xs">
            Reason (optional)
            <input className="rounded border border-line bg-white px-2 py-1 text-sm dark:bg-paper-2" value={reason} maxLength={500} onChange={(e) => setReason(e.target.value)} />
          </label>
          <div className="flex gap-2">
            <Button type="button" variant="danger" busy={del.isPending} onClick={() => del.mutate()}>
              Delete finding
            </Button>
            <Button type="button" variant="secondary" onClick={() => setConfirming(false)}>
              Keep it
            </Button>
          </div>
          {del.error && <p role="alert">{del.error.message}</p>}
        </div>
      )}
    </li>
  );
}
