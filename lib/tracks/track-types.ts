// What a parsed flight track is made of, and how a problem with an imported file is told: always with
// the file's name, the line and/or point it was found at, and the reason (lib/tracks/describe-track-problem.ts).
import type { StoredTrackPoint } from "@/db/schema/tracks";

export type TrackFormat = "gpx" | "csv";
export type HeightSource = "above_launch" | "elevation_minus_first" | "none";

/** One point: time in ms since 1970 UTC, WGS84 degrees, height above the launch point in metres (null if unknown). */
export type TrackPoint = { readonly t: number; readonly lat: number; readonly lon: number; readonly h: number | null };

export type TrackProblem = { readonly line: number | null; readonly point: number | null; readonly reason: string };

export type ParsedTrack = {
  readonly format: TrackFormat;
  readonly points: TrackPoint[];
  readonly heightSource: HeightSource;
  /** Problems that do not refuse the file (each already names its line or point). */
  readonly warnings: string[];
};

export type ParseResult = { ok: true; track: ParsedTrack } | { ok: false; format: TrackFormat | null; problems: TrackProblem[] };

/** A refusal stops collecting after this many problems: the first few are what a person can act on. */
export const MAX_PROBLEMS = 20;

/** Largest track file accepted, bytes: a 1 Hz track of a 10-hour day in GPX is about 4 MB. */
export const MAX_TRACK_BYTES = 16 * 1024 * 1024;

/** Most points in one track: 10 Hz for more than five hours. */
export const MAX_TRACK_POINTS = 200_000;

export const toStoredPoint = (p: TrackPoint): StoredTrackPoint => [p.t, p.lat, p.lon, p.h];
export const fromStoredPoint = ([t, lat, lon, h]: StoredTrackPoint): TrackPoint => ({ t, lat, lon, h });
