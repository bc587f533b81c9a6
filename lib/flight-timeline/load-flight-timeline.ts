// A flight's timeline as the API serves it: the flight's live recordings (organisation-filtered) with
// their trace summaries, through buildFlightTimeline.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, recordings, signalTraces } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { readRecordingFigures } from "@/lib/recordings/recording-figures";
import { buildFlightTimeline, type FlightTimeline } from "./build-flight-timeline";

export const FLIGHT_NOT_FOUND = "Flight not found";

export async function requireFlight(organisationId: string, flightId: string) {
  const [flight] = await db()
    .select({ id: flights.id, jobId: flights.jobId })
    .from(flights)
    .where(and(eq(flights.id, flightId), eq(flights.organisationId, organisationId)));
  if (!flight) throw new ApiError("not_found", FLIGHT_NOT_FOUND);
  return flight;
}

export async function loadFlightTimeline(organisationId: string, flightId: string): Promise<FlightTimeline & { flightId: string }> {
  await requireFlight(organisationId, flightId);
  const rows = await db()
    .select({
      id: recordings.id,
      originalName: recordings.originalName,
      relativePath: recordings.relativePath,
      recorderModifiedAt: recordings.recorderModifiedAt,
      sequenceIndex: recordings.sequenceIndex,
      state: recordings.state,
      durationSec: recordings.durationSec,
      figures: recordings.figures,
      summary: signalTraces.summary,
    })
    .from(recordings)
    .leftJoin(signalTraces, and(eq(signalTraces.recordingId, recordings.id), eq(signalTraces.organisationId, organisationId)))
    .where(and(eq(recordings.organisationId, organisationId), eq(recordings.flightId, flightId), isNull(recordings.deletedAt)));
  const timeline = buildFlightTimeline(
    rows.map((r) => {
      // The stored figures when the recording has them (computed once by the worker); recordings
      // processed before figures existed fall back to their trace summary.
      const f = readRecordingFigures(r);
      if (f) {
        return {
          ...r,
          durationSec: f.durationSeconds,
          trace:
            f.signalKnown && f.intactShare !== null
              ? {
                  durationSec: f.durationSeconds,
                  frameCount: f.frameSlots,
                  intactFrames: f.framesIntact,
                  intactShare: f.intactShare,
                  firstDegradationSec: f.firstDegradationSeconds,
                  longestLossSec: f.longestLossSeconds,
                  lostFrames: f.framesLost,
                  lostIsLowerBound: f.framesLostIsLowerBound,
                }
              : null,
        };
      }
      const s = r.summary as (typeof r.summary & { durationSec?: number }) | null;
      return {
        ...r,
        trace: s
          ? {
              durationSec: s.durationSec ?? 0,
              frameCount: s.frameCount,
              intactFrames: s.intactFrames,
              intactShare: s.intactShare,
              firstDegradationSec: s.firstDegradationSec,
              longestLossSec: s.longestLossSec,
            }
          : null,
      };
    }),
  );
  return { flightId, ...timeline };
}
