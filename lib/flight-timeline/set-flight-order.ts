// The pilot's order of a flight's files: sequenceIndex 0..n-1 for every live recording of the flight,
// in one transaction. The list must name exactly the flight's recordings (no more, no fewer, no
// repeats), so an order made on a stale page cannot silently drop a file that arrived meanwhile.
// { recorderOrder: true } puts the files back in the recorder's order (file times, then names).
import "server-only";
import { and, eq, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { requireFlight } from "./load-flight-timeline";
import { recorderOrder } from "./order-flight-files";

export type FlightOrderInput = { recordingIds: string[] } | { recorderOrder: true };

export async function setFlightOrder(organisationId: string, flightId: string, input: FlightOrderInput): Promise<string[]> {
  await requireFlight(organisationId, flightId);
  return db().transaction(async (tx) => {
    // Same lock as ingest's insertion into the flight order: the two never interleave.
    await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`cairn-flight-order:${flightId}`}, 0))`);
    const rows = await tx
      .select({
        id: recordings.id,
        originalName: recordings.originalName,
        relativePath: recordings.relativePath,
        recorderModifiedAt: recordings.recorderModifiedAt,
        sequenceIndex: recordings.sequenceIndex,
      })
      .from(recordings)
      .where(and(eq(recordings.organisationId, organisationId), eq(recordings.flightId, flightId), isNull(recordings.deletedAt)));
    let ids: string[];
    if ("recorderOrder" in input) {
      ids = recorderOrder(rows).map((r) => r.id);
    } else {
      ids = input.recordingIds;
      const known = new Set(rows.map((r) => r.id));
      const given = new Set(ids);
      if (given.size !== ids.length) throw refused("A recording is listed twice");
      if (ids.length !== rows.length || ids.some((id) => !known.has(id))) {
        throw refused("List every recording of this flight exactly once (the flight changed? reload and try again)");
      }
    }
    for (const [index, id] of ids.entries()) {
      await tx.update(recordings).set({ sequenceIndex: index, updatedAt: new Date() }).where(and(eq(recordings.id, id), eq(recordings.organisationId, organisationId)));
    }
    return ids;
  });
}

const refused = (message: string) => new ApiError("unprocessable", message, { recordingIds: [message] });
