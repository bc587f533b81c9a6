// The column names a CSV track may use (matched without regard to case, spaces or hyphens), shown in the
// flight page's help. One column of each of the four kinds; any other column refuses the file, so a
// misread column (a speed taken for a height) can never slip into a distance.
export type CsvColumnKind = "time" | "latitude" | "longitude" | "height";

export const CSV_TRACK_COLUMNS: { kind: CsvColumnKind; names: string[]; meaning: string; required: boolean }[] = [
  { kind: "time", names: ["time", "timestamp", "datetime", "date_time", "time_utc"], meaning: "date and time with its zone, e.g. 2026-03-14T10:00:05Z or 2026-03-14 11:00:05+01:00", required: true },
  { kind: "latitude", names: ["latitude", "lat"], meaning: "WGS84 decimal degrees, north positive", required: true },
  { kind: "longitude", names: ["longitude", "lon", "lng", "long"], meaning: "WGS84 decimal degrees, east positive", required: true },
  {
    kind: "height",
    names: ["height_above_launch_m", "height_m", "height", "relative_altitude_m", "height_above_launch_ft", "height_ft", "relative_altitude_ft"],
    meaning: "height above the launch point; metres unless the name ends in _ft (international feet)",
    required: false,
  },
];

export const normaliseColumnName = (name: string) => name.trim().toLowerCase().replace(/[\s-]+/g, "_");

export function columnKind(name: string): { kind: CsvColumnKind; feet: boolean } | null {
  const n = normaliseColumnName(name);
  for (const c of CSV_TRACK_COLUMNS) if (c.names.includes(n)) return { kind: c.kind, feet: n.endsWith("_ft") };
  return null;
}
