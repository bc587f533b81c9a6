"use client";
// The "Share with client" form: what to share (scope and its items), who gets the mail, expiry,
// optional passcode and whether originals may be downloaded. After creating, the address is shown
// once to copy: Cairn keeps only its hash and cannot show it again. Validated in the browser with
// the route's own schema (lib/sharing/share-link-input.ts); the server's field errors land on the
// same fields.
import { useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useQuery } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { Panel } from "@/components/ui/panel";
import { fetchJson } from "@/components/fetch-json";
import { useSave } from "@/components/work/use-save";
import { SHARE_SCOPES, SHARE_SCOPE_LABELS, MAX_SHARE_DAYS, shareLinkInput, type ShareLinkInput, type ShareScope } from "@/lib/sharing/share-link-input";
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
/** what the fields hold; the schema turns it into the route's input */
type FormValues = {
  jobId: string;
  scope: ShareScope;
  label: string;
  recordingId: string;
  findingIds: string[];
  reportId: string;
  recipientEmails: string;
  expiresInDays: string;
  passcode: string;
  allowOriginals: boolean;
};

export function ShareLinkForm({ jobId, onClose }: { jobId: string; onClose: () => void }) {
  const options = useQuery({ queryKey: ["share-options", jobId], queryFn: () => fetchJson<Options>(`/api/share-links/options?jobId=${jobId}`) });
  const form = useForm<FormValues, unknown, ShareLinkInput>({
    resolver: zodResolver(shareLinkInput) as unknown as Resolver<FormValues, unknown, ShareLinkInput>,
    defaultValues: { jobId, scope: "findings", label: "", recordingId: "", findingIds: [], reportId: "", recipientEmails: "", expiresInDays: "14", passcode: "", allowOriginals: false },
  });
  const [copied, setCopied] = useState(false);
  const create = useSave<FormValues, Created, ShareLinkInput>({ url: "/api/share-links", invalidate: ["share-links"], setError: form.setError });
  const scope = form.watch("scope");
  const findingIds = form.watch("findingIds");
  const passcode = form.watch("passcode");
  const approved = options.data?.reports.find((r) => r.state === "approved");
  // the newest approved version is attached unless the owner chooses otherwise
  const reportField = form.register("reportId");
  const reportTouched = form.formState.dirtyFields.reportId;
  const chosenReport = reportTouched ? form.watch("reportId") : (approved?.id ?? "");
  const e = form.formState.errors;
  const errorOf = (k: keyof FormValues) => {
    const v = e[k] as { message?: string } | Array<{ message?: string } | undefined> | undefined;
    return Array.isArray(v) ? v.find(Boolean)?.message : v?.message;
  };
  const nameOf = (id: string) => options.data?.recordings.find((r) => r.id === id)?.name ?? "";
  const submit = form.handleSubmit((v) =>
    create.mutate({
      ...v,
      // only the target the scope uses is sent
      recordingId: v.scope === "recording" ? (v.recordingId ?? null) : null,
      findingIds: v.scope === "findings" ? v.findingIds : null,
      reportId: v.scope === "job" ? null : reportTouched ? (v.reportId ?? null) : (approved?.id ?? null),
      allowOriginals: v.scope === "report" ? false : v.allowOriginals,
    }),
  );
  const fieldErrors = Object.keys(e).length > 0;

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
        <form className="flex flex-col gap-4" noValidate onSubmit={submit}>
          <Field label="Label" {...form.register("label")} error={errorOf("label")} hint="What the client sees as the title, e.g. the finding or the survey." maxLength={120} />
          <SelectField label="What to share" {...form.register("scope")}>
            {SHARE_SCOPES.map((s) => (
              <option key={s} value={s}>
                {SHARE_SCOPE_LABELS[s].label}
              </option>
            ))}
          </SelectField>
          <p className="-mt-2 text-xs text-ink-2">{SHARE_SCOPE_LABELS[scope].meaning}</p>

          {scope === "recording" && (
            <SelectField label="Recording" {...form.register("recordingId")} error={errorOf("recordingId")}>
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
                    onChange={(ev) => form.setValue("findingIds", ev.target.checked ? [...findingIds, f.id] : findingIds.filter((x) => x !== f.id), { shouldDirty: true })}
                  />
                  <SeverityStone severity={f.severity} />
                  <span>
                    <strong>{SEVERITY_SCALE[f.severity].label}</strong>
                    {f.categoryName ? ` · ${f.categoryName}` : ""} · {nameOf(f.recordingId)} at <span className="font-mono">{formatClockTime(f.startSec)}</span>
                    {f.note && <span className="block text-xs text-ink-2">{f.note}</span>}
                  </span>
                </label>
              ))}
              {errorOf("findingIds") && (
                <p role="alert" className="text-xs font-medium text-bad">
                  {errorOf("findingIds")}
                </p>
              )}
            </fieldset>
          )}
          {scope !== "job" && (
            <SelectField label={scope === "report" ? "Report version" : "Attach a report version"} {...reportField} value={chosenReport} error={errorOf("reportId")}>
              <option value="">{scope === "report" ? "Choose a version" : "No report"}</option>
              {options.data.reports.map((r) => (
                <option key={r.id} value={r.id}>
                  Version {r.version} ({r.state === "approved" ? "approved" : "ready, not approved"})
                </option>
              ))}
            </SelectField>
          )}
          <Field label="Recipients' e-mails" {...form.register("recipientEmails")} error={errorOf("recipientEmails")} hint="Separated by commas. Each gets the link by mail." />
          <Field label="Expires after" type="number" min={1} max={MAX_SHARE_DAYS} unit="days" {...form.register("expiresInDays")} error={errorOf("expiresInDays")} />
          <Field label="Passcode (optional)" type="text" autoComplete="off" {...form.register("passcode")} error={errorOf("passcode")} hint="At least 6 characters. Send it separately from the link." />
          {scope !== "report" && (
            <label className="flex min-h-10 items-center gap-2 text-sm">
              <input type="checkbox" {...form.register("allowOriginals")} />
              Allow downloading the originals (with their SHA-256)
            </label>
          )}
          {create.error && !fieldErrors && (
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
