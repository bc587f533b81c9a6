"use client";
// The members page (owners): the crew and their roles, pending invitations, and inviting by e-mail.
import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { ColumnDef } from "@tanstack/react-table";
import type { z } from "zod";
import { ResourceTable } from "@/components/ui/resource-table";
import { PageHeader } from "@/components/ui/page-header";
import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { FormError } from "@/components/ui/panel";
import { fetchJson } from "@/components/fetch-json";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { ROLES, inviteInput } from "@/lib/validation/members";
import type { Role } from "@/db/schema/types";
import { useSave } from "./use-save";
import { ClientChoices, ClientTies } from "./client-ties";

type MemberRow = { userId: string; name: string; email: string; role: Role; joinedAt: string };
type InvitationRow = { id: string; email: string; role: Role; invitedByName: string | null; expiresAt: string; createdAt: string; state: "pending" | "expired" };
type Notice = { kind: "ok" | "problem"; text: string } | null;

export function MembersView({ me, mailboxHref }: { me: string; mailboxHref?: string }) {
  const [notice, setNotice] = useState<Notice>(null);
  const columns: ColumnDef<MemberRow, unknown>[] = [
    {
      id: "name",
      header: "Name",
      enableSorting: false,
      cell: (c) => (
        <span className="font-medium">
          {c.row.original.name}
          {c.row.original.userId === me && <span className="ml-2 text-xs font-normal text-ink-2">(you)</span>}
        </span>
      ),
    },
    { id: "email", header: "E-mail", enableSorting: false, cell: (c) => c.row.original.email },
    { id: "role", header: "Role", enableSorting: false, cell: (c) => <RoleSelect row={c.row.original} onNotice={setNotice} /> },
    {
      id: "sees",
      header: "Sees",
      enableSorting: false,
      cell: (c) => (c.row.original.role === "client" ? <ClientTies userId={c.row.original.userId} name={c.row.original.name} onNotice={setNotice} /> : <span className="text-sm text-ink-2">The whole organisation</span>),
    },
    { id: "joinedAt", header: "Joined", enableSorting: false, cell: (c) => <span className="font-mono text-xs">{c.row.original.joinedAt.slice(0, 10)}</span> },
    { id: "actions", header: () => <span className="sr-only">Actions</span>, enableSorting: false, cell: (c) => (c.row.original.userId === me ? null : <RemoveMember row={c.row.original} onNotice={setNotice} />) },
  ];
  return (
    <>
      <PageHeader title="Members" intro="Who works in this organisation, and what each role may do. Invite people by e-mail; the link works once, for 7 days." />
      {notice && (
        <p role={notice.kind === "problem" ? "alert" : "status"} className={`mb-4 rounded-md border px-3 py-2 text-sm ${notice.kind === "problem" ? "border-bad bg-bad-soft" : "border-good bg-paper-2"}`}>
          {notice.kind === "problem" ? "Not done: " : "Done: "}
          {notice.text}
          {notice.kind === "ok" && mailboxHref && notice.text.startsWith("Invitation") && (
            <>
              {" "}
              Local mail lands in the{" "}
              <a href={mailboxHref} className="text-lake underline">
                development mailbox
              </a>
              .
            </>
          )}
        </p>
      )}
      <div className="grid gap-8 xl:grid-cols-[1fr_22rem]">
        <div className="flex flex-col gap-8">
          <section aria-labelledby="crew-title" className="flex flex-col gap-3">
            <h2 id="crew-title" className="text-lg font-semibold">
              Crew
            </h2>
            <ResourceTable<MemberRow>
              endpoint="/api/members"
              queryKey="members"
              columns={columns}
              searchLabel="Filter members"
              showArchivedToggle={false}
              empty={{ title: "No members", next: "Invite the people you fly and review with." }}
            />
          </section>
          <Invitations onNotice={setNotice} />
        </div>
        <aside className="flex flex-col gap-4">
          <InviteForm onNotice={setNotice} />
          <RoleGuide />
        </aside>
      </div>
    </>
  );
}

function RoleSelect({ row, onNotice }: { row: MemberRow; onNotice: (n: Notice) => void }) {
  const qc = useQueryClient();
  const change = useMutation({
    mutationFn: (role: Role) => fetchJson(`/api/members/${row.userId}`, { method: "PATCH", json: { role } }),
    onSuccess: async (_r, role) => {
      onNotice({ kind: "ok", text: `${row.name} is now ${ROLE_LABELS[role].label.toLowerCase()}.` });
      await qc.invalidateQueries({ queryKey: ["members"] });
    },
    onError: (err) => onNotice({ kind: "problem", text: (err as Error).message }),
  });
  return (
    <select
      aria-label={`Role of ${row.name}`}
      className="min-h-9 rounded-md border border-line bg-white px-2 text-sm dark:bg-paper-2"
      value={change.isPending ? change.variables : row.role}
      disabled={change.isPending}
      onChange={(e) => change.mutate(e.target.value as Role)}
    >
      {ROLES.map((r) => (
        <option key={r} value={r}>
          {ROLE_LABELS[r].label}
        </option>
      ))}
    </select>
  );
}

