"use client";
// The disposal page's body: the organisation's retention period and the clients' own, then every closed
// job falling due within the chosen horizon, each with its date, the reminders sent, its final evidence
// package (offered before disposal, with progress and download) and the owner's confirmation, which
// asks for the job's title typed out. A held job shows its hold and cannot be disposed of.
import Link from "next/link";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState } from "react";
import { fetchJson } from "@/components/fetch-json";
import { Button } from "@/components/ui/button";
import { FormError } from "@/components/ui/panel";
import { PACKAGE_STATE_WORD } from "@/components/evidence-packages/job-evidence-packages";
import type { DisposalItem } from "@/lib/retention/list-disposals";
import { RETENTION_SOURCE_WORDS } from "@/lib/retention/retention-period";
import { packageDownloadUrl } from "@/lib/evidence-packages/package-urls";

type RetentionData = { organisationDays: number | null; clients: { id: string; name: string; retentionDays: number | null }[]; horizonDays: number; items: DisposalItem[] };

const HORIZONS = [30, 90, 365, 3650] as const;
const KEY = ["retention"] as const;

function parseDays(text: string): number | null | "bad" {
  if (text.trim() === "") return null;
  const n = Number(text);
  return Number.isInteger(n) && n >= 1 ? n : "bad";
}

export function DisposalList() {
  const [horizon, setHorizon] = useState<number>(90);
  const horizonId = useId();
  const q = useQuery({
    queryKey: [...KEY, horizon],
    queryFn: () => fetchJson<RetentionData>(`/api/retention?horizonDays=${horizon}`),
    refetchInterval: (query) => (query.state.data?.items.some((i) => i.finalPackage && (i.finalPackage.state === "queued" || i.finalPackage.state === "building")) ? 1500 : false),
  });
  return (
    <div className="flex flex-col gap-6">
      {q.data && <RetentionSettings data={q.data} />}
      <section aria-labelledby="due-title" className="flex flex-col gap-3">
        <div className="flex flex-wrap items-end gap-3">
          <h2 id="due-title" className="text-lg font-semibold">
            Due for disposal
          </h2>
          <label htmlFor={horizonId} className="ml-auto flex items-center gap-2 text-sm">
            Show what falls due within
            <select id={horizonId} value={horizon} onChange={(e) => setHorizon(Number(e.target.value))} className="rounded-md border border-line bg-paper px-2 py-1">
              {HORIZONS.map((h) => (
                <option key={h} value={h}>
                  {h} days
                </option>
              ))}
            </select>
          </label>
        </div>
        {q.isPending && <p className="text-sm text-ink-2">Loading closed jobs…</p>}
        {q.error && <p role="alert">{q.error.message}</p>}
        {q.data?.items.length === 0 && (
          <p className="rounded-md border border-dashed border-line px-4 py-6 text-center text-sm text-ink-2">
            Nothing falls due within {horizon} days.{" "}
            {q.data.organisationDays === null && q.data.clients.every((c) => c.retentionDays === null) ? "No retention period is set yet: set one above, and closed jobs get a disposal date." : "Closed jobs appear here as their disposal date comes near."}
          </p>
        )}
        <ol className="flex flex-col gap-3">
          {q.data?.items.map((item) => (
            <DisposalRow key={item.jobId} item={item} />
          ))}
        </ol>
      </section>
    </div>
  );
}

function DaysField({ label, initial, onSave, saving }: { label: string; initial: number | null; onSave(days: number | null): void; saving: boolean }) {
  const id = useId();
  const [text, setText] = useState(initial === null ? "" : String(initial));
  const parsed = parseDays(text);
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (parsed !== "bad") onSave(parsed);
      }}
    >
      <label htmlFor={id} className="flex flex-col gap-1 text-sm">
        <span>{label}</span>
        <span className="flex items-center gap-2">
          <input id={id} inputMode="numeric" value={text} onChange={(e) => setText(e.target.value)} className="w-28 rounded-md border border-line bg-paper px-3 py-2 font-mono" aria-invalid={parsed === "bad"} aria-describedby={`${id}-hint`} />
          <span>days</span>
        </span>
      </label>
      <Button type="submit" variant="secondary" busy={saving} disabled={parsed === "bad"}>
        Save
      </Button>
      <span id={`${id}-hint`} className={`text-xs ${parsed === "bad" ? "text-bad" : "text-ink-2"}`}>
        {parsed === "bad" ? "Whole days, 1 or more" : "Empty: none set"}
      </span>
    </form>
  );
}

