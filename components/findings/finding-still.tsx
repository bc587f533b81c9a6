"use client";
// The still of a finding, or what is happening to it: being extracted, or failed with a way to retry.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { stillUrl } from "@/lib/media-serving/media-urls";
import type { FindingItem } from "./finding-types";

export function FindingStill({ finding, canWrite, width = 160 }: { finding: FindingItem; canWrite: boolean; width?: number }) {
  const qc = useQueryClient();
  const retry = useMutation({
    mutationFn: () => fetchJson(`/api/findings/${finding.id}/still`, { method: "POST" }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["findings"] }),
  });
  const s = finding.still;
  const box = { width, aspectRatio: s?.width && s?.height ? `${s.width} / ${s.height}` : "16 / 9" };
  if (s?.state === "ready") {
    return (
      <a href={stillUrl(s.id)} target="_blank" rel="noreferrer" className="relative block shrink-0 overflow-hidden rounded border border-line bg-black" style={box} title="Open the full-resolution still">
        {/* eslint-disable-next-line @next/next/no-img-element -- served by our authorized media route, not an optimisable static asset */}
        <img src={stillUrl(s.id)} alt={`Still of frame ${s.frameNumber}`} className="h-full w-full object-contain" data-testid="finding-still" loading="lazy" />
        {finding.box && (
          <span
            className="absolute border border-white outline outline-1 outline-black"
            style={{ left: `${finding.box.x * 100}%`, top: `${finding.box.y * 100}%`, width: `${finding.box.w * 100}%`, height: `${finding.box.h * 100}%` }}
          />
        )}
      </a>
    );
  }
  return (
    <div className="flex shrink-0 flex-col items-center justify-center gap-1 rounded border border-dashed border-line p-2 text-center text-xs text-ink-2" style={box}>
      {s?.state === "failed" ? (
        <>
          <span className="font-medium text-bad">Still failed</span>
          {s.failureReason && <span className="line-clamp-2">{s.failureReason}</span>}
          {canWrite && (
            <button type="button" className="underline" onClick={() => retry.mutate()} disabled={retry.isPending}>
              Try again
            </button>
          )}
        </>
      ) : (
        <span data-testid="still-pending">Extracting the still of frame {s?.frameNumber ?? finding.startFrame}…</span>
      )}
    </div>
  );
}
