// One click on a signal-trace interval logs the link event it marks: the event and its time come from
// the stored trace, never from the browser; the pilot confirms the position and height in the form.
import "server-only";
import { and, eq, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { rangeChecks, signalTraces } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import type { RangeCheckFromTraceInput } from "@/lib/validation/range-checks";
import { getRangeCheckFlightOrThrow, requireRecordingOfFlight } from "./flight-for-range-check";
import { LINK_EVENT_META } from "./link-events";
import { figuresOrFieldError, getRangeCheckOrThrow } from "./range-checks";
import { linkEventForInterval } from "./trace-interval-event";

const refuse = (field: string, message: string) => new ApiError("unprocessable", "Some fields are not valid", { [field]: [message] });

export async function createRangeCheckFromTrace(member: Member, input: RangeCheckFromTraceInput) {
  const orgId = member.organisationId;
  const flight = await getRangeCheckFlightOrThrow(orgId, input.flightId);
  const recording = await requireRecordingOfFlight(orgId, flight.id, input.recordingId);
  const [trace] = await db()
    .select({ intervals: signalTraces.intervals })
    .from(signalTraces)
    .where(and(eq(signalTraces.recordingId, recording.id), eq(signalTraces.organisationId, orgId)));
  if (!trace) throw refuse("recordingId", "This recording has no signal trace yet; wait for processing to finish, or log the range check by hand");
  const interval = trace.intervals[input.intervalIndex];
  if (!interval) throw refuse("intervalIndex", `The signal trace has ${trace.intervals.length} intervals; choose one of them`);
  const event = linkEventForInterval(trace.intervals, input.intervalIndex);
  if (!event) throw refuse("intervalIndex", "This interval is intact video with no loss before it: it marks no link event");
  const atSec = interval.startSec;

  const figures = figuresOrFieldError(flight, input);
  return db().transaction(async (tx) => {
    // two clicks (or two crew members) on the same interval log it once: a row lock cannot guard a row
    // that does not exist yet, so the recording's id takes a transaction-scoped advisory lock instead
    await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`range-check:${recording.id}`}, 0))`);
    const [already] = await tx
      .select({ id: rangeChecks.id })
      .from(rangeChecks)
      .where(
        and(
          eq(rangeChecks.organisationId, orgId),
          eq(rangeChecks.recordingId, recording.id),
          eq(rangeChecks.event, event),
          eq(rangeChecks.atSec, atSec),
          isNull(rangeChecks.archivedAt),
        ),
      );
    if (already) throw new ApiError("conflict", `${LINK_EVENT_META[event].label} at ${atSec} s of this recording is already logged`);
    const [row] = await tx
      .insert(rangeChecks)
      .values({
        organisationId: orgId,
        flightId: flight.id,
        recordingId: recording.id,
        event,
        atSec,
        ...figures,
        antennaOrientation: input.antennaOrientation,
        cameraOrientation: input.cameraOrientation,
        aircraft: input.aircraft,
        firmware: input.firmware,
        notes: input.notes,
        createdBy: member.userId,
      })
      .returning({ id: rangeChecks.id });
    return row.id;
  }).then((id) => getRangeCheckOrThrow(orgId, id));
}
