// The facts of a flight that range checks are measured from, read inside the caller's organisation.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { flights, recordings } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import type { GeoPoint } from "@/lib/geo";

export type RangeCheckFlight = {
  id: string;
  jobId: string;
  aircraft: string | null;
  maxAltitudeAglM: number | null;
  launch: GeoPoint | null;
};

export async function getRangeCheckFlightOrThrow(orgId: string, flightId: string, tx: DbOrTx = db()): Promise<RangeCheckFlight> {
  const [row] = await tx
    .select({
      id: flights.id,
      jobId: flights.jobId,
      aircraft: flights.aircraft,
      maxAltitudeAglM: flights.maxAltitudeAglM,
      launchLatitude: flights.launchLatitude,
      launchLongitude: flights.launchLongitude,
    })
    .from(flights)
    .where(and(eq(flights.id, flightId), eq(flights.organisationId, orgId)));
  if (!row) throw notFound("Flight not found");
  const { launchLatitude: lat, launchLongitude: lon, ...rest } = row;
  return { ...rest, launch: lat === null || lon === null ? null : { lat, lon } };
}

/** A recording named on a range check must be one of that flight's own. */
export async function requireRecordingOfFlight(orgId: string, flightId: string, recordingId: string, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: recordings.id, originalName: recordings.originalName })
    .from(recordings)
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, orgId), eq(recordings.flightId, flightId), isNull(recordings.deletedAt)));
  if (!row) throw new ApiError("unprocessable", "Some fields are not valid", { recordingId: ["Choose a recording of this flight"] });
  return row;
}
