"use client";
// The members page's client ties: which of the organisation's clients a client account sees. Used in
// the crew table (per client account) and in the invitation form (when inviting a client account).
import { useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { fetchJson } from "@/components/fetch-json";

type ClientOption = { id: string; name: string };

function useClients() {
  return useQuery({ queryKey: ["clients", "choices"], queryFn: () => fetchJson<{ items: ClientOption[] }>("/api/clients?pageSize=200&sort=name") });
}

export function ClientChoices({ value, onChange, legend, error }: { value: string[]; onChange: (ids: string[]) => void; legend: string; error?: string }) {
  const clients = useClients();
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="text-sm font-medium">{legend}</legend>
      {clients.isLoading ? (
        <span className="text-xs text-ink-2">Loading clients…</span>
      ) : !clients.data?.items.length ? (
        <span className="text-xs text-ink-2">No clients yet: add one on the Clients page first.</span>
      ) : (
        clients.data.items.map((c) => (
          <label key={c.id} className="flex min-h-8 items-center gap-2 text-sm">
            <input type="checkbox" checked={value.includes(c.id)} onChange={(e) => onChange(e.target.checked ? [...value, c.id] : value.filter((v) => v !== c.id))} />
            {c.name}
          </label>
        ))
      )}
      {error && (
        <p role="alert" className="text-xs font-medium text-bad">
          {error}
        </p>
      )}
    </fieldset>
  );
}

/** For a client account in the crew table: the clients it sees, and an editor for them. */
export function ClientTies({ userId, name, onNotice }: { userId: string; name: string; onNotice: (n: { kind: "ok" | "problem"; text: string }) => void }) {
  const qc = useQueryClient();
  const ties = useQuery({ queryKey: ["member-clients", userId], queryFn: () => fetchJson<{ clientIds: string[] }>(`/api/members/${userId}/clients`) });
  const clients = useClients();
  const [editing, setEditing] = useState<string[] | null>(null);
  const save = useMutation({
    mutationFn: (clientIds: string[]) => fetchJson(`/api/members/${userId}/clients`, { method: "PUT", json: { clientIds } }),
    onSuccess: async () => {
      setEditing(null);
      onNotice({ kind: "ok", text: `${name} now sees the work of the chosen clients only.` });
      await qc.invalidateQueries({ queryKey: ["member-clients", userId] });
    },
    onError: (err) => onNotice({ kind: "problem", text: (err as Error).message }),
  });
  const names = (ties.data?.clientIds ?? []).map((id) => clients.data?.items.find((c) => c.id === id)?.name ?? "…");
  if (editing) {
    return (
      <div className="flex flex-col gap-2">
        <ClientChoices legend={`Clients ${name} sees`} value={editing} onChange={setEditing} />
        <span className="flex gap-2">
          <Button className="min-h-8 px-2 py-1 text-xs" busy={save.isPending} onClick={() => save.mutate(editing)}>
            Save
          </Button>
          <Button variant="quiet" className="min-h-8 px-2 py-1 text-xs" onClick={() => setEditing(null)}>
            Cancel
          </Button>
        </span>
      </div>
    );
  }
  return (
    <span className="text-sm">
      {ties.isLoading ? "…" : names.length ? names.join(", ") : <span className="text-bad">no client yet: sees nothing</span>}{" "}
      <button type="button" className="text-lake underline" onClick={() => setEditing(ties.data?.clientIds ?? [])} aria-label={`Change the clients ${name} sees`}>
        Change
      </button>
    </span>
  );
}
