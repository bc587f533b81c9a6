"use client";
// The "Share with client" form: what to share (scope and its items), who gets the mail, expiry,
// optional passcode and whether originals may be downloaded. After creating, the address is shown
// once to copy: Cairn keeps only its hash and cannot show it again.
import { useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { Panel } from "@/components/ui/panel";
import { fetchJson, FetchError } from "@/components/fetch-json";
import { SHARE_SCOPES, SHARE_SCOPE_LABELS, MAX_SHARE_DAYS, type ShareScope } from "@/lib/sharing/share-link-input";
import { SEVERITY_SCALE, type Severity } from "@/lib/findings/severity-scale";
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import { SeverityStone } from "./severity-stone";

type Options = {
  job: { id: string; title: string };
  recordings: { id: string; name: string; state: string }[];
  findings: { id: string; recordingId: string; startSec: number; severity: Severity; categoryName: string | null; note: string }[];
  reports: { id: string; version: number; state: "ready" | "approved" }[];
};
type Created = { id: string; url: string; expiresAt: string; mailed: string[]; mailError: string | null };

export function ShareLinkForm({ jobId, onClose }: { jobId: string; onClose: () => void }) {
  const qc = useQueryClient();
  const options = useQuery({ queryKey: ["share-options", jobId], queryFn: () => fetchJson<Options>(`/api/share-links/options?jobId=${jobId}`) });
  const [scope, setScope] = useState<ShareScope>("findings");
  const [label, setLabel] = useState("");
  const [recordingId, setRecordingId] = useState("");
  const [findingIds, setFindingIds] = useState<string[]>([]);
  const [reportId, setReportId] = useState<string | null>(null);
  const [recipients, setRecipients] = useState("");
  const [days, setDays] = useState("14");
  const [passcode, setPasscode] = useState("");
  const [allowOriginals, setAllowOriginals] = useState(false);
  const [copied, setCopied] = useState(false);

  const approved = options.data?.reports.find((r) => r.state === "approved");
  const chosenReport = reportId ?? approved?.id ?? "";
  const create = useMutation({
    mutationFn: () =>
      fetchJson<Created>("/api/share-links", {
        method: "POST",
        json: {
          jobId,
          scope,
          label,
          recordingId: scope === "recording" ? recordingId || null : null,
          findingIds: scope === "findings" ? findingIds : null,
          reportId: scope === "job" ? null : chosenReport || null,
          recipientEmails: recipients
            .split(/[\s,;]+/)
            .map((s) => s.trim())
            .filter(Boolean),
          expiresInDays: Number(days),
          passcode: passcode || null,
          allowOriginals: scope === "report" ? false : allowOriginals,
        },
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["share-links", jobId] }),
  });
  const fields = create.error instanceof FetchError ? (create.error.fields ?? {}) : {};
  const err = (k: string) => Object.entries(fields).find(([key]) => key === k || key.startsWith(`${k}.`))?.[1]?.[0];
  const nameOf = (id: string) => options.data?.recordings.find((r) => r.id === id)?.name ?? "";

  if (create.data) {
    const c = create.data;
    return (
      <Panel open title="Share link created" onClose={onClose}>
        <div className="flex flex-col gap-3 text-sm" role="status">
          <p>Copy the link now: Cairn keeps only a fingerprint of it and cannot show it again.</p>
          <input readOnly value={c.url} aria-label="Share link address" className="w-full rounded-md border border-line bg-white px-3 py-2 font-mono text-xs text-ink dark:bg-paper-2" onFocus={(e) => e.currentTarget.select()} />
          <Button
            variant="secondary"
            onClick={() => {
              void navigator.clipboard?.writeText(c.url).then(() => setCopied(true));
            }}
          >
            {copied ? "Copied" : "Copy link"}
          </Button>
          <p>Works until {c.expiresAt.slice(0, 10)}.</p>
          {c.mailed.length > 0 && <p data-testid="share-mailed">Mailed to {c.mailed.join(", ")}.</p>}
          {c.mailError && (
            <p role="alert" className="text-bad">
              {c.mailError}
            </p>
          )}
          {passcode && <p>Give the recipients the passcode separately (by phone, not in the same mail).</p>}
          <Button onClick={onClose}>Done</Button>
        </div>
      </Panel>
    );
  }

  return (
    <Panel open title="Share with client" onClose={onClose}>
      {!options.data ? (
        <p className="text-sm text-ink-2">{options.error ? options.error.message : "Loading what this job can share…"}</p>
      ) : (
        <form
          className="flex flex-col gap-4"
          onSubmit={(e) => {
            e.preventDefault();
            create.mutate();
          }}
        >
          <Field label="Label" value={label} onChange={(e) => setLabel(e.target.value)} error={err("label")} hint="What the client sees as the title, e.g. the finding or the survey." maxLength={120} />
          <SelectField label="What to share" value={scope} onChange={(e) => setScope(e.target.value as ShareScope)}>
            {SHARE_SCOPES.map((s) => (
              <option key={s} value={s}>
                {SHARE_SCOPE_LABELS[s].label}
              </option>
            ))}
          </SelectField>
          <p className="-mt-2 text-xs text-ink-2">{SHARE_SCOPE_LABELS[scope].meaning}</p>

          {scope === "recording" && (
            <SelectField label="Recording" value={recordingId} onChange={(e) => setRecordingId(e.target.value)} error={err("recordingId")}>
              <option value="">Choose a recording</option>
              {options.data.recordings.map((r) => (
                <option key={r.id} value={r.id}>
                  {r.name}
                </option>
              ))}
            </SelectField>
          )}
          {scope === "findings" && (
            <fieldset className="flex flex-col gap-1">
              <legend className="text-sm font-medium">Findings</legend>
              {options.data.findings.length === 0 && <p className="text-sm text-ink-2">This job has no findings yet.</p>}
              {options.data.findings.map((f) => (
                <label key={f.id} className="flex min-h-10 items-center gap-2 rounded-md border border-line px-3 py-1 text-sm">
                  <input
                    type="checkbox"
                    checked={findingIds.includes(f.id)}
                    onChange={(e) => setFindingIds(e.target.checked ? [...findingIds, f.id] : findingIds.filter((x) => x !== f.id))}
                  />
                  <SeverityStone severity={f.severity} />
                  <span>
                    <strong>{SEVERITY_SCALE[f.severity].label}</strong>
                    {f.categoryName ? ` · ${f.categoryName}` : ""} · {nameOf(f.recordingId)} at <span className="font-mono">{formatClockTime(f.startSec)}</span>
                    {f.note && <span className="block text-xs text-ink-2">{f.note}</span>}
                  </span>
                </label>
              ))}
              {err("findingIds") && (
                <p role="alert" className="text-xs font-medium text-bad">
                  {err("findingIds")}
                </p>
              )}
            </fieldset>
          )}
          {scope !== "job" && (
            <SelectField label={scope === "report" ? "Report version" : "Attach a report version"} value={chosenReport} onChange={(e) => setReportId(e.target.value)} error={err("reportId")}>
              <option value="">{scope === "report" ? "Choose a version" : "No report"}</option>
              {options.data.reports.map((r) => (
                <option key={r.id} value={r.id}>
                  Version {r.version} ({r.state === "approved" ? "approved" : "ready, not approved"})
                </option>
              ))}
            </SelectField>
          )}
          <Field label="Recipients' e-mails" value={recipients} onChange={(e) => setRecipients(e.target.value)} error={err("recipientEmails")} hint="Separated by commas. Each gets the link by mail." />
          <Field label="Expires after" type="number" min={1} max={MAX_SHARE_DAYS} unit="days" value={days} onChange={(e) => setDays(e.target.value)} error={err("expiresInDays")} />
          <Field label="Passcode (optional)" type="text" autoComplete="off" value={passcode} onChange={(e) => setPasscode(e.target.value)} error={err("passcode")} hint="At least 6 characters. Send it separately from the link." />
          {scope !== "report" && (
            <label className="flex min-h-10 items-center gap-2 text-sm">
              <input type="checkbox" checked={allowOriginals} onChange={(e) => setAllowOriginals(e.target.checked)} />
              Allow downloading the originals (with their SHA-256)
            </label>
          )}
          {create.error && !Object.keys(fields).length && (
            <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
              {create.error.message}
            </p>
          )}
          <Button type="submit" busy={create.isPending}>
            Create share link
          </Button>
        </form>
      )}
    </Panel>
  );
}
