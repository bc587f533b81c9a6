"use client";
// A job's report versions: build a new one (progress shown live), download, and, for an owner,
// approve a built version, which makes it final and records its PDF hash in the custody log.
// Embeddable: <JobReportsPanel jobId={job.id} canBuild={...} canApprove={...} />.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { fetchJson } from "@/components/fetch-json";
import { Button } from "@/components/ui/button";
import { HashText } from "@/components/ui/hash-text";
import { FormError } from "@/components/ui/panel";
import type { ReportView } from "@/lib/reports/report-view";
import { formatBytes } from "@/lib/uploads/format-bytes";

/** A report version as the JSON API sends it: the server's view, with dates as ISO strings. */
export type ReportItem = Omit<ReportView, "jobId" | "createdAt" | "approvedAt"> & { createdAt: string; approvedAt: string | null };

const STATE_WORD: Record<ReportItem["state"], string> = {
  queued: "Waiting to build",
  building: "Building",
  ready: "Ready, not approved",
  approved: "Approved, final",
  failed: "Failed",
};
const isoMinute = (s: string) => new Date(s).toISOString().replace("T", " ").slice(0, 16) + " UTC";

export function JobReportsPanel({ jobId, canBuild, canApprove, hideTitle = false }: { jobId: string; canBuild: boolean; canApprove: boolean; hideTitle?: boolean }) {
  const qc = useQueryClient();
  const list = useQuery({
    queryKey: ["reports", jobId],
    queryFn: () => fetchJson<{ items: ReportItem[] }>(`/api/reports?jobId=${jobId}`),
    refetchInterval: (q) => (q.state.data?.items.some((r) => r.state === "queued" || r.state === "building") ? 1000 : false),
  });
  const build = useMutation({
    mutationFn: () => fetchJson<ReportItem>("/api/reports", { method: "POST", json: { jobId } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["reports", jobId] }),
  });
  const busy = list.data?.items.some((r) => r.state === "queued" || r.state === "building");
  return (
    <section aria-labelledby="reports-title" className="flex flex-col gap-3" data-testid="job-reports">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id="reports-title" className={hideTitle ? "sr-only" : "text-lg font-semibold"}>
          Inspection report
        </h2>
        {canBuild && (
          <Button type="button" className="ml-auto" busy={build.isPending} disabled={!!busy} onClick={() => build.mutate()}>
            Build report
          </Button>
        )}
      </div>
      <p className="text-sm text-ink-2">Each build is a new version compiled from the job&apos;s current findings. An owner approves one; an approved version never changes.</p>
      <FormError error={build.error} />
      {list.error && <p role="alert">{list.error.message}</p>}
      {list.data?.items.length === 0 && <p className="rounded-md border border-dashed border-line px-4 py-6 text-center text-sm text-ink-2">No report yet. Mark findings in the job&apos;s recordings, then build the first version.</p>}
      <ol className="flex flex-col gap-2">
        {list.data?.items.map((r) => (
          <ReportRow key={r.id} r={r} canApprove={canApprove} onChanged={() => qc.invalidateQueries({ queryKey: ["reports", jobId] })} />
        ))}
      </ol>
    </section>
  );
}

function ReportRow({ r, canApprove, onChanged }: { r: ReportItem; canApprove: boolean; onChanged(): void }) {
  const [confirming, setConfirming] = useState(false);
  const approve = useMutation({ mutationFn: () => fetchJson(`/api/reports/${r.id}/approve`, { method: "POST" }), onSuccess: onChanged });
  const running = r.state === "queued" || r.state === "building";
  return (
    <li className={`rounded-md border p-3 text-sm ${r.state === "approved" ? "border-good" : "border-line"}`} data-testid="report-version" data-state={r.state}>
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <span className="font-semibold">Version {r.version}</span>
        <span data-testid="report-state" className={r.state === "failed" ? "font-medium text-bad" : r.state === "approved" ? "font-medium text-good" : ""}>
          {r.state === "approved" && <span aria-hidden>✓ </span>}
          {STATE_WORD[r.state]}
          {running ? ` ${r.progress} %` : ""}
        </span>
        <span className="text-ink-2">
          built by {r.createdBy ?? "unknown"}, {isoMinute(r.createdAt)}
        </span>
        {r.downloadUrl && (
          <a href={r.downloadUrl} className="ml-auto text-lake underline" download data-testid="report-download">
            Download PDF{r.sizeBytes ? ` (${formatBytes(r.sizeBytes)})` : ""}
          </a>
        )}
      </div>
      {running && (
        <div className="mt-2 h-2 overflow-hidden rounded bg-paper-2" role="progressbar" aria-valuenow={r.progress} aria-valuemin={0} aria-valuemax={100} aria-label={`Building version ${r.version}`}>
          <div className="h-full bg-lake transition-all" style={{ width: `${r.progress}%` }} />
        </div>
      )}
      {r.state === "failed" && r.failureReason && <p className="mt-1 text-bad">{r.failureReason}</p>}
      {r.sha256 && (
        <p className="mt-1 flex items-center gap-2">
          <span className="text-ink-2">PDF SHA-256</span> <HashText value={r.sha256} />
        </p>
      )}
      {r.state === "approved" && r.approvedAt && (
        <p className="mt-1">
          Approved by {r.approvedBy ?? "unknown"}, {isoMinute(r.approvedAt)}. Its hash is recorded in the custody log.
        </p>
      )}
      {canApprove && r.state === "ready" && !confirming && (
        <Button type="button" variant="secondary" className="mt-2" onClick={() => setConfirming(true)}>
          Approve version {r.version}
        </Button>
      )}
      {confirming && (
        <div className="mt-2 flex flex-col gap-2 rounded border border-line bg-paper-2 p-2">
          <p>Approving makes version {r.version} final: it can no longer change, and its PDF hash goes into the custody log. Later edits to findings need a new version.</p>
          <div className="flex gap-2">
            <Button type="button" busy={approve.isPending} onClick={() => approve.mutate()}>
              Approve as final
            </Button>
            <Button type="button" variant="secondary" onClick={() => setConfirming(false)}>
              Not yet
            </Button>
          </div>
          <FormError error={approve.error} />
        </div>
      )}
    </li>
  );
}
