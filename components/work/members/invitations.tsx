"use client";
// Invitations not yet accepted: to whom, which role, until when; withdrawing one ends its link.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { DataTable } from "@/components/ui/resource-table";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import type { InvitationRow, Notice } from "./member-types";

export function Invitations({ onNotice }: { onNotice: (n: Notice) => void }) {
  const qc = useQueryClient();
  const list = useQuery({ queryKey: ["invitations"], queryFn: () => fetchJson<{ items: InvitationRow[]; total: number }>("/api/invitations") });
  const withdraw = useMutation({
    mutationFn: (inv: InvitationRow) => fetchJson(`/api/invitations/${inv.id}`, { method: "DELETE" }),
    onSuccess: async (_r, inv) => {
      onNotice({ kind: "ok", text: `The invitation to ${inv.email} was withdrawn; its link no longer works.` });
      await qc.invalidateQueries({ queryKey: ["invitations"] });
    },
    onError: (err) => onNotice({ kind: "problem", text: (err as Error).message }),
  });
  return (
    <section aria-labelledby="invitations-title" className="flex flex-col gap-3">
      <h2 id="invitations-title" className="text-lg font-semibold">
        Pending invitations
      </h2>
      {list.isLoading ? (
        <div className="h-16 animate-pulse rounded-md bg-paper-2" role="status" aria-label="Loading" />
      ) : list.isError ? (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          Could not load invitations: {(list.error as Error).message}
        </p>
      ) : !list.data?.items.length ? (
        <p className="rounded-md border border-dashed border-line px-3 py-4 text-sm text-ink-2">No invitations waiting. Invite someone with the form beside the crew list.</p>
      ) : (
        <DataTable<InvitationRow>
          data={list.data.items}
          caption="Pending invitations"
          getRowId={(inv) => inv.id}
          columns={[
            { id: "email", header: "E-mail", meta: { className: "break-all" }, cell: (c) => c.row.original.email },
            { id: "role", header: "Role", meta: { hideBelow: "sm" }, cell: (c) => ROLE_LABELS[c.row.original.role].label },
            { id: "invitedBy", header: "Invited by", meta: { hideBelow: "md" }, cell: (c) => c.row.original.invitedByName ?? "—" },
            { id: "expires", header: "Link expires", meta: { hideBelow: "md", className: "font-mono text-xs" }, cell: (c) => c.row.original.expiresAt.slice(0, 10) },
            {
              id: "state",
              header: "State",
              meta: { hideBelow: "lg" },
              cell: (c) => (c.row.original.state === "expired" ? <span className="font-medium text-bad">Expired: invite again</span> : "Waiting for reply"),
            },
            {
              id: "actions",
              header: () => <span className="sr-only">Withdraw</span>,
              meta: { label: "Withdraw" },
              cell: (c) => (
                <button type="button" className="text-lake underline disabled:opacity-50" disabled={withdraw.isPending} onClick={() => withdraw.mutate(c.row.original)}>
                  Withdraw
                </button>
              ),
            },
          ]}
        />
      )}
    </section>
  );
}
