// A plain CSV track (RFC 4180) read with csv-parse: a header row naming the columns (csv-track-columns.ts),
// then one point per row. Every problem names its line in the file (csv-parse counts lines, quoted line
// breaks included) and its point number.
import { parse } from "csv-parse/sync";
import { feetToMetres } from "@/lib/geo";
import { checkCoordinates, checkPointOrder, type LocatedPoint } from "./check-track-points";
import { CSV_TRACK_COLUMNS, columnKind, type CsvColumnKind } from "./csv-track-columns";
import { readTrackTime } from "./read-track-time";
import { MAX_PROBLEMS, MAX_TRACK_POINTS, type ParseResult, type TrackProblem } from "./track-types";

type Row = { record: string[]; info: { lines: number } };

export function parseCsvTrack(text: string): ParseResult {
  const nul = text.indexOf("\u0000");
  if (nul >= 0) return refuse([{ line: text.slice(0, nul).split("\n").length, point: null, reason: "the file contains a NUL character; a CSV track is plain text" }]);
  let rows: Row[];
  try {
    rows = parse(text, { bom: true, info: true, skip_empty_lines: true, trim: true, relax_column_count: false, to: MAX_TRACK_POINTS + 2 }) as unknown as Row[];
  } catch (err) {
    const e = err as Error & { lines?: number };
    return refuse([{ line: e.lines ?? null, point: null, reason: `the CSV cannot be read: ${e.message.replace(/^Invalid Record Length: /, "")}` }]);
  }
  if (!rows.length) return refuse([{ line: null, point: null, reason: "the file is empty; a CSV track starts with a header row (time, latitude, longitude, height above launch)" }]);

  const header = rows[0];
  const index: Partial<Record<CsvColumnKind, { at: number; feet: boolean }>> = {};
  const problems: TrackProblem[] = [];
  const accepted = CSV_TRACK_COLUMNS.flatMap((c) => c.names).join(", ");
  header.record.forEach((name, at) => {
    const kind = columnKind(name);
    if (!kind) problems.push({ line: header.info.lines, point: null, reason: `the column "${name.slice(0, 40)}" is not one Cairn reads; the accepted names are ${accepted}` });
    else if (index[kind.kind]) problems.push({ line: header.info.lines, point: null, reason: `the column "${name.slice(0, 40)}" gives the ${kind.kind} a second time` });
    else index[kind.kind] = { at, feet: kind.feet };
  });
  for (const c of CSV_TRACK_COLUMNS) {
    if (c.required && !index[c.kind]) problems.push({ line: header.info.lines, point: null, reason: `the header has no ${c.kind} column (one of ${c.names.join(", ")})` });
  }
  if (problems.length) return refuse(problems);
  if (rows.length - 1 > MAX_TRACK_POINTS) return refuse([{ line: null, point: null, reason: `the track has more than ${MAX_TRACK_POINTS} points` }]);
  if (rows.length === 1) return refuse([{ line: null, point: null, reason: "the file has a header but no points" }]);

  const cols = index as Record<"time" | "latitude" | "longitude", { at: number }> & { height?: { at: number; feet: boolean } };
  const points: LocatedPoint[] = [];
  for (let i = 1; i < rows.length && problems.length < MAX_PROBLEMS; i++) {
    const { record, info } = rows[i];
    const point = i;
    const line = info.lines;
    const timeText = record[cols.time.at];
    if (!timeText) {
      problems.push({ line, point, reason: "the time is empty; a track without times cannot be matched to a recording" });
      continue;
    }
    const time = readTrackTime(timeText);
    if (!time.ok) {
      problems.push({ line, point, reason: time.reason });
      continue;
    }
    const lat = numberOf(record[cols.latitude.at]);
    const lon = numberOf(record[cols.longitude.at]);
    const coord = lat === null || lon === null ? "the latitude or longitude is not a decimal number" : checkCoordinates(lat, lon);
    if (coord) {
      problems.push({ line, point, reason: coord });
      continue;
    }
    let h: number | null = null;
    if (cols.height) {
      const text = record[cols.height.at];
      if (text !== "") {
        const v = numberOf(text);
        if (v === null) {
          problems.push({ line, point, reason: `the height "${text.slice(0, 30)}" is not a number` });
          continue;
        }
        h = cols.height.feet ? feetToMetres(v) : v;
      }
    }
    points.push({ t: time.ms, lat: lat as number, lon: lon as number, h, line });
  }
  if (problems.length) return refuse(problems);
  const order = checkPointOrder(points);
  if (order.length) return refuse(order);
  const warnings: string[] = [];
  const missing = points.filter((p) => p.h === null).length;
  if (!cols.height) warnings.push("the file has no height column: slant ranges use the flight's logged height");
  else if (missing) warnings.push(`${missing} of ${points.length} points have no height: their height is unknown`);
  return {
    ok: true,
    track: { format: "csv", points: points.map(({ t, lat, lon, h }) => ({ t, lat, lon, h })), heightSource: cols.height ? "above_launch" : "none", warnings },
  };
}

function refuse(problems: TrackProblem[]): ParseResult {
  return { ok: false, format: "csv", problems: problems.slice(0, MAX_PROBLEMS) };
}

function numberOf(text: string | undefined): number | null {
  if (text === undefined || !/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(text.trim())) return null;
  return Number(text);
}
