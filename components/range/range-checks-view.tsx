"use client";
// Range checks of one flight: the signal trace's link events, the logged checks, the comparison chart
// and the CSV export, all in the reader's units.
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import type { ColumnDef } from "@tanstack/react-table";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { ResourceTable, type ListResult } from "@/components/ui/resource-table";
import { EmptyState } from "@/components/ui/empty-state";
import { fetchJson } from "@/components/fetch-json";
import { formatBearing, formatLatLon, formatMetresIn } from "@/lib/range-checks/format-figures";
import { formatMomentSec } from "@/components/trace/trace-summary";
import type { RangeFlight } from "@/lib/range-checks/load-range-page-data";
import type { DisplayUnits } from "@/lib/validation/range-checks";
import { labelFlights } from "./flight-labels";
import { LinkEventMark } from "./link-event-mark";
import { RangeChart } from "./range-chart";
import { RangeCheckForm, RANGE_INVALIDATE, type RangeCheckFormMode } from "./range-check-form";
import type { RangeCheckRow } from "./range-check-types";
import { RangeTabs } from "./range-tabs";
import { SafetyCautions } from "./safety-cautions";
import { TraceEventsPanel } from "./trace-events-panel";
import { UnitsToggle } from "./units-toggle";
import { usePreferredUnits } from "./use-preferred-units";

/** The highest of the flight's logged maximum and its checks' own heights: the altitude caution follows every height shown. */
function useHighestHeight(flight: RangeFlight | null): number | null {
  const top = useQuery({
    queryKey: ["range-checks", "highest", flight?.id],
    queryFn: () => fetchJson<ListResult<RangeCheckRow>>(`/api/range-checks?flightId=${flight!.id}&sort=heightAglM&dir=desc&page=1&pageSize=1&archived=0`),
    enabled: Boolean(flight),
  });
  const heights = [flight?.maxAltitudeAglM, top.data?.items[0]?.heightAglM].filter((h): h is number => typeof h === "number" && Number.isFinite(h));
  return heights.length ? Math.max(...heights) : null;
}

