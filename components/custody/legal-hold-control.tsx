"use client";
// A job's legal hold: its state in words (and a mark), and for owners the means to set it or release
// it. Both need a reason, and a release also asks for confirmation in a panel of its own, since
// deletion becomes possible again; both land in the custody log with their reason. While held,
// nothing in the job can be deleted. Forms: react-hook-form with the schemas of lib/validation/legal-hold.ts.
// Embed: <LegalHoldControl jobId={id} canManage={can(role, "holds.manage")} />.
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Panel } from "@/components/ui/panel";
import { fetchJson, FetchError } from "@/components/fetch-json";
import { LEGAL_HOLD_REASON_MAX, releaseHoldForm, setHoldForm, type LegalHoldInput } from "@/lib/validation/legal-hold";

type Hold = { jobId: string; legalHold: boolean; legalHoldReason: string | null };

function useSaveHold(jobId: string, onDone: () => void) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: LegalHoldInput) => fetchJson<Hold>(`/api/jobs/${jobId}/hold`, { method: "PUT", json: body }),
    onSuccess: async () => {
      onDone();
      await qc.invalidateQueries({ queryKey: ["legal-hold", jobId] });
      await qc.invalidateQueries({ queryKey: ["custody"] });
    },
  });
}

const serverReasonError = (e: unknown) => (e instanceof FetchError ? e.fields?.reason?.[0] : undefined);

function SetHoldForm({ jobId }: { jobId: string }) {
  const form = useForm<z.infer<typeof setHoldForm>>({ resolver: zodResolver(setHoldForm), defaultValues: { reason: "" } });
  const save = useSaveHold(jobId, () => form.reset({ reason: "" }));
  const fieldError = form.formState.errors.reason?.message ?? serverReasonError(save.error);
  return (
    <form className="flex flex-wrap items-end gap-2" noValidate onSubmit={form.handleSubmit((v) => save.mutate({ hold: true, reason: v.reason }))}>
      <Field className="min-w-64 flex-1" label="Reason for the hold" maxLength={LEGAL_HOLD_REASON_MAX} error={fieldError} {...form.register("reason")} />
      <Button type="submit" busy={save.isPending}>
        Set legal hold
      </Button>
      {save.error && !serverReasonError(save.error) && (
        <p role="alert" className="w-full text-sm text-bad">
          {save.error.message}
        </p>
      )}
    </form>
  );
}

function ReleaseHold({ jobId, heldFor }: { jobId: string; heldFor: string | null }) {
  const [open, setOpen] = useState(false);
  const form = useForm<z.infer<typeof releaseHoldForm>>({ resolver: zodResolver(releaseHoldForm), defaultValues: { reason: "", confirm: false } });
  const save = useSaveHold(jobId, () => {
    form.reset({ reason: "", confirm: false });
    setOpen(false);
  });
  const close = () => setOpen(false);
  const fieldError = form.formState.errors.reason?.message ?? serverReasonError(save.error);
  return (
    <>
      <Button type="button" variant="secondary" onClick={() => setOpen(true)}>
        Release hold…
      </Button>
      <Panel open={open} title="Release the legal hold" onClose={close}>
        <form className="flex flex-col gap-4" noValidate onSubmit={form.handleSubmit((v) => save.mutate({ hold: false, reason: v.reason }))}>
          <p className="text-sm">
            The job is held{heldFor ? <> for: <strong>{heldFor}</strong></> : null}. Once released, an owner can delete its recordings again. The release and its reason are
            written into the custody log.
          </p>
          <Field label="Why is the hold released?" maxLength={LEGAL_HOLD_REASON_MAX} error={fieldError} {...form.register("reason")} />
          <label className="flex items-start gap-2 text-sm">
            <input type="checkbox" className="mt-0.5 h-4 w-4" aria-describedby={form.formState.errors.confirm ? "release-confirm-error" : undefined} {...form.register("confirm")} />
            <span>I understand that this job&apos;s files can be deleted again once the hold is released.</span>
          </label>
          {form.formState.errors.confirm && (
            <p id="release-confirm-error" className="text-sm text-bad">
              {form.formState.errors.confirm.message}
            </p>
          )}
          {save.error && !serverReasonError(save.error) && (
            <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
              {save.error.message}
            </p>
          )}
          <div className="flex gap-2">
            <Button type="submit" variant="danger" busy={save.isPending}>
              Release the hold
            </Button>
            <Button type="button" variant="secondary" onClick={close}>
              Keep the hold
            </Button>
          </div>
        </form>
      </Panel>
    </>
  );
}

export function LegalHoldControl({ jobId, canManage }: { jobId: string; canManage: boolean }) {
  const hold = useQuery({ queryKey: ["legal-hold", jobId], queryFn: () => fetchJson<Hold>(`/api/jobs/${jobId}/hold`) });
  if (!hold.data) return <p className="text-sm text-ink-2">{hold.error ? hold.error.message : "Loading the hold…"}</p>;
  const held = hold.data.legalHold;
  return (
    <div className={`flex flex-col gap-3 rounded-md border p-4 ${held ? "border-2 border-warn bg-warn-soft" : "border-line"}`} data-testid="legal-hold">
      <p className="font-medium">
        <span aria-hidden className="mr-1">
          {held ? "⛊" : "○"}
        </span>
        {held ? `Under legal hold: ${hold.data.legalHoldReason}` : "Not under legal hold"}
      </p>
      <p className="text-sm text-ink-2">
        {held
          ? "No original or derived file of this job can be deleted until the hold is released."
          : "Set a hold when the evidence may be needed in a dispute, claim or inquiry: deletion is then refused, and every refused attempt is logged."}
      </p>
      {canManage && (held ? <ReleaseHold jobId={jobId} heldFor={hold.data.legalHoldReason} /> : <SetHoldForm jobId={jobId} />)}
    </div>
  );
}
