"use client";
// The members page (owners): the crew and their roles, pending invitations, and inviting by e-mail.
// Its parts live in components/work/members/ (role select, removal, invitations, invite form, role guide).
import { useState } from "react";
import type { ColumnDef } from "@tanstack/react-table";
import { ResourceTable } from "@/components/ui/resource-table";
import { PageHeader } from "@/components/ui/page-header";
import { ClientTies } from "./client-ties";
import type { MemberRow, Notice } from "./members/member-types";
import { RoleSelect } from "./members/role-select";
import { RemoveMember } from "./members/remove-member";
import { InviteForm } from "./members/invite-form";
import { Invitations } from "./members/invitations";
import { RoleGuide } from "./members/role-guide";

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
    { id: "email", header: "E-mail", enableSorting: false, meta: { hideBelow: "md", className: "break-all" }, cell: (c) => c.row.original.email },
    { id: "role", header: "Role", enableSorting: false, cell: (c) => <RoleSelect row={c.row.original} onNotice={setNotice} /> },
    {
      id: "sees",
      header: "Sees",
      enableSorting: false,
      meta: { hideBelow: "lg" },
      cell: (c) => (c.row.original.role === "client" ? <ClientTies userId={c.row.original.userId} name={c.row.original.name} onNotice={setNotice} /> : <span className="text-sm text-ink-2">The whole organisation</span>),
    },
    { id: "joinedAt", header: "Joined", enableSorting: false, meta: { hideBelow: "md" }, cell: (c) => <span className="font-mono text-xs">{c.row.original.joinedAt.slice(0, 10)}</span> },
    { id: "actions", header: () => <span className="sr-only">Remove</span>, enableSorting: false, meta: { hideBelow: "sm", label: "Remove" }, cell: (c) => (c.row.original.userId === me ? null : <RemoveMember row={c.row.original} onNotice={setNotice} />) },
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