export function RangeChecksView({ flights, flightId, canWrite, initialUnits }: { flights: RangeFlight[]; flightId: string | null; canWrite: boolean; initialUnits: DisplayUnits }) {
  const router = useRouter();
  const { units, setUnits, saving, saveError } = usePreferredUnits(initialUnits);
  const flight = flights.find((f) => f.id === flightId) ?? null;
  const labels = useMemo(() => labelFlights(flights), [flights]);
  const highest = useHighestHeight(flight);
  const [formMode, setFormMode] = useState<RangeCheckFormMode | null>(null);
  const qc = useQueryClient();
  const archive = useMutation({
    mutationFn: (id: string) => fetchJson(`/api/range-checks/${id}`, { method: "DELETE" }),
    onSuccess: () => Promise.all(RANGE_INVALIDATE.map((k) => qc.invalidateQueries({ queryKey: [k] }))),
  });

  const columns: ColumnDef<RangeCheckRow, unknown>[] = [
    { id: "event", header: "Link event", accessorKey: "event", cell: (c) => <LinkEventMark event={c.row.original.event} /> },
    { id: "atSec", header: "Time", accessorKey: "atSec", meta: { hideBelow: "sm" }, cell: (c) => <span className="font-mono">{c.row.original.atSec === null ? "—" : formatMomentSec(c.row.original.atSec)}</span> },
    {
      id: "slantRangeM",
      header: `Slant range (${units})`,
      accessorKey: "slantRangeM",
      meta: { className: "whitespace-nowrap" },
      cell: (c) => <span className="font-mono font-medium">{formatMetresIn(c.row.original.slantRangeM, units)}</span>,
    },
    { id: "groundDistanceM", header: `Ground (${units})`, accessorKey: "groundDistanceM", meta: { hideBelow: "md", className: "whitespace-nowrap" }, cell: (c) => <span className="font-mono">{formatMetresIn(c.row.original.groundDistanceM, units)}</span> },
    { id: "heightAglM", header: `Height AGL (${units})`, accessorKey: "heightAglM", meta: { hideBelow: "sm", className: "whitespace-nowrap" }, cell: (c) => <span className="font-mono">{formatMetresIn(c.row.original.heightAglM, units)}</span> },
    {
      id: "position",
      header: "Position",
      enableSorting: false,
      meta: { hideBelow: "lg", className: "whitespace-nowrap" },
      cell: (c) => {
        const r = c.row.original;
        return (
          <span className="font-mono text-xs">
            {r.bearingDeg !== null ? formatBearing(r.bearingDeg) : "no bearing"}
            {r.latitude !== null && r.longitude !== null && (
              <>
                <br />
                {formatLatLon(r.latitude, r.longitude)}
              </>
            )}
          </span>
        );
      },
    },
    {
      id: "setup",
      header: "Antenna / camera",
      enableSorting: false,
      meta: { hideBelow: "xl" },
      cell: (c) => `${c.row.original.antennaOrientation ?? "—"} / ${c.row.original.cameraOrientation ?? "—"}`,
    },
    { id: "aircraft", header: "Aircraft · firmware", enableSorting: false, meta: { hideBelow: "xl", className: "min-w-36" }, cell: (c) => `${c.row.original.aircraft ?? flight?.aircraft ?? "—"}${c.row.original.firmware ? ` · ${c.row.original.firmware}` : ""}` },
    { id: "recording", header: "Recording", enableSorting: false, meta: { hideBelow: "2xl" }, cell: (c) => <span className="font-mono text-xs">{c.row.original.recordingName ?? "—"}</span> },
    { id: "notes", header: "Notes", enableSorting: false, meta: { hideBelow: "2xl" }, cell: (c) => <span className="line-clamp-3 max-w-56">{c.row.original.notes ?? ""}</span> },
    ...(canWrite
      ? [
          {
            id: "actions",
            header: () => <span className="sr-only">Edit or remove</span>,
            enableSorting: false,
            meta: { label: "Edit or remove", className: "whitespace-nowrap" },
            cell: (c: { row: { original: RangeCheckRow } }) =>
              c.row.original.archivedAt ? (
                <span className="text-ink-2">Removed</span>
              ) : (
                <span className="flex flex-wrap gap-3">
                  <button type="button" className="text-lake underline" onClick={() => setFormMode({ kind: "edit", row: c.row.original })}>
                    Edit
                  </button>
                  <button
                    type="button"
                    className="text-bad underline"
                    onClick={() => {
                      if (window.confirm("Remove this range check from the list, chart and export? It stays archived for the record.")) archive.mutate(c.row.original.id);
                    }}
                  >
                    Remove
                  </button>
                </span>
              ),
          } as ColumnDef<RangeCheckRow, unknown>,
        ]
      : []),
  ];

  return (
    <>
      <PageHeader
        title="Range & distance"
        intro="How far the video link held: link events per flight with position, height, antenna and camera orientation; slant range computed and stored with its inputs."
        actions={<UnitsToggle units={units} onChange={(u) => void setUnits(u)} saving={saving} error={saveError} />}
      />
      <RangeTabs current="checks" />
      {flights.length === 0 ? (
        <EmptyState title="No flights yet" next="Range checks are filed under a flight. Log a flight on a job first, then come back to record how far the link held." />
      ) : (
        <div className="flex flex-col gap-8">
          <div className="flex flex-wrap items-end gap-3">
            <SelectField
              label="Flight"
              value={flight?.id ?? ""}
              onChange={(e) => router.replace(`/range/checks?flightId=${e.target.value}`)}
              className="w-full max-w-xl [&_select]:max-w-full"
            >
              {!flight && <option value="">Choose a flight</option>}
              {flights.map((f) => (
                <option key={f.id} value={f.id}>
                  {labels.get(f.id)}
                </option>
              ))}
            </SelectField>
            {flight && canWrite && <Button onClick={() => setFormMode({ kind: "new" })}>New range check</Button>}
            <div className="ml-auto flex flex-wrap gap-2 text-sm">
              {flight && (
                <a className="inline-flex min-h-10 items-center rounded-md border border-line px-3 hover:bg-paper-2" href={`/api/range-checks/export.csv?flightId=${flight.id}`} download>
                  Export this flight (CSV)
                </a>
              )}
              <a className="inline-flex min-h-10 items-center rounded-md border border-line px-3 hover:bg-paper-2" href="/api/range-checks/export.csv" download>
                Export all flights (CSV)
              </a>
            </div>
          </div>

          {flight && (
            <>
              <TraceEventsPanel flightId={flight.id} canWrite={canWrite} onLog={(event, prefill) => setFormMode({ kind: "trace", event, prefill })} />
              <section aria-labelledby="range-checks-title" className="flex flex-col gap-3">
                <h2 id="range-checks-title" className="text-lg font-semibold">
                  Range checks of this flight
                </h2>
                <div className="grid gap-4 2xl:grid-cols-[minmax(0,1fr)_20rem]">
                  <ResourceTable<RangeCheckRow>
                    key={flight.id}
                    endpoint="/api/range-checks"
                    queryKey="range-checks"
                    extraParams={{ flightId: flight.id }}
                    columns={columns}
                    initialSort={[{ id: "atSec", desc: false }]}
                    searchLabel="Filter by notes, setup or firmware"
                    empty={{
                      title: "No range checks for this flight",
                      next: "Log one from a link event in the signal trace above, or with “New range check” if you measured it by hand.",
                      action: canWrite ? <Button onClick={() => setFormMode({ kind: "new" })}>New range check</Button> : undefined,
                    }}
                  />
                  <SafetyCautions heightAglM={highest} />
                </div>
              </section>
            </>
          )}
          <RangeChart flightId={flight?.id ?? null} flightLabel={flight ? (labels.get(flight.id) ?? flight.flownOn) : null} units={units} />
        </div>
      )}
      {formMode && flight && <RangeCheckForm mode={formMode} flight={flight} units={units} onClose={() => setFormMode(null)} />}
    </>
  );
}
