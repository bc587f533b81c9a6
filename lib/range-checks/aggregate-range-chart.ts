import { LINK_EVENTS, type LinkEvent } from "./link-events";

/**
 * Chart data for comparing how far the link held: slant range at first degradation, total loss and
 * reacquisition, grouped by one setup variable (camera orientation, antenna orientation, aircraft or site).
 * Every point keeps where it came from (flight, recording, second and frame), so it can be traced back.
 * Each event gets its own horizontal offset inside a group, so the three sit side by side as a grouped
 * dot plot instead of on top of one another; the same numbers also come back as a table.
 */

export const CHART_DIMENSIONS = ["cameraOrientation", "antennaOrientation", "aircraft", "site"] as const;
export type ChartDimension = (typeof CHART_DIMENSIONS)[number];

export const CHART_DIMENSION_LABELS: Record<ChartDimension, string> = {
  cameraOrientation: "Camera orientation",
  antennaOrientation: "Antenna orientation",
  aircraft: "Aircraft",
  site: "Site",
};

export const NOT_RECORDED = "Not recorded";

/** Where a range check came from: its flight, and the recording, second and frame of its link event. */
export type ChartSource = {
  readonly flightId: string;
  readonly flownOn: string;
  readonly recordingId: string | null;
  readonly recordingName: string | null;
  readonly atSec: number | null;
  readonly atFrame: number | null;
};

export type ChartInputRow = {
  readonly id: string;
  readonly event: LinkEvent;
  readonly slantRangeM: number;
  readonly cameraOrientation: string | null;
  readonly antennaOrientation: string | null;
  readonly aircraft: string | null;
  readonly site?: string | null;
  readonly source?: ChartSource | null;
};

export type EventStats = { readonly count: number; readonly minM: number; readonly medianM: number; readonly maxM: number };

export type ChartGroup = {
  readonly index: number;
  readonly label: string;
  readonly stats: Readonly<Record<LinkEvent, EventStats | null>>;
};

export type ChartPoint = {
  readonly id: string;
  readonly groupIndex: number;
  /** Position on the x axis: the group index plus the event's offset. */
  readonly x: number;
  readonly event: LinkEvent;
  readonly slantRangeM: number;
  readonly source: ChartSource | null;
};

export type RangeChartData = {
  readonly dimension: ChartDimension;
  readonly groups: readonly ChartGroup[];
  readonly points: readonly ChartPoint[];
};

export const EVENT_OFFSET: Record<LinkEvent, number> = { first_degradation: -0.22, total_loss: 0, reacquired: 0.22 };

/** Middle value; the mean of the two middle values for an even count. */
export function median(values: readonly number[]): number {
  if (values.length === 0) throw new Error("median of no values");
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

// "Camera up" and "camera up " are the same setup typed twice, not two setups.
const foldKey = (text: string) => text.trim().replace(/\s+/g, " ").toLocaleLowerCase("en");

export function aggregateRangeChart(rows: readonly ChartInputRow[], dimension: ChartDimension): RangeChartData {
  const byKey = new Map<string, { label: string; rows: ChartInputRow[] }>();
  for (const row of rows) {
    if (!Number.isFinite(row.slantRangeM)) continue;
    const raw = (row[dimension] ?? "").trim();
    const key = raw ? foldKey(raw) : "";
    const group = byKey.get(key) ?? { label: raw ? raw.replace(/\s+/g, " ") : NOT_RECORDED, rows: [] };
    group.rows.push(row);
    byKey.set(key, group);
  }
  // Named setups alphabetically, the unnamed one last, so the order is stable between visits.
  const ordered = [...byKey.entries()].sort(([ka, a], [kb, b]) => {
    if (ka === "" || kb === "") return ka === "" ? 1 : -1;
    return a.label.localeCompare(b.label, "en");
  });

  const groups: ChartGroup[] = [];
  const points: ChartPoint[] = [];
  ordered.forEach(([, group], index) => {
    const stats = {} as Record<LinkEvent, EventStats | null>;
    for (const event of LINK_EVENTS) {
      const values = group.rows.filter((r) => r.event === event).map((r) => r.slantRangeM);
      stats[event] = values.length
        ? { count: values.length, minM: Math.min(...values), medianM: median(values), maxM: Math.max(...values) }
        : null;
    }
    groups.push({ index, label: group.label, stats });
    for (const r of group.rows) {
      points.push({ id: r.id, groupIndex: index, x: index + EVENT_OFFSET[r.event], event: r.event, slantRangeM: r.slantRangeM, source: r.source ?? null });
    }
  });
  return { dimension, groups, points };
}
