"use client";
// Create or edit a job: site, title, scope, due date, status and the assigned crew.
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { Field, SelectField, TextAreaField } from "@/components/ui/field";
import { Panel } from "@/components/ui/panel";
import { JOB_STATUSES, JOB_STATUS_MEANING, jobInput, type JobStatus } from "@/lib/validation/work";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import type { Role } from "@/db/schema/types";
import { useSave } from "./use-save";
import { FormFooter } from "./form-footer";
import { useOptions, type MemberOption, type SiteOption } from "./use-options";

export type JobFormRow = {
  id: string;
  siteId: string;
  title: string;
  scope: string | null;
  dueDate: string | null;
  status: JobStatus;
  pilotId: string | null;
  reviewerId: string | null;
  archivedAt: string | null;
};
type Input = z.input<typeof jobInput>;
type Output = z.output<typeof jobInput>;

export function JobForm({ row, defaultSiteId, onClose, onSaved }: { row: JobFormRow | null; defaultSiteId?: string; onClose: () => void; onSaved?: () => void }) {
  const sites = useOptions<SiteOption>("/api/sites", "sites", { sort: "name" });
  const pilots = useOptions<MemberOption>("/api/members", "members", { role: "pilot,owner" });
  const reviewers = useOptions<MemberOption>("/api/members", "members", { role: "reviewer,owner" });
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(jobInput),
    defaultValues: {
      siteId: row?.siteId ?? defaultSiteId ?? "",
      title: row?.title ?? "",
      scope: row?.scope ?? "",
      dueDate: row?.dueDate ?? "",
      status: row?.status ?? "planned",
      pilotId: row?.pilotId ?? "",
      reviewerId: row?.reviewerId ?? "",
    },
  });
  const done = () => {
    onSaved?.();
    onClose();
  };
  const save = useSave<Input, unknown, Output>({ url: row ? `/api/jobs/${row.id}` : "/api/jobs", method: row ? "PATCH" : "POST", invalidate: ["jobs", "sites"], setError: form.setError, onDone: done });
  const archive = useSave<{ archived: boolean }>({ url: `/api/jobs/${row?.id}`, method: "PATCH", invalidate: ["jobs", "sites"], onDone: done });
  const e = form.formState.errors;
  const status = useWatch({ control: form.control, name: "status" }) as JobStatus;
  const crewOption = (m: MemberOption) => (
    <option key={m.userId} value={m.userId}>
      {m.name} ({ROLE_LABELS[m.role as Role]?.label ?? m.role})
    </option>
  );
  return (
    <Panel open title={row ? `Edit ${row.title}` : "New job"} onClose={onClose}>
      <form className="flex flex-col gap-4" noValidate onSubmit={form.handleSubmit((v) => save.mutate(v))}>
        <SelectField key={sites.data ? "sites-ready" : "sites-loading"} label="Site" {...form.register("siteId")} error={e.siteId?.message} disabled={sites.isLoading}>
          <option value="">{sites.isLoading ? "Loading sites…" : "Choose a site"}</option>
          {sites.data?.items.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name} · {s.clientName}
            </option>
          ))}
        </SelectField>
        <Field label="Title" placeholder="e.g. Annual roof inspection" {...form.register("title")} error={e.title?.message} />
        <TextAreaField label="Scope" placeholder="What to inspect and what the client needs to know" rows={4} {...form.register("scope")} error={e.scope?.message} />
        <Field label="Due date" placeholder="YYYY-MM-DD" autoComplete="off" style={{ fontFamily: "var(--font-mono)" }} hint="ISO 8601, e.g. 2026-03-14, in the site's time zone. Leave empty for no date." {...form.register("dueDate")} error={e.dueDate?.message} />
        <div className="flex flex-col gap-1">
          <SelectField label="Status" {...form.register("status")} error={e.status?.message}>
            {JOB_STATUSES.map((s) => (
              <option key={s} value={s}>
                {JOB_STATUS_MEANING[s].label}
              </option>
            ))}
          </SelectField>
          {status && JOB_STATUS_MEANING[status] && <p className="text-xs text-ink-2">{JOB_STATUS_MEANING[status].meaning}</p>}
        </div>
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          <SelectField key={pilots.data ? "pilots-ready" : "pilots-loading"} label="Pilot" {...form.register("pilotId")} error={e.pilotId?.message}>
            <option value="">Not assigned</option>
            {pilots.data?.items.map(crewOption)}
          </SelectField>
          <SelectField key={reviewers.data ? "reviewers-ready" : "reviewers-loading"} label="Reviewer" {...form.register("reviewerId")} error={e.reviewerId?.message}>
            <option value="">Not assigned</option>
            {reviewers.data?.items.map(crewOption)}
          </SelectField>
        </div>
        <FormFooter submitLabel={row ? "Save job" : "Create job"} save={save} archive={archive} record={row} />
      </form>
    </Panel>
  );
}
