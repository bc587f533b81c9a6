"use client";
// A job's evidence packages: build one (the whole job, in the background, with live progress), then
// download it (resumable) and check it with its SHA-256. Shown to roles that may download packages;
// the build button to roles that may build them. Embeddable: <JobEvidencePackages jobId role />.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState } from "react";
import { fetchJson } from "@/components/fetch-json";
import { Button } from "@/components/ui/button";
import { HashText } from "@/components/ui/hash-text";
import { FormError } from "@/components/ui/panel";
import { can } from "@/lib/auth/permissions";
import type { Role } from "@/db/schema/types";
import type { PackageView } from "@/lib/evidence-packages/list-evidence-packages";
import { formatBytes } from "@/lib/uploads/format-bytes";

export const PACKAGE_STATE_WORD: Record<PackageView["state"], string> = {
  queued: "Waiting to build",
  building: "Building",
  ready: "Ready to download",
  failed: "Failed",
  expired: "Removed (past its keep date)",
};
const running = (p: PackageView) => p.state === "queued" || p.state === "building";
const isoMinute = (s: string) => new Date(s).toISOString().replace("T", " ").slice(0, 16) + " UTC";

export function JobEvidencePackages({ jobId, role }: { jobId: string; role: Role }) {
  const qc = useQueryClient();
  const purposeId = useId();
  const whatId = useId();
  const [purpose, setPurpose] = useState("");
  const [what, setWhat] = useState("job");
  const canBuild = can(role, "packages.build");
  const list = useQuery({
    queryKey: ["evidence-packages", jobId],
    queryFn: () => fetchJson<{ items: PackageView[] }>(`/api/evidence-packages?jobId=${jobId}`),
    refetchInterval: (q) => (q.state.data?.items.some(running) ? 1000 : false),
    enabled: can(role, "packages.download"),
  });
  const flights = useQuery({
    queryKey: ["flights", jobId, "for-packages"],
    queryFn: () => fetchJson<{ items: { id: string; flownOn: string; aircraft: string | null }[] }>(`/api/flights?jobId=${jobId}`),
    enabled: canBuild,
  });
  const build = useMutation({
    mutationFn: () => fetchJson<PackageView>("/api/evidence-packages", { method: "POST", json: { jobId, flightId: what === "job" ? null : what, purpose: purpose.trim() || null } }),
    onSuccess: () => {
      setPurpose("");
      void qc.invalidateQueries({ queryKey: ["evidence-packages", jobId] });
    },
  });
  if (!can(role, "packages.download")) return null;
  const busy = list.data?.items.some(running);
  return (
    <section aria-labelledby="packages-title" className="flex flex-col gap-3 rounded-lg border border-line p-4" data-testid="job-evidence-packages">
      <h2 id="packages-title" className="text-lg font-semibold">
        Evidence packages
      </h2>
      <p className="text-sm text-ink-2">
        One ZIP with the job&apos;s originals byte for byte, playable copies, stills, approved reports and their custody events, laid out as a BagIt bag (RFC 8493). Its README tells the receiver how to check it with{" "}
        <code className="font-mono">sha256sum -c</code>, without Cairn.
      </p>
      {canBuild && (
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            build.mutate();
          }}
        >
          {(flights.data?.items.length ?? 0) > 1 && (
            <label htmlFor={whatId} className="flex flex-col gap-1 text-sm">
              <span>What to package</span>
              <select id={whatId} value={what} onChange={(e) => setWhat(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-2">
                <option value="job">The whole job</option>
                {flights.data!.items.map((f) => (
                  <option key={f.id} value={f.id}>
                    Flight of {f.flownOn}
                    {f.aircraft ? ` (${f.aircraft})` : ""}
                  </option>
                ))}
              </select>
            </label>
          )}
          <label htmlFor={purposeId} className="flex min-w-60 flex-1 flex-col gap-1 text-sm">
            <span>For whom or why (optional)</span>
            <input id={purposeId} value={purpose} maxLength={300} onChange={(e) => setPurpose(e.target.value)} className="rounded-md border border-line bg-paper px-3 py-2" placeholder="For example: the loss adjuster, claim reference" />
          </label>
          <Button type="submit" busy={build.isPending} disabled={!!busy}>
            Build package
          </Button>
        </form>
      )}
      <FormError error={build.error} />
      {list.isPending && <p className="text-sm text-ink-2">Loading packages…</p>}
      {list.error && <p role="alert">{list.error.message}</p>}
      {list.data?.items.length === 0 && (
        <p className="rounded-md border border-dashed border-line px-4 py-6 text-center text-sm text-ink-2">
          No package yet.{canBuild ? " Build one when the evidence is ready to hand over." : " An owner or reviewer builds one when the evidence is ready to hand over."}
        </p>
      )}
      <ol className="flex flex-col gap-2">
        {list.data?.items.map((p) => (
          <li key={p.id} className={`rounded-md border p-3 text-sm ${p.state === "ready" ? "border-good" : "border-line"}`} data-testid="evidence-package" data-state={p.state}>
            <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
              <span className={p.state === "failed" ? "font-medium text-bad" : p.state === "ready" ? "font-medium text-good" : "font-medium"}>
                {p.state === "ready" && <span aria-hidden>✓ </span>}
                {p.state === "failed" && <span aria-hidden>✕ </span>}
                {PACKAGE_STATE_WORD[p.state]}
                {running(p) ? ` ${p.progress} %` : ""}
              </span>
              <span className="text-ink-2">
                by {p.createdByName ?? "unknown"}, {isoMinute(p.createdAt)}
                {p.recordingCount !== null ? ` · ${p.recordingCount} chosen recordings` : p.flightId ? " · one flight" : " · whole job"}
              </span>
              {p.downloadUrl && (
                <a href={p.downloadUrl} className="ml-auto text-lake underline" download data-testid="package-download">
                  Download ZIP{p.sizeBytes ? ` (${formatBytes(p.sizeBytes)})` : ""}
                </a>
              )}
            </div>
            {p.purpose && <p className="mt-1">{p.purpose}</p>}
            {running(p) && (
              <div className="mt-2 h-2 overflow-hidden rounded bg-paper-2" role="progressbar" aria-valuenow={p.progress} aria-valuemin={0} aria-valuemax={100} aria-label="Building the evidence package">
                <div className="h-full bg-lake transition-all" style={{ width: `${p.progress}%` }} />
              </div>
            )}
            {p.state === "failed" && p.failureReason && <p className="mt-1 text-bad">{p.failureReason}</p>}
            {p.sha256 && (
              <p className="mt-1 flex flex-wrap items-center gap-2">
                <span className="text-ink-2">ZIP SHA-256</span> <HashText value={p.sha256} />
                {p.payloadFiles !== null && <span className="text-ink-2">· {p.payloadFiles} files inside</span>}
              </p>
            )}
            {(p.state === "ready" || running(p)) && <p className="mt-1 text-ink-2">Kept until {p.expiresAt.slice(0, 10)} (UTC), then removed; every build and download is in the custody log.</p>}
            {p.state === "ready" && can(role, "shares.manage") && <OfferThroughLink jobId={jobId} packageId={p.id} />}
          </li>
        ))}
      </ol>
    </section>
  );
}