function RemoveMember({ row, onNotice }: { row: MemberRow; onNotice: (n: Notice) => void }) {
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

type InviteValues = z.input<typeof inviteInput>;

function InviteForm({ onNotice }: { onNotice: (n: Notice) => void }) {
  const form = useForm<InviteValues, unknown, z.output<typeof inviteInput>>({ resolver: zodResolver(inviteInput), defaultValues: { email: "", role: "pilot" } });
  const save = useSave<InviteValues, { email: string; expiresAt: string }>({
    url: "/api/invitations",
    invalidate: ["invitations"],
    setError: form.setError,
    onDone: (r) => {
      onNotice({ kind: "ok", text: `Invitation sent to ${r.email}. The link works once, until ${r.expiresAt.slice(0, 10)}.` });
      form.reset({ email: "", role: form.getValues("role"), clientIds: [] });
    },
  });
  const role = useWatch({ control: form.control, name: "role" }) as Role;
  const clientIds = (useWatch({ control: form.control, name: "clientIds" }) as string[] | undefined) ?? [];
  const e = form.formState.errors;
  return (
    <section aria-labelledby="invite-title" className="rounded-lg border border-line p-4">
      <h2 id="invite-title" className="mb-3 text-lg font-semibold">
        Invite someone
      </h2>
      <form className="flex flex-col gap-3" noValidate onSubmit={form.handleSubmit((v) => save.mutate(v))}>
        <Field label="E-mail" type="email" autoComplete="off" {...form.register("email")} error={e.email?.message} />
        <div className="flex flex-col gap-1">
          <SelectField label="Role" {...form.register("role")} error={e.role?.message}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r].label}
              </option>
            ))}
          </SelectField>
          {role && ROLE_LABELS[role] && <p className="text-xs text-ink-2">{ROLE_LABELS[role].meaning}</p>}
        </div>
        {role === "client" && (
          <ClientChoices legend="Clients this account sees" value={clientIds} onChange={(ids) => form.setValue("clientIds", ids)} error={e.clientIds?.message} />
        )}
        <FormError error={save.error && !(save.error as { fields?: unknown }).fields ? save.error : null} />
        <Button type="submit" busy={save.isPending}>
          Send invitation
        </Button>
      </form>
    </section>
  );
}

function Invitations({ onNotice }: { onNotice: (n: Notice) => void }) {
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
        <div className="h-16 animate-pulse rounded-md bg-paper-2" aria-label="Loading" />
      ) : list.isError ? (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          Could not load invitations: {(list.error as Error).message}
        </p>
      ) : !list.data?.items.length ? (
        <p className="rounded-md border border-dashed border-line px-3 py-4 text-sm text-ink-2">No invitations waiting. Invite someone with the form beside the crew list.</p>
      ) : (
        <div className="overflow-x-auto rounded-md border border-line">
          <table className="tabular w-full border-collapse text-sm">
            <thead className="bg-paper-2">
              <tr>
                {["E-mail", "Role", "Invited by", "Link expires", "State", ""].map((h, i) => (
                  <th key={i} scope="col" className="border-b border-line px-3 py-2 text-left font-medium">
                    {h || <span className="sr-only">Actions</span>}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {list.data.items.map((inv) => (
                <tr key={inv.id} className="border-b border-line/60 last:border-0">
                  <td className="px-3 py-2">{inv.email}</td>
                  <td className="px-3 py-2">{ROLE_LABELS[inv.role].label}</td>
                  <td className="px-3 py-2">{inv.invitedByName ?? "—"}</td>
                  <td className="px-3 py-2 font-mono text-xs">{inv.expiresAt.slice(0, 10)}</td>
                  <td className="px-3 py-2">{inv.state === "expired" ? <span className="font-medium text-bad">Expired: invite again</span> : "Waiting for reply"}</td>
                  <td className="px-3 py-2">
                    <button type="button" className="text-lake underline disabled:opacity-50" disabled={withdraw.isPending} onClick={() => withdraw.mutate(inv)}>
                      Withdraw
                    </button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

function RoleGuide() {
  return (
    <section aria-labelledby="roles-title" className="rounded-lg border border-line p-4 text-sm">
      <h2 id="roles-title" className="mb-2 font-semibold">
        What each role may do
      </h2>
      <dl className="flex flex-col gap-2">
        {ROLES.map((r) => (
          <div key={r}>
            <dt className="font-medium">{ROLE_LABELS[r].label}</dt>
            <dd className="text-ink-2">{ROLE_LABELS[r].meaning}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-3 text-xs text-ink-2">An organisation always keeps at least one owner.</p>
    </section>
  );
}
