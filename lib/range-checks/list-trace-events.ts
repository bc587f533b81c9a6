// The link events a flight's signal traces show, ready to be logged as range checks in one click.
import "server-only";
import { and, asc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { rangeChecks, recordings, signalTraces } from "@/db/schema";
import { getRangeCheckFlightOrThrow } from "./flight-for-range-check";
import { traceLinkEvents, type TraceLinkEvent } from "./trace-interval-event";

export type FlightTraceEvent = TraceLinkEvent & {
  recordingId: string;
  recordingName: string;
  sequenceIndex: number;
  /** The range check already logged for this interval, if any. */
  rangeCheckId: string | null;
};

export async function listTraceEvents(orgId: string, flightId: string) {
  const flight = await getRangeCheckFlightOrThrow(orgId, flightId);
  const traced = await db()
    .select({ recordingId: recordings.id, recordingName: recordings.originalName, sequenceIndex: recordings.sequenceIndex, intervals: signalTraces.intervals })
    .from(recordings)
    .innerJoin(signalTraces, and(eq(signalTraces.recordingId, recordings.id), eq(signalTraces.organisationId, orgId)))
    .where(and(eq(recordings.organisationId, orgId), eq(recordings.flightId, flight.id), isNull(recordings.deletedAt)))
    .orderBy(asc(recordings.sequenceIndex), asc(recordings.createdAt));
  const logged = await db()
    .select({ id: rangeChecks.id, recordingId: rangeChecks.recordingId, event: rangeChecks.event, atSec: rangeChecks.atSec })
    .from(rangeChecks)
    .where(and(eq(rangeChecks.organisationId, orgId), eq(rangeChecks.flightId, flight.id), isNull(rangeChecks.archivedAt)));

  const items: FlightTraceEvent[] = [];
  for (const rec of traced) {
    for (const ev of traceLinkEvents(rec.intervals)) {
      const match = logged.find((l) => l.recordingId === rec.recordingId && l.event === ev.event && l.atSec === ev.atSec);
      items.push({ ...ev, recordingId: rec.recordingId, recordingName: rec.recordingName, sequenceIndex: rec.sequenceIndex, rangeCheckId: match?.id ?? null });
    }
  }
  return {
    items,
    total: items.length,
    tracedRecordings: traced.length,
    // what the confirm form is prefilled with: the flight's logged figures, to be corrected by the pilot
    prefill: { heightAglM: flight.maxAltitudeAglM, aircraft: flight.aircraft, hasLaunchPoint: flight.launch !== null },
  };
}