type LinkOption = { id: string; label: string; status: "active" | "expired" | "revoked" };

/** An owner lets a share link of the job carry this package: its holder can then download it. */
function OfferThroughLink({ jobId, packageId }: { jobId: string; packageId: string }) {
  const selectId = useId();
  const [chosen, setChosen] = useState("");
  const links = useQuery({ queryKey: ["share-links", jobId, "for-packages"], queryFn: () => fetchJson<{ items: LinkOption[] }>(`/api/share-links?jobId=${jobId}`) });
  const active = links.data?.items.filter((l) => l.status === "active") ?? [];
  const offer = useMutation({ mutationFn: (shareLinkId: string) => fetchJson(`/api/evidence-packages/${packageId}/share`, { method: "PUT", json: { shareLinkId } }) });
  if (links.isPending) return null;
  if (active.length === 0) return <p className="mt-1 text-ink-2">To hand it over without an account, create a share link for this job; it can then carry this package.</p>;
  const linkId = chosen || active[0].id;
  return (
    <form
      className="mt-2 flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        offer.mutate(linkId);
      }}
    >
      <label htmlFor={selectId} className="flex flex-col gap-1">
        <span>Offer through a share link</span>
        <select id={selectId} value={linkId} onChange={(e) => setChosen(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-2">
          {active.map((l) => (
            <option key={l.id} value={l.id}>
              {l.label}
            </option>
          ))}
        </select>
      </label>
      <Button type="submit" variant="secondary" busy={offer.isPending}>
        Offer package
      </Button>
      {offer.isSuccess && (
        <span role="status" className="text-good">
          <span aria-hidden>✓ </span>The link&apos;s page now offers this package.
        </span>
      )}
      <FormError error={offer.error} />
    </form>
  );
}
