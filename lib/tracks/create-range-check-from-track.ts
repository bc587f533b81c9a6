// One click turns a link event of a signal trace into a range check with nothing typed: the event and its
// time come from the stored trace, the position and height from the stored track at that moment under the
// alignment in force (lib/tracks/load-flight-track.ts), and the range check says where its figures came from.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { signalTraces } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { createRangeCheckFromTrace } from "@/lib/range-checks/create-range-check-from-trace";
import { getRangeCheckFlightOrThrow } from "@/lib/range-checks/flight-for-range-check";
import { LINK_EVENT_META } from "@/lib/range-checks/link-events";
import { linkEventForInterval } from "@/lib/range-checks/trace-interval-event";
import { alignmentInForce, loadRecordingClocks, loadTrackRow, measureMoment } from "./load-flight-track";
import { fromStoredPoint } from "./track-types";

const refuse = (field: string, message: string) => new ApiError("unprocessable", message, { [field]: [message] });

export async function createRangeCheckFromTrack(member: Member, flightId: string, input: { recordingId: string; intervalIndex: number }) {
  const orgId = member.organisationId;
  const flight = await getRangeCheckFlightOrThrow(orgId, flightId);
  const track = await loadTrackRow(orgId, flight.id);
  if (!track) throw notFound("This flight has no track yet; import one first");
  const recs = await loadRecordingClocks(orgId, flight.id);
  const rec = recs.find((r) => r.id === input.recordingId);
  if (!rec) throw refuse("recordingId", "Choose a recording of this flight");
  const [trace] = await db().select({ intervals: signalTraces.intervals }).from(signalTraces).where(and(eq(signalTraces.recordingId, rec.id), eq(signalTraces.organisationId, orgId)));
  const interval = trace?.intervals[input.intervalIndex];
  const event = trace ? linkEventForInterval(trace.intervals, input.intervalIndex) : null;
  if (!interval || !event) throw refuse("intervalIndex", "Choose a link event of this recording's signal trace");

  const alignment = await alignmentInForce(orgId, track, recs);
  const points = track.points.map(fromStoredPoint);
  const launch = flight.launch ?? { lat: points[0].lat, lon: points[0].lon };
  const measured = measureMoment(points, launch, rec, interval.startSec, alignment?.offsetMs ?? null);
  if (!measured.position) throw refuse("intervalIndex", `${LINK_EVENT_META[event].label} at ${interval.startSec} s of ${rec.name} has no position on the track: ${measured.reason}`);
  if (measured.position.heightM === null) throw refuse("intervalIndex", `The track has no height at this moment, so the slant range cannot be measured; log this range check by hand`);

  const how = alignment?.method === "frame_match" ? "a frame matched to a track point" : "the recordings' file times (not checked against the track)";
  const notes =
    `Measured from the flight track “${track.originalName}” (SHA-256 ${track.sha256.slice(0, 12)}…) at ${measured.trackTime} on the track's clock, ` +
    `alignment ± ${((alignment?.uncertaintyMs ?? 0) / 1000).toFixed(2)} s from ${how}; ` +
    `${flight.launch ? "from the flight's launch point" : "from the track's first point (the flight has no launch point)"}; ` +
    `height above the launch ${track.heightSource === "above_launch" ? "from the track's height column" : "from the track's elevations, measured from its first point"}.`;
  const position = flight.launch
    ? { by: "coordinates" as const, latitude: measured.position.latitude, longitude: measured.position.longitude }
    : { by: "distance" as const, groundDistanceM: measured.position.groundDistanceM, bearingDeg: measured.position.bearingDeg };
  return createRangeCheckFromTrace(member, {
    flightId: flight.id,
    recordingId: rec.id,
    intervalIndex: input.intervalIndex,
    position,
    heightAglM: Math.max(0, measured.position.heightM),
    antennaOrientation: null,
    cameraOrientation: null,
    aircraft: flight.aircraft,
    firmware: null,
    notes,
  });
}