function RetentionSettings({ data }: { data: RetentionData }) {
  const qc = useQueryClient();
  const clientId = useId();
  const [client, setClient] = useState(data.clients[0]?.id ?? "");
  const save = useMutation({
    mutationFn: (body: unknown) => fetchJson("/api/retention", { method: "PUT", json: body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: KEY }),
  });
  const chosen = data.clients.find((c) => c.id === client);
  return (
    <section aria-labelledby="periods-title" className="flex flex-col gap-3 rounded-lg border border-line p-4">
      <h2 id="periods-title" className="text-lg font-semibold">
        Retention periods
      </h2>
      <p className="text-sm text-ink-2">A job&apos;s own period (set on its row below) wins over its client&apos;s, which wins over the organisation&apos;s default. The disposal date is the closing date plus the period, in UTC.</p>
      <DaysField key={`org-${data.organisationDays}`} label="Organisation default" initial={data.organisationDays} saving={save.isPending} onSave={(days) => save.mutate({ target: "organisation", days })} />
      {data.clients.length > 0 && (
        <div className="flex flex-wrap items-end gap-3">
          <label htmlFor={clientId} className="flex flex-col gap-1 text-sm">
            <span>Client</span>
            <select id={clientId} value={client} onChange={(e) => setClient(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-2">
              {data.clients.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name}
                  {c.retentionDays !== null ? ` (${c.retentionDays} days)` : ""}
                </option>
              ))}
            </select>
          </label>
          {chosen && <DaysField key={`${chosen.id}-${chosen.retentionDays}`} label="Client's own period" initial={chosen.retentionDays} saving={save.isPending} onSave={(days) => save.mutate({ target: "client", id: chosen.id, days })} />}
        </div>
      )}
      <FormError error={save.error} />
    </section>
  );
}

