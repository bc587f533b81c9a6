"use client";
// The jobs table: the home page after sign-in. What is due, where, for whom, in which state, and who flies and reviews it.
import { useState } from "react";
import Link from "next/link";
import { useRouter, useSearchParams } from "next/navigation";
import type { ColumnDef } from "@tanstack/react-table";
import { ResourceTable } from "@/components/ui/resource-table";
import { PageHeader } from "@/components/ui/page-header";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";
import { JOB_STATUSES, JOB_STATUS_MEANING, type JobStatus } from "@/lib/validation/work";
import { isOverdue } from "@/lib/filing/format-work-dates";
import type { Role } from "@/db/schema/types";
import { JobForm, type JobFormRow } from "./job-form";
import { JobStatusBadge, JobStatusLegend } from "./job-status";
import { useOptions, type ClientOption } from "./use-options";

type Row = JobFormRow & {
  siteName: string;
  siteTimeZone: string;
  clientId: string;
  clientName: string;
  pilotName: string | null;
  reviewerName: string | null;
  flightCount: number;
};

const OPEN = "planned,fieldwork,review";

export function JobsView({ canWrite, me }: { canWrite: boolean; me: { userId: string; role: Role } }) {
  const search = useSearchParams();
  const router = useRouter();
  const [creating, setCreating] = useState(false);
  const clients = useOptions<ClientOption>("/api/clients", "clients", { sort: "name" });
  const status = search.get("status") ?? OPEN;
  const clientId = search.get("clientId") ?? "";
  const siteId = search.get("siteId") ?? "";
  const mine = search.get("mine") === "1";

  const setParam = (name: string, value: string) => {
    const next = new URLSearchParams(search.toString());
    if (value) next.set(name, value);
    else next.delete(name);
    router.replace(`/jobs${next.size ? `?${next}` : ""}`);
  };

  const params: Record<string, string> = {
    ...(status !== "all" ? { status } : {}),
    ...(clientId ? { clientId } : {}),
    ...(siteId ? { siteId } : {}),
    ...(mine ? { [me.role === "reviewer" ? "reviewerId" : "pilotId"]: me.userId } : {}),
  };

  const person = (name: string | null) => name ?? <span className="text-ink-2">Not assigned</span>;
  const columns: ColumnDef<Row, unknown>[] = [
    {
      id: "title",
      header: "Job",
      accessorKey: "title",
      cell: (c) => (
        <Link href={`/jobs/${c.row.original.id}`} className="font-medium text-lake underline-offset-2 hover:underline">
          {c.row.original.title}
        </Link>
      ),
    },
    { id: "status", header: "Status", accessorKey: "status", cell: (c) => <JobStatusBadge status={c.row.original.status} /> },
    {
      id: "dueDate",
      header: "Due",
      accessorKey: "dueDate",
      cell: (c) => {
        const r = c.row.original;
        if (!r.dueDate) return <span className="text-ink-2">No date</span>;
        return (
          <span className="whitespace-nowrap font-mono text-xs" title={`Due ${r.dueDate}, ${r.siteTimeZone}`}>
            {r.dueDate}
            {isOverdue(r.dueDate, r.status, r.siteTimeZone) && <span className="ml-2 font-sans font-semibold text-bad">Overdue</span>}
          </span>
        );
      },
    },
    { id: "siteName", meta: { hideBelow: "md" }, header: "Site", accessorKey: "siteName" },
    { id: "clientName", meta: { hideBelow: "lg" }, header: "Client", accessorKey: "clientName" },
    { id: "pilotName", meta: { hideBelow: "lg" }, header: "Pilot", accessorKey: "pilotName", cell: (c) => person(c.row.original.pilotName) },
    { id: "reviewerName", meta: { hideBelow: "xl" }, header: "Reviewer", accessorKey: "reviewerName", cell: (c) => person(c.row.original.reviewerName) },
    { id: "flightCount", meta: { hideBelow: "md" }, header: "Flights", accessorKey: "flightCount", enableSorting: false },
  ];

  return (
    <>
      <PageHeader
        title="Jobs"
        intro="Inspection work at your sites: what is due, its status, and who flies and reviews it."
        actions={canWrite && <Button onClick={() => setCreating(true)}>New job</Button>}
      />
      <div className="mb-4 grid items-start gap-4 lg:grid-cols-[1fr_minmax(0,28rem)]">
        <div className="flex flex-wrap items-end gap-3">
          <SelectField label="Status" value={status} onChange={(e) => setParam("status", e.target.value === OPEN ? "" : e.target.value)} className="w-60">
            <option value={OPEN}>Open (planned to review)</option>
            {JOB_STATUSES.map((s: JobStatus) => (
              <option key={s} value={s}>
                {JOB_STATUS_MEANING[s].label}
              </option>
            ))}
            <option value="all">All statuses</option>
          </SelectField>
          <SelectField label="Client" value={clientId} onChange={(e) => setParam("clientId", e.target.value)} className="w-56">
            <option value="">All clients</option>
            {clients.data?.items.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </SelectField>
          {(me.role === "pilot" || me.role === "reviewer") && (
            <label className="flex min-h-10 items-center gap-2 text-sm">
              <input type="checkbox" className="h-4 w-4" checked={mine} onChange={(e) => setParam("mine", e.target.checked ? "1" : "")} />
              Assigned to me
            </label>
          )}
          {siteId && (
            <button type="button" className="min-h-10 rounded-md border border-line px-3 text-sm hover:bg-paper-2" onClick={() => setParam("siteId", "")}>
              One site only · show all sites ✕
            </button>
          )}
        </div>
        <JobStatusLegend />
      </div>
      <ResourceTable<Row>
        key={JSON.stringify(params)}
        endpoint="/api/jobs"
        queryKey="jobs"
        columns={columns}
        extraParams={params}
        searchLabel="Filter jobs"
        empty={{
          title: status === OPEN && !clientId && !siteId && !mine ? "No open jobs" : "No jobs match these filters",
          next: canWrite
            ? "Plan a job at one of your sites: its scope, due date, and the pilot and reviewer who will work on it."
            : "Jobs appear here when an owner plans them. Try “All statuses” to see finished work.",
          action: canWrite ? <Button onClick={() => setCreating(true)}>New job</Button> : undefined,
        }}
      />
      {creating && <JobForm row={null} defaultSiteId={siteId || undefined} onClose={() => setCreating(false)} />}
    </>
  );
}
