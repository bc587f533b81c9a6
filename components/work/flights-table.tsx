"use client";
// A table of flights: across all jobs on the flights page, or one job's flights on its detail page.
import Link from "next/link";
import type { ColumnDef } from "@tanstack/react-table";
import { ResourceTable } from "@/components/ui/resource-table";
import { formatAltitude, altitudeCautionsToShow, type AltitudeUnit } from "@/lib/filing/format-altitude";
import { Coordinates } from "./coordinates";

export type FlightRow = {
  id: string;
  jobId: string;
  jobTitle: string;
  flownOn: string;
  siteName: string;
  siteTimeZone: string;
  clientName: string;
  pilotName: string | null;
  aircraft: string | null;
  maxAltitudeAglM: number | null;
  launchLatitude: number | null;
  launchLongitude: number | null;
};

export function AltitudeCell({ metres, units }: { metres: number | null; units: AltitudeUnit }) {
  if (metres == null) return <span className="text-ink-2">—</span>;
  const a = formatAltitude(metres, units);
  const above = altitudeCautionsToShow(metres).length > 0;
  return (
    <span className="whitespace-nowrap font-mono text-xs">
      {a.primary} <span className="text-ink-2">({a.secondary})</span>
      {above && (
        <span className="ml-2 rounded border border-warn/60 bg-warn-soft px-1 font-sans font-medium text-warn" title="Above 120 m (about 400 ft) above ground level, a common limit">
          △ Above common limit
        </span>
      )}
    </span>
  );
}

export function FlightsTable({ units, jobId, empty }: { units: AltitudeUnit; jobId?: string; empty: { title: string; next: string; action?: React.ReactNode } }) {
  const columns: ColumnDef<FlightRow, unknown>[] = [
    {
      id: "flownOn",
      header: "Flown on",
      accessorKey: "flownOn",
      cell: (c) => (
        <Link href={`/flights/${c.row.original.id}`} className="whitespace-nowrap font-mono text-lake underline-offset-2 hover:underline" title={`Site time zone: ${c.row.original.siteTimeZone}`}>
          {c.row.original.flownOn}
        </Link>
      ),
    },
    ...(jobId
      ? []
      : ([
          {
            id: "jobTitle",
            header: "Job",
            accessorKey: "jobTitle",
            cell: (c) => (
              <Link href={`/jobs/${c.row.original.jobId}`} className="underline-offset-2 hover:underline">
                {c.row.original.jobTitle}
              </Link>
            ),
          },
          { id: "siteName", meta: { hideBelow: "md" }, header: "Site", accessorKey: "siteName" },
        ] as ColumnDef<FlightRow, unknown>[])),
    { id: "pilotName", meta: { hideBelow: "lg" }, header: "Pilot in command", accessorKey: "pilotName", cell: (c) => c.row.original.pilotName ?? <span className="text-ink-2">Not recorded</span> },
    { id: "aircraft", meta: { hideBelow: "md" }, header: "Aircraft", accessorKey: "aircraft", cell: (c) => c.row.original.aircraft ?? <span className="text-ink-2">—</span> },
    { id: "maxAltitudeAglM", meta: { hideBelow: "lg" }, header: "Max altitude", accessorKey: "maxAltitudeAglM", cell: (c) => <AltitudeCell metres={c.row.original.maxAltitudeAglM} units={units} /> },
    { id: "launch", meta: { hideBelow: "xl" }, header: "Launch point", enableSorting: false, cell: (c) => <Coordinates lat={c.row.original.launchLatitude} lon={c.row.original.launchLongitude} /> },
  ];
  return (
    <ResourceTable<FlightRow>
      endpoint="/api/flights"
      queryKey="flights"
      columns={columns}
      extraParams={jobId ? { jobId } : {}}
      searchLabel="Filter flights"
      initialSort={[{ id: "flownOn", desc: true }]}
      empty={empty}
    />
  );
}
