"use client";
// The sites table: where the crew flies, filed under clients.
import { useState } from "react";
import { useRouter, useSearchParams } from "next/navigation";
import Link from "next/link";
import type { ColumnDef } from "@tanstack/react-table";
import { ResourceTable } from "@/components/ui/resource-table";
import { PageHeader } from "@/components/ui/page-header";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";
import { ASSET_KIND_LABELS } from "@/lib/validation/work";
import { SiteForm, type SiteRow } from "./site-form";
import { Coordinates } from "./coordinates";
import { useOptions, type ClientOption } from "./use-options";

type Row = SiteRow & { jobCount: number };

export function SitesView({ canWrite }: { canWrite: boolean }) {
  const search = useSearchParams();
  const router = useRouter();
  const clientId = search.get("clientId") ?? "";
  const [editing, setEditing] = useState<Row | "new" | null>(null);
  const clients = useOptions<ClientOption>("/api/clients", "clients", { sort: "name" });

  const columns: ColumnDef<Row, unknown>[] = [
    { id: "name", header: "Site", accessorKey: "name", cell: (c) => <span className="font-medium">{c.row.original.name}</span> },
    { id: "clientName", meta: { hideBelow: "md" }, header: "Client", accessorKey: "clientName" },
    { id: "assetKind", meta: { hideBelow: "lg" }, header: "Structure", accessorKey: "assetKind", cell: (c) => ASSET_KIND_LABELS[c.row.original.assetKind] },
    { id: "address", meta: { hideBelow: "xl" }, header: "Address", enableSorting: false, cell: (c) => c.row.original.address ?? <span className="text-ink-2">—</span> },
    { id: "position", meta: { hideBelow: "lg" }, header: "Position", enableSorting: false, cell: (c) => <Coordinates lat={c.row.original.latitude} lon={c.row.original.longitude} /> },
    { id: "timeZone", meta: { hideBelow: "xl" }, header: "Time zone", accessorKey: "timeZone", cell: (c) => <span className="font-mono text-xs">{c.row.original.timeZone}</span> },
    {
      id: "jobCount",
      meta: { hideBelow: "md" },
      header: "Jobs",
      enableSorting: false,
      cell: (c) => (
        <Link className="text-lake underline" href={`/jobs?siteId=${c.row.original.id}&status=all`}>
          {c.row.original.jobCount}
        </Link>
      ),
    },
    ...(canWrite
      ? [
          {
            id: "actions",
            header: () => <span className="sr-only">Actions</span>,
            enableSorting: false,
            cell: (c: { row: { original: Row } }) => (
              <button type="button" className="text-lake underline" onClick={() => setEditing(c.row.original)} aria-label={`Edit ${c.row.original.name}`}>
                Edit
              </button>
            ),
          } as ColumnDef<Row, unknown>,
        ]
      : []),
  ];

  return (
    <>
      <PageHeader
        title="Sites"
        intro="The places you fly: an address, a position in decimal degrees, the site's time zone and where to launch."
        actions={canWrite && <Button onClick={() => setEditing("new")}>New site</Button>}
      />
      <div className="mb-3 max-w-xs">
        <SelectField
          label="Client"
          value={clientId}
          onChange={(e) => router.replace(e.target.value ? `/sites?clientId=${e.target.value}` : "/sites")}
        >
          <option value="">All clients</option>
          {clients.data?.items.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
      </div>
      <ResourceTable<Row>
        key={clientId}
        endpoint="/api/sites"
        queryKey="sites"
        columns={columns}
        extraParams={clientId ? { clientId } : {}}
        initialSort={[{ id: "name", desc: false }]}
        empty={{
          title: clientId ? "No sites for this client yet" : "No sites yet",
          next: "Add a site for one of your clients: its address, position and launch notes. Jobs are planned at sites.",
          action: canWrite ? <Button onClick={() => setEditing("new")}>New site</Button> : undefined,
        }}
      />
      {editing && <SiteForm row={editing === "new" ? null : editing} defaultClientId={clientId || undefined} onClose={() => setEditing(null)} />}
    </>
  );
}
