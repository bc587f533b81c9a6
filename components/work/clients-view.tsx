"use client";
import { useState } from "react";
import Link from "next/link";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { ColumnDef } from "@tanstack/react-table";
import type { z } from "zod";
import { ResourceTable } from "@/components/ui/resource-table";
import { PageHeader } from "@/components/ui/page-header";
import { Button } from "@/components/ui/button";
import { Field, TextAreaField } from "@/components/ui/field";
import { Panel } from "@/components/ui/panel";
import { clientInput } from "@/lib/validation/work";
import { useSave } from "./use-save";
import { FormFooter } from "./form-footer";

type ClientRow = { id: string; name: string; contactName: string | null; contactEmail: string | null; notes: string | null; siteCount: number; archivedAt: string | null };
type Form = z.input<typeof clientInput>;

export function ClientsView({ canWrite }: { canWrite: boolean }) {
  const [editing, setEditing] = useState<ClientRow | "new" | null>(null);
  const columns: ColumnDef<ClientRow, unknown>[] = [
    { id: "name", header: "Client", accessorKey: "name", cell: (c) => <span className="font-medium">{c.row.original.name}</span> },
    { id: "contactName", meta: { hideBelow: "md" }, header: "Contact", accessorKey: "contactName", cell: (c) => c.row.original.contactName ?? "—" },
    { id: "contactEmail", meta: { hideBelow: "lg" }, header: "E-mail", accessorKey: "contactEmail", enableSorting: false, cell: (c) => c.row.original.contactEmail ?? "—" },
    {
      id: "siteCount",
      meta: { hideBelow: "md" },
      header: "Sites",
      accessorKey: "siteCount",
      enableSorting: false,
      cell: (c) => (
        <Link className="text-lake underline" href={`/sites?clientId=${c.row.original.id}`} aria-label={`${c.row.original.siteCount} sites of ${c.row.original.name}`}>
          {c.row.original.siteCount}
        </Link>
      ),
    },
    ...(canWrite
      ? [{ id: "actions", header: "", enableSorting: false, cell: (c: { row: { original: ClientRow } }) => (
          <button type="button" className="text-lake underline" onClick={() => setEditing(c.row.original)}>
            Edit
          </button>
        ) } as ColumnDef<ClientRow, unknown>]
      : []),
  ];
  return (
    <>
      <PageHeader
        title="Clients"
        intro="The asset owners, insurers and managers you fly for. Sites and jobs are filed under them."
        actions={canWrite && <Button onClick={() => setEditing("new")}>New client</Button>}
      />
      <ResourceTable<ClientRow>
        endpoint="/api/clients"
        queryKey="clients"
        columns={columns}
        initialSort={[{ id: "name", desc: false }]}
        empty={{ title: "No clients yet", next: "Add the first client you fly for; then add their sites and jobs.", action: canWrite ? <Button onClick={() => setEditing("new")}>New client</Button> : undefined }}
      />
      {editing && <ClientForm row={editing === "new" ? null : editing} onClose={() => setEditing(null)} />}
    </>
  );
}

function ClientForm({ row, onClose }: { row: ClientRow | null; onClose: () => void }) {
  const form = useForm<Form>({
    resolver: zodResolver(clientInput),
    defaultValues: { name: row?.name ?? "", contactName: row?.contactName ?? "", contactEmail: row?.contactEmail ?? "", notes: row?.notes ?? "" },
  });
  const save = useSave<Form>({ url: row ? `/api/clients/${row.id}` : "/api/clients", method: row ? "PATCH" : "POST", invalidate: ["clients"], setError: form.setError, onDone: onClose });
  const archive = useSave<{ archived: boolean }>({ url: `/api/clients/${row?.id}`, method: "PATCH", invalidate: ["clients"], onDone: onClose });
  const e = form.formState.errors;
  return (
    <Panel open title={row ? `Edit ${row.name}` : "New client"} onClose={onClose}>
      <form className="flex flex-col gap-4" onSubmit={form.handleSubmit((v) => save.mutate(v))}>
        <Field label="Name" {...form.register("name")} error={e.name?.message} />
        <Field label="Contact name" {...form.register("contactName")} error={e.contactName?.message} />
        <Field label="Contact e-mail" type="email" {...form.register("contactEmail")} error={e.contactEmail?.message} />
        <TextAreaField label="Notes" {...form.register("notes")} error={e.notes?.message} />
        <FormFooter submitLabel={row ? "Save client" : "Create client"} save={save} archive={archive} record={row} />
      </form>
    </Panel>
  );
}
