"use client";
// Removing a member from the organisation, after a second click that names them.
import { useState } from "react";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { fetchJson } from "@/components/fetch-json";
import type { MemberRow, Notice } from "./member-types";

export function RemoveMember({ row, onNotice }: { row: MemberRow; onNotice: (n: Notice) => void }) {
  const qc = useQueryClient();
  const [confirming, setConfirming] = useState(false);
  const remove = useMutation({
    mutationFn: () => fetchJson(`/api/members/${row.userId}`, { method: "DELETE" }),
    onSuccess: async () => {
      onNotice({ kind: "ok", text: `${row.name} was removed from the organisation.` });
      await qc.invalidateQueries({ queryKey: ["members"] });
    },
    onError: (err) => {
      setConfirming(false);
      onNotice({ kind: "problem", text: (err as Error).message });
    },
  });
  if (!confirming) {
    return (
      <button type="button" className="text-bad underline" onClick={() => setConfirming(true)}>
        Remove
      </button>
    );
  }
  return (
    <span className="inline-flex flex-wrap items-center gap-2" role="group" aria-label={`Remove ${row.name}?`}>
      <span className="text-xs">Remove {row.name}?</span>
      <Button variant="danger" className="min-h-8 px-2 py-1 text-xs" busy={remove.isPending} onClick={() => remove.mutate()}>
        Yes, remove
      </Button>
      <Button variant="quiet" className="min-h-8 px-2 py-1 text-xs" onClick={() => setConfirming(false)} autoFocus>
        Keep
      </Button>
    </span>
  );
}
