"use client";
// Slant range at first degradation, total loss and reacquisition, side by side per setup. Each event
// has its own marker shape and a text label on every point, and the same figures follow as a table.
import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import Link from "next/link";
import { CartesianGrid, LabelList, Legend, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from "recharts";
import { SelectField } from "@/components/ui/field";
import { fetchJson } from "@/components/fetch-json";
import { fromMetres } from "@/lib/geo";
import { CHART_DIMENSIONS, CHART_DIMENSION_LABELS, type ChartDimension, type RangeChartData } from "@/lib/range-checks/aggregate-range-chart";
import { LINK_EVENTS, LINK_EVENT_META, type LinkEvent } from "@/lib/range-checks/link-events";
import { formatMetresIn } from "@/lib/range-checks/format-figures";
import type { DisplayUnits } from "@/lib/validation/range-checks";
import { Caution } from "@/components/ui/caution";
import { LOCAL_RULES_CAUTION, RADIO_RANGE_CAUTION } from "@/lib/geo";
import { LinkEventMark } from "./link-event-mark";

// colour repeats what shape and label already say (WCAG 2.2 SC 1.4.1; docs/look.md)
const FILL: Record<LinkEvent, string> = { first_degradation: "#0f6e7a", total_loss: "#9b1c1c", reacquired: "#1d2430" };

export function RangeChart({ flightId, flightLabel, units }: { flightId: string | null; flightLabel: string | null; units: DisplayUnits }) {
  const [by, setBy] = useState<ChartDimension>("cameraOrientation");
  const [scope, setScope] = useState<"all" | "flight">("all");
  const params = new URLSearchParams({ by, ...(scope === "flight" && flightId ? { flightId } : {}) });
  const query = useQuery({ queryKey: ["range-chart", params.toString()], queryFn: () => fetchJson<RangeChartData>(`/api/range-checks/chart?${params}`) });
  const data = query.data;
  const groups = data?.groups ?? [];

  const series = LINK_EVENTS.map((event) => ({
    event,
    points: (data?.points ?? [])
      .filter((p) => p.event === event)
      .map((p) => ({
        x: p.x,
        y: Number(fromMetres(p.slantRangeM, units).toFixed(1)),
        label: formatMetresIn(p.slantRangeM, units, 0),
        group: groups[p.groupIndex]?.label ?? "",
        // shown in the tooltip: the flight and the frame the point measured
        from: p.source ? `${p.source.flownOn}${p.source.recordingName ? `, ${p.source.recordingName}` : ""}${p.source.atFrame !== null ? ` frame ${p.source.atFrame}` : ""}` : "",
      })),
  }));

  return (
    <section aria-labelledby="range-chart-title" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <h2 id="range-chart-title" className="mr-auto text-lg font-semibold">
          Compare slant range at each link event
        </h2>
        <SelectField label="Group by" value={by} onChange={(e) => setBy(e.target.value as ChartDimension)}>
          {CHART_DIMENSIONS.map((d) => (
            <option key={d} value={d}>
              {CHART_DIMENSION_LABELS[d]}
            </option>
          ))}
        </SelectField>
        <SelectField label="Range checks of" value={scope} onChange={(e) => setScope(e.target.value as "all" | "flight")} className="max-w-full [&_select]:max-w-full">
          <option value="all">All flights</option>
          <option value="flight" disabled={!flightId}>
            This flight{flightLabel ? ` (${flightLabel})` : ""}
          </option>
        </SelectField>
      </div>
      {query.isError ? (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          Could not load the chart: {(query.error as Error).message}
        </p>
      ) : !data ? (
        <div className="h-80 animate-pulse rounded-md bg-paper-2" role="status" aria-label="Loading chart" />
      ) : data.points.length === 0 ? (
        <p className="rounded-md border border-dashed border-line px-4 py-6 text-center text-sm text-ink-2">
          No range checks to compare yet. Log one from a signal-trace event or with “New range check”.
        </p>
      ) : (
        <>
          <figure className="rounded-md border border-line bg-white p-2 dark:bg-paper-2" data-testid="range-chart">
            <div className="h-80 w-full" aria-hidden>
              <ResponsiveContainer width="100%" height="100%">
                <ScatterChart margin={{ top: 16, right: 48, bottom: 24, left: 16 }} accessibilityLayer={false}>
                  <CartesianGrid strokeDasharray="3 3" />
                  <XAxis
                    type="number"
                    dataKey="x"
                    domain={[-0.5, groups.length - 0.5]}
                    ticks={groups.map((g) => g.index)}
                    tickFormatter={(i: number) => groups[i]?.label ?? ""}
                    interval={0}
                    name={CHART_DIMENSION_LABELS[by]}
                  />
                  <YAxis
                    type="number"
                    dataKey="y"
                    name="Slant range"
                    unit={` ${units}`}
                    width={90}
                    label={{ value: `Slant range (${units})`, angle: -90, position: "insideLeft", offset: 0 }}
                  />
                  <Tooltip
                    cursor={{ strokeDasharray: "3 3" }}
                    formatter={(value, name) => (name === "Slant range" ? `${value} ${units}` : value)}
                    labelFormatter={() => ""}
                  />
                  <Legend itemSorter={(item) => LINK_EVENTS.findIndex((ev) => LINK_EVENT_META[ev].label === item.value)} />
                  {series.map((s) => (
                    <Scatter key={s.event} name={LINK_EVENT_META[s.event].label} data={s.points} fill={FILL[s.event]} shape={LINK_EVENT_META[s.event].shape} legendType={LINK_EVENT_META[s.event].shape}>
                      <LabelList dataKey="label" position="right" fontSize={11} />
                    </Scatter>
                  ))}
                </ScatterChart>
              </ResponsiveContainer>
            </div>
            <figcaption className="px-2 pt-1 text-xs text-ink-2">
              Each point is one range check: ● picture breaking up, ▲ video lost, ■ video back, grouped by {CHART_DIMENSION_LABELS[by].toLowerCase()}. The table below
              holds the same figures.
            </figcaption>
          </figure>
          {/* the chart shows distances to the aircraft: the radio-range caution sits beside it (docs/look.md, "Cautions") */}
          <div className="flex flex-col gap-2" data-testid="range-chart-cautions">
            {[RADIO_RANGE_CAUTION, LOCAL_RULES_CAUTION].map((c) => (
              <Caution key={c.id} summary={c.summary} detail={c.detail} sources={[...c.sources]} />
            ))}
          </div>
          <div className="relative max-w-[calc(100vw-2rem)] overflow-x-auto rounded-md border border-line">
            <table className="tabular w-full border-collapse text-sm" data-testid="range-chart-table">
              <caption className="sr-only">Slant range per link event and {CHART_DIMENSION_LABELS[by].toLowerCase()}</caption>
              <thead className="bg-paper-2">
                <tr>
                  <th scope="col" className="border-b border-line px-3 py-2 text-left font-medium">
                    {CHART_DIMENSION_LABELS[by]}
                  </th>
                  {LINK_EVENTS.map((ev) => (
                    <th key={ev} scope="col" className="border-b border-line px-3 py-2 text-left font-medium">
                      <LinkEventMark event={ev} />
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {groups.map((g) => (
                  <tr key={g.index} className="border-b border-line/60 last:border-0">
                    <th scope="row" className="px-3 py-2 text-left font-medium">
                      {g.label}
                    </th>
                    {LINK_EVENTS.map((ev) => {
                      const s = g.stats[ev];
                      return (
                        <td key={ev} className="px-3 py-2 font-mono text-xs">
                          {s ? (
                            <>
                              median {formatMetresIn(s.medianM, units)}
                              <br />
                              <span className="text-ink-2">
                                {s.count === 1 ? "1 check" : `${s.count} checks, ${formatMetresIn(s.minM, units)} to ${formatMetresIn(s.maxM, units)}`}
                              </span>
                            </>
                          ) : (
                            <span className="text-ink-2">none logged</span>
                          )}
                        </td>
                      );
                    })}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <details className="text-sm" data-testid="range-chart-sources">
            <summary className="cursor-pointer">Where each point comes from ({data.points.length})</summary>
            <ul className="mt-2 flex flex-col gap-1">
              {data.points.map((p) => (
                <li key={p.id} className="flex flex-wrap items-center gap-x-2">
                  <LinkEventMark event={p.event} />
                  <span className="font-mono">{formatMetresIn(p.slantRangeM, units)}</span>
                  <span className="text-ink-2">{groups[p.groupIndex]?.label}</span>
                  {p.source && (
                    <>
                      <Link href={`/flights/${p.source.flightId}`} className="text-lake underline">
                        flight of {p.source.flownOn}
                      </Link>
                      {p.source.recordingId && p.source.recordingName ? (
                        <Link href={`/recordings/${p.source.recordingId}${p.source.atFrame !== null ? `?frame=${p.source.atFrame}` : ""}`} className="text-lake underline">
                          {p.source.recordingName}
                          {p.source.atFrame !== null ? `, frame ${p.source.atFrame}` : ""}
                          {p.source.atSec !== null ? ` (${p.source.atSec.toFixed(2)} s)` : ""}
                        </Link>
                      ) : (
                        <span className="text-ink-2">no recording named</span>
                      )}
                    </>
                  )}
                </li>
              ))}
            </ul>
          </details>
        </>
      )}
    </section>
  );
}
