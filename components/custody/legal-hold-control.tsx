"use client";
// A job's legal hold: its state in words (and a mark), and for owners the means to set it with a
// reason or release it. While held, nothing in the job can be deleted.
// Embed: <LegalHoldControl jobId={id} canManage={can(role, "holds.manage")} />.
import { useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { fetchJson, FetchError } from "@/components/fetch-json";

type Hold = { jobId: string; legalHold: boolean; legalHoldReason: string | null };

export function LegalHoldControl({ jobId, canManage }: { jobId: string; canManage: boolean }) {
  const qc = useQueryClient();
  const [reason, setReason] = useState("");
  const hold = useQuery({ queryKey: ["legal-hold", jobId], queryFn: () => fetchJson<Hold>(`/api/jobs/${jobId}/hold`) });
  const save = useMutation({
    mutationFn: (body: { hold: boolean; reason?: string }) => fetchJson<Hold>(`/api/jobs/${jobId}/hold`, { method: "PUT", json: body }),
    onSuccess: async () => {
      setReason("");
      await qc.invalidateQueries({ queryKey: ["legal-hold", jobId] });
      await qc.invalidateQueries({ queryKey: ["custody"] });
    },
  });
  if (!hold.data) return <p className="text-sm text-ink-2">{hold.error ? hold.error.message : "Loading the hold…"}</p>;
  const held = hold.data.legalHold;
  const fieldError = save.error instanceof FetchError ? save.error.fields?.reason?.[0] : undefined;
  return (
    <div className={`flex flex-col gap-3 rounded-md border p-4 ${held ? "border-2 border-warn bg-warn-soft" : "border-line"}`} data-testid="legal-hold">
      <p className="font-medium">
        <span aria-hidden className="mr-1">{held ? "⛊" : "○"}</span>
        {held ? `Under legal hold: ${hold.data.legalHoldReason}` : "Not under legal hold"}
      </p>
      <p className="text-sm text-ink-2">
        {held
          ? "No original or derived file of this job can be deleted until the hold is released."
          : "Set a hold when the evidence may be needed in a dispute, claim or inquiry: deletion is then refused, and every refused attempt is logged."}
      </p>
      {canManage && (
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            save.mutate(held ? { hold: false, reason: reason || undefined } : { hold: true, reason });
          }}
        >
          <Field
            className="min-w-64 flex-1"
            label={held ? "Why is it released? (optional)" : "Reason for the hold"}
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            error={fieldError}
            maxLength={500}
          />
          <Button type="submit" variant={held ? "secondary" : "primary"} busy={save.isPending}>
            {held ? "Release hold" : "Set legal hold"}
          </Button>
        </form>
      )}
      {save.error && !fieldError && (
        <p role="alert" className="text-sm text-bad">
          {save.error.message}
        </p>
      )}
    </div>
  );
}
