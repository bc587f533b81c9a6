// Everything the flight page's track section shows, computed on the server from stored rows: the track
// as evidence, the alignment in force (the newest stored one, or else the proposal from file times),
// the track drawn on the site plan with the link state at each point, and the ground distance, height
// and slant range at every link event of the signal traces and at every finding.
import "server-only";
import { and, asc, desc, eq, inArray, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { inverse, slantRange, type GeoPoint } from "@/lib/geo";
import { recordingFileUrl } from "@/lib/media-serving/media-urls";
import { recordingTiming } from "@/lib/recordings/recording-frame-rate";
import { getRangeCheckFlightOrThrow } from "@/lib/range-checks/flight-for-range-check";
import { toPlan } from "@/lib/range-checks/plan-projection";
import { traceLinkEvents } from "@/lib/range-checks/trace-interval-event";
import type { LinkEvent } from "@/lib/range-checks/link-events";
import { describeAlignment, overlap, proposeOffset, type RecordingClock } from "./align-track";
import { trackPositionAt } from "./track-position-at";
import { fromStoredPoint, type TrackPoint } from "./track-types";

/** A track starting farther than this from the logged launch point is flagged (m; ours, a few GNSS errors wide). */
export const LAUNCH_MISMATCH_M = 25;

/** At most this many points are sent to the browser for the plan and the chart. */
export const DISPLAY_POINTS = 2_000;

export type LinkState = "intact" | "damaged" | "lost" | "unrecorded";

export type MeasuredMoment = {
  /** on the track's clock, ISO 8601 UTC; null when no alignment is possible */
  trackTime: string | null;
  position: { latitude: number; longitude: number; groundDistanceM: number; bearingDeg: number; heightM: number | null; slantRangeM: number | null } | null;
  /** why there is no position */
  reason: string | null;
};

const fileOf = (key: string) => key.slice(key.lastIndexOf("/") + 1);

export async function loadTrackRow(orgId: string, flightId: string) {
  const [row] = await db()
    .select({
      id: s.flightTracks.id,
      jobId: s.flightTracks.jobId,
      originalName: s.flightTracks.originalName,
      format: s.flightTracks.format,
      sizeBytes: s.flightTracks.sizeBytes,
      sha256: s.flightTracks.sha256,
      pointCount: s.flightTracks.pointCount,
      startsAt: s.flightTracks.startsAt,
      endsAt: s.flightTracks.endsAt,
      heightSource: s.flightTracks.heightSource,
      points: s.flightTracks.points,
      warnings: s.flightTracks.warnings,
      createdAt: s.flightTracks.createdAt,
      uploadedByName: s.users.name,
    })
    .from(s.flightTracks)
    .leftJoin(s.users, eq(s.users.id, s.flightTracks.uploadedBy))
    .where(and(eq(s.flightTracks.organisationId, orgId), eq(s.flightTracks.flightId, flightId)));
  return row ?? null;
}

/** The flight's recordings on the recorder's clock (start = file time - length), with their traces. */
export async function loadRecordingClocks(orgId: string, flightId: string) {
  const rows = await db()
    .select({
      id: s.recordings.id,
      name: s.recordings.originalName,
      state: s.recordings.state,
      recorderModifiedAt: s.recordings.recorderModifiedAt,
      durationSec: s.recordings.durationSec,
      fpsOverride: s.recordings.fpsOverride,
      facts: s.recordings.facts,
      figures: s.recordings.figures,
      defaultFps: s.organisations.defaultControllerFps,
      intervals: s.signalTraces.intervals,
    })
    .from(s.recordings)
    .innerJoin(s.organisations, eq(s.organisations.id, s.recordings.organisationId))
    .leftJoin(s.signalTraces, and(eq(s.signalTraces.recordingId, s.recordings.id), eq(s.signalTraces.organisationId, orgId)))
    .where(and(eq(s.recordings.organisationId, orgId), eq(s.recordings.flightId, flightId), isNull(s.recordings.deletedAt)))
    .orderBy(asc(s.recordings.sequenceIndex), asc(s.recordings.createdAt));
  return rows.map((r) => {
    const timing = r.state === "ready" ? recordingTiming(r, r.defaultFps) : null;
    const durationSec = timing?.durationSec ?? r.durationSec ?? null;
    const endMs = r.recorderModifiedAt ? r.recorderModifiedAt.getTime() : null;
    const startMs = endMs !== null && durationSec !== null ? endMs - durationSec * 1000 : null;
    return { id: r.id, name: r.name, state: r.state, fps: timing?.fps ?? null, durationSec, startMs, endMs, intervals: r.intervals ?? null };
  });
}

export type RecordingClockRow = Awaited<ReturnType<typeof loadRecordingClocks>>[number];

export async function latestAlignment(orgId: string, trackId: string) {
  const [row] = await db()
    .select({
      offsetMs: s.trackAlignments.offsetMs,
      method: s.trackAlignments.method,
      uncertaintyMs: s.trackAlignments.uncertaintyMs,
      recordingId: s.trackAlignments.recordingId,
      frame: s.trackAlignments.frame,
      pointIndex: s.trackAlignments.pointIndex,
      createdAt: s.trackAlignments.createdAt,
      setByName: s.users.name,
    })
    .from(s.trackAlignments)
    .leftJoin(s.users, eq(s.users.id, s.trackAlignments.setBy))
    .where(and(eq(s.trackAlignments.organisationId, orgId), eq(s.trackAlignments.trackId, trackId)))
    .orderBy(desc(s.trackAlignments.createdAt))
    .limit(1);
  return row ?? null;
}

export function clocksOf(recs: readonly RecordingClockRow[]): RecordingClock[] {
  return recs.flatMap((r) => (r.startMs !== null && r.endMs !== null ? [{ id: r.id, startMs: r.startMs, endMs: r.endMs }] : []));
}

/** The alignment in force: the newest stored one, else the proposal (not stored until someone accepts it). */
export async function alignmentInForce(orgId: string, track: { id: string; startsAt: Date; endsAt: Date }, recs: readonly RecordingClockRow[]) {
  const stored = await latestAlignment(orgId, track.id);
  if (stored) return { ...stored, stored: true as const };
  const clocks = clocksOf(recs);
  if (!clocks.length) return null;
  const p = proposeOffset(clocks, { startMs: track.startsAt.getTime(), endMs: track.endsAt.getTime() });
  return { offsetMs: p.offsetMs, method: "file_times", uncertaintyMs: p.uncertaintyMs, recordingId: null, frame: null, pointIndex: null, createdAt: null, setByName: null, stored: false as const };
}

/** Measures one moment of a recording from the launch point, or says why it cannot. */
export function measureMoment(points: readonly TrackPoint[], launch: GeoPoint, rec: RecordingClockRow, atSec: number, offsetMs: number | null): MeasuredMoment {
  if (offsetMs === null || rec.startMs === null) return { trackTime: null, position: null, reason: "this recording has no file time, so it cannot be placed on the track's clock" };
  const t = rec.startMs + atSec * 1000 + offsetMs;
  const at = trackPositionAt(points, t);
  const trackTime = new Date(Math.round(t)).toISOString();
  if (!at.ok) return { trackTime, position: null, reason: `this moment is ${at.reason}` };
  const { distanceM, initialBearingDeg } = inverse(launch.lat, launch.lon, at.lat, at.lon);
  return {
    trackTime,
    position: {
      latitude: at.lat,
      longitude: at.lon,
      groundDistanceM: distanceM,
      bearingDeg: initialBearingDeg,
      heightM: at.h,
      // the straight line is as long below the launch level as above it
      slantRangeM: at.h === null ? null : slantRange({ groundDistance: distanceM, heightAgl: Math.abs(at.h) }),
    },
    reason: null,
  };
}

function stateAt(recs: readonly RecordingClockRow[], t: number, offsetMs: number | null): LinkState {
  if (offsetMs === null) return "unrecorded";
  for (const r of recs) {
    if (r.startMs === null || r.endMs === null || !r.intervals) continue;
    const sec = (t - offsetMs - r.startMs) / 1000;
    if (sec < 0 || sec > (r.endMs - r.startMs) / 1000) continue;
    const iv = r.intervals.find((i, k) => sec >= i.startSec && (sec < i.endSec || (k === r.intervals!.length - 1 && sec <= i.endSec)));
    if (iv) return iv.state;
  }
  return "unrecorded";
}

export async function loadFlightTrackView(orgId: string, flightId: string) {
  const flight = await getRangeCheckFlightOrThrow(orgId, flightId);
  const row = await loadTrackRow(orgId, flightId);
  const recs = await loadRecordingClocks(orgId, flightId);
  if (!row) return { flightId, track: null, recordings: recs.map((r) => ({ id: r.id, name: r.name })) };

  const points = row.points.map(fromStoredPoint);
  const launch = flight.launch ? { ...flight.launch, source: "flight" as const } : { lat: points[0].lat, lon: points[0].lon, source: "track" as const };
  const alignment = await alignmentInForce(orgId, row, recs);
  const offsetMs = alignment?.offsetMs ?? null;
  const trackSpan = { startMs: row.startsAt.getTime(), endMs: row.endsAt.getTime() };

  const renditions = recs.length
    ? await db()
        .select({ recordingId: s.renditions.recordingId, storageKey: s.renditions.storageKey })
        .from(s.renditions)
        .where(and(eq(s.renditions.organisationId, orgId), eq(s.renditions.kind, "playable"), inArray(s.renditions.recordingId, recs.map((r) => r.id))))
    : [];

  const warnings = [...row.warnings];
  if (flight.launch) {
    // heights are measured from the track's first point (or given above the launch by the file); a track
    // that starts elsewhere than the logged launch point measures from somewhere else than the distances do
    const apart = inverse(flight.launch.lat, flight.launch.lon, points[0].lat, points[0].lon).distanceM;
    if (apart > LAUNCH_MISMATCH_M) warnings.push(`The track starts ${Math.round(apart)} m from the flight's launch point: distances are measured from the launch point, heights from where the track starts`);
  }
  const recordings = recs.map((r) => {
    const playable = renditions.find((x) => x.recordingId === r.id);
    const clock = r.startMs !== null && r.endMs !== null ? { id: r.id, startMs: r.startMs, endMs: r.endMs } : null;
    const overlapMs = clock && offsetMs !== null ? overlap([clock], trackSpan, offsetMs) : 0;
    if (clock && offsetMs !== null && overlapMs === 0) warnings.push(`${r.name} does not overlap the track under this alignment: its moments have no position`);
    return {
      id: r.id,
      name: r.name,
      fps: r.fps,
      durationSec: r.durationSec,
      startOnTrack: clock && offsetMs !== null ? new Date(Math.round(clock.startMs + offsetMs)).toISOString() : null,
      startOnRecorder: clock ? new Date(clock.startMs).toISOString() : null,
      overlapSec: overlapMs / 1000,
      playableUrl: playable ? recordingFileUrl(r.id, fileOf(playable.storageKey)) : null,
    };
  });

  // the plan and the chart: at most DISPLAY_POINTS points, evenly spread over the track
  const step = Math.max(1, Math.ceil(points.length / DISPLAY_POINTS));
  const display = points
    .filter((_, i) => i % step === 0 || i === points.length - 1)
    .map((p) => {
      const plan = toPlan(launch, p);
      return { t: p.t, east: plan.east, north: plan.north, h: p.h, d: Math.hypot(plan.east, plan.north), state: stateAt(recs, p.t, offsetMs) };
    });

  const logged = await db()
    .select({ id: s.rangeChecks.id, recordingId: s.rangeChecks.recordingId, event: s.rangeChecks.event, atSec: s.rangeChecks.atSec })
    .from(s.rangeChecks)
    .where(and(eq(s.rangeChecks.organisationId, orgId), eq(s.rangeChecks.flightId, flightId), isNull(s.rangeChecks.archivedAt)));

  const events: {
    recordingId: string;
    recordingName: string;
    intervalIndex: number;
    event: LinkEvent;
    atSec: number;
    atFrame: number;
    rangeCheckId: string | null;
    measured: MeasuredMoment;
  }[] = [];
  for (const r of recs) {
    if (!r.intervals) continue;
    for (const ev of traceLinkEvents(r.intervals)) {
      const match = logged.find((l) => l.recordingId === r.id && l.event === ev.event && l.atSec === ev.atSec);
      events.push({ recordingId: r.id, recordingName: r.name, intervalIndex: ev.intervalIndex, event: ev.event, atSec: ev.atSec, atFrame: ev.atFrame, rangeCheckId: match?.id ?? null, measured: measureMoment(points, launch, r, ev.atSec, offsetMs) });
    }
  }

  const findingRows = recs.length
    ? await db()
        .select({ id: s.findings.id, recordingId: s.findings.recordingId, startSec: s.findings.startSec, startFrame: s.findings.startFrame, severity: s.findings.severity, note: s.findings.note })
        .from(s.findings)
        .where(and(eq(s.findings.organisationId, orgId), inArray(s.findings.recordingId, recs.map((r) => r.id)), isNull(s.findings.deletedAt)))
        .orderBy(asc(s.findings.startSec))
    : [];
  const findings = findingRows.map((f) => {
    const r = recs.find((x) => x.id === f.recordingId)!;
    return { ...f, recordingName: r.name, measured: measureMoment(points, launch, r, f.startSec, offsetMs) };
  });

  const fps = recordings.find((r) => r.id === alignment?.recordingId)?.fps ?? recordings.find((r) => r.fps)?.fps ?? null;
  return {
    flightId,
    track: {
      id: row.id,
      originalName: row.originalName,
      format: row.format,
      sizeBytes: row.sizeBytes,
      sha256: row.sha256,
      pointCount: row.pointCount,
      startsAt: row.startsAt.toISOString(),
      endsAt: row.endsAt.toISOString(),
      heightSource: row.heightSource,
      importedAt: row.createdAt.toISOString(),
      importedBy: row.uploadedByName,
    },
    launch,
    loggedHeightM: flight.maxAltitudeAglM,
    alignment: alignment
      ? {
          offsetMs: alignment.offsetMs,
          method: alignment.method,
          uncertaintyMs: alignment.uncertaintyMs,
          recordingId: alignment.recordingId,
          frame: alignment.frame,
          pointIndex: alignment.pointIndex,
          setAt: alignment.createdAt ? alignment.createdAt.toISOString() : null,
          setBy: alignment.setByName,
          stored: alignment.stored,
          description: describeAlignment(alignment, fps),
        }
      : null,
    recordings,
    points: display,
    /** every track point's time, for choosing the point a frame matches (index = point number - 1) */
    pointTimes: points.map((p) => p.t),
    takeOffPoint: takeOffIndex(points),
    events,
    findings,
    warnings,
  };
}

export type FlightTrackView = Awaited<ReturnType<typeof loadFlightTrackView>>;

/**
 * A likely take-off to match a frame to (index, 0-based): the last point still within 0.5 m of the launch
 * height before the track first reaches 2 m above it (thresholds ours: above a GNSS height's jitter on
 * the ground, below any climb-out).
 */
export function takeOffIndex(points: readonly TrackPoint[]): number | null {
  let i = points.findIndex((p) => p.h !== null && p.h >= 2);
  if (i < 0) return null;
  while (i > 0 && (points[i].h === null || (points[i].h as number) > 0.5)) i--;
  return i;
}