function DisposalRow({ item }: { item: DisposalItem }) {
  const qc = useQueryClient();
  const titleId = useId();
  const [confirming, setConfirming] = useState(false);
  const [typed, setTyped] = useState("");
  const refresh = () => qc.invalidateQueries({ queryKey: KEY });
  const finalPackage = useMutation({ mutationFn: () => fetchJson(`/api/retention/jobs/${item.jobId}/final-package`, { method: "POST", json: {} }), onSuccess: refresh });
  const dispose = useMutation({ mutationFn: () => fetchJson(`/api/retention/jobs/${item.jobId}/disposal`, { method: "POST", json: { confirmTitle: typed } }), onSuccess: refresh });
  const jobPeriod = useMutation({ mutationFn: (days: number | null) => fetchJson("/api/retention", { method: "PUT", json: { target: "job", id: item.jobId, days } }), onSuccess: refresh });
  const fp = item.finalPackage;
  const fpRunning = fp && (fp.state === "queued" || fp.state === "building");
  const status = item.legalHold ? (
    <span className="font-medium">
      <span aria-hidden>⛔ </span>Held: {item.legalHoldReason ?? "legal hold"}
    </span>
  ) : item.due ? (
    <span className="font-medium text-bad">
      <span aria-hidden>▲ </span>Due{item.daysLeft < 0 ? ` since ${item.disposalDate}` : " today"}
    </span>
  ) : (
    <span className="font-medium">
      <span aria-hidden>◷ </span>In {item.daysLeft} day{item.daysLeft === 1 ? "" : "s"}
    </span>
  );
  return (
    <li className={`rounded-md border p-3 text-sm ${item.due && !item.legalHold ? "border-bad" : "border-line"}`} data-testid="disposal-item" data-job-id={item.jobId}>
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <Link href={`/jobs/${item.jobId}`} className="font-semibold text-lake underline">
          {item.title}
        </Link>
        <span className="text-ink-2">
          {item.clientName} · {item.siteName}
        </span>
        <span className="ml-auto">{status}</span>
      </div>
      <dl className="mt-2 grid gap-x-6 gap-y-1 sm:grid-cols-2 lg:grid-cols-4">
        <div>
          <dt className="text-ink-2">Closed</dt>
          <dd className="font-mono">{item.closedAt.slice(0, 10)}</dd>
        </div>
        <div>
          <dt className="text-ink-2">Kept for</dt>
          <dd>
            <span className="font-mono">{item.retentionDays} days</span> ({RETENTION_SOURCE_WORDS[item.source]})
          </dd>
        </div>
        <div>
          <dt className="text-ink-2">Disposal date (UTC)</dt>
          <dd className="font-mono">{item.disposalDate}</dd>
        </div>
        <div>
          <dt className="text-ink-2">Reminders sent</dt>
          <dd>{item.remindersSent.length ? item.remindersSent.map((r) => (r.leadDays === 0 ? "on the day" : `${r.leadDays} days ahead`)).join(", ") : "none yet"}</dd>
        </div>
      </dl>
      <details className="mt-2">
        <summary className="cursor-pointer text-lake">Change this job&apos;s own period</summary>
        <div className="mt-2">
          <DaysField label="This job's period" initial={item.source === "job" ? item.retentionDays : null} saving={jobPeriod.isPending} onSave={(days) => jobPeriod.mutate(days)} />
          <FormError error={jobPeriod.error} />
        </div>
      </details>
      <div className="mt-3 flex flex-wrap items-center gap-3 border-t border-line pt-3">
        <span className="text-ink-2">Final evidence package:</span>
        {fp ? (
          <span data-testid="final-package-state">
            {PACKAGE_STATE_WORD[fp.state as keyof typeof PACKAGE_STATE_WORD] ?? fp.state}
            {fpRunning ? ` ${fp.progress} %` : ""}
            {fp.state === "ready" && (
              <>
                {" · "}
                <a className="text-lake underline" href={packageDownloadUrl(fp.id)} download>
                  Download ZIP
                </a>{" "}
                (kept until {fp.expiresAt.slice(0, 10)}, after the disposal too)
              </>
            )}
          </span>
        ) : (
          <span>none yet</span>
        )}
        {(!fp || fp.state === "failed" || fp.state === "expired") && (
          <Button type="button" variant="secondary" busy={finalPackage.isPending} onClick={() => finalPackage.mutate()}>
            Build final package
          </Button>
        )}
      </div>
      {fpRunning && (
        <div className="mt-2 h-2 overflow-hidden rounded bg-paper-2" role="progressbar" aria-valuenow={fp!.progress} aria-valuemin={0} aria-valuemax={100} aria-label={`Building the final package of ${item.title}`}>
          <div className="h-full bg-lake transition-all" style={{ width: `${fp!.progress}%` }} />
        </div>
      )}
      <FormError error={finalPackage.error} />
      {item.due && !item.legalHold && !confirming && (
        <Button type="button" variant="danger" className="mt-3" onClick={() => setConfirming(true)}>
          Dispose of the evidence…
        </Button>
      )}
      {item.legalHold && <p className="mt-2 text-ink-2">Disposal is blocked while the hold lasts. A package can still be built.</p>}
      {confirming && (
        <form
          className="mt-3 flex flex-col gap-2 rounded-md border border-bad bg-paper-2 p-3"
          onSubmit={(e) => {
            e.preventDefault();
            dispose.mutate();
          }}
        >
          <p>
            This removes the originals, playable copies, stills, report PDFs and evidence packages of <strong>{item.title}</strong> for good
            {fp?.state === "ready" ? ", except the final package, which stays until its keep date" : ""}. The records and the whole custody trail stay, with the SHA-256 of every file removed and your name as the one who confirmed.
          </p>
          <label htmlFor={titleId} className="flex flex-col gap-1">
            <span>Type the job&apos;s title to confirm</span>
            <input id={titleId} value={typed} onChange={(e) => setTyped(e.target.value)} autoComplete="off" className="rounded-md border border-line bg-paper px-3 py-2" />
          </label>
          <div className="flex gap-2">
            <Button type="submit" variant="danger" busy={dispose.isPending} disabled={typed.trim() !== item.title.trim()}>
              Dispose of the evidence
            </Button>
            <Button type="button" variant="secondary" onClick={() => setConfirming(false)}>
              Not now
            </Button>
          </div>
          <FormError error={dispose.error} />
        </form>
      )}
    </li>
  );
}
