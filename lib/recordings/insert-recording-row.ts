// Inserts the recording row of an upload inside the commit's transaction, placing it in the flight's
// order by the recorder's file time: a recorder that splits a flight into several files writes them
// in time order, while the browser uploads them in parallel and they finish in any order. Rows
// already in the flight keep their relative order (the pilot may have arranged them by hand); the
// new one goes after every row recorded no later than itself. Without a file time it goes last.
import "server-only";
import { and, eq, gte, isNull, lte, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { recordings } from "@/db/schema";
import type { NewRecording } from "@/db/schema/types";

export async function insertRecordingRow(tx: DbOrTx, row: NewRecording & { id: string; flightId: string; organisationId: string }): Promise<void> {
  // one insertion per flight at a time, so two files finishing together cannot take the same place
  await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`cairn-flight-order:${row.flightId}`}, 0))`);
  const inFlight = and(eq(recordings.organisationId, row.organisationId), eq(recordings.flightId, row.flightId), isNull(recordings.deletedAt));
  let position: number;
  if (row.recorderModifiedAt) {
    const [before] = await tx
      .select({ next: sql<number>`coalesce(max(${recordings.sequenceIndex}) + 1, 0)`.mapWith(Number) })
      .from(recordings)
      .where(and(inFlight, lte(recordings.recorderModifiedAt, row.recorderModifiedAt)));
    position = before.next;
    await tx
      .update(recordings)
      .set({ sequenceIndex: sql`${recordings.sequenceIndex} + 1` })
      .where(and(inFlight, gte(recordings.sequenceIndex, position)));
  } else {
    const [last] = await tx
      .select({ next: sql<number>`coalesce(max(${recordings.sequenceIndex}) + 1, 0)`.mapWith(Number) })
      .from(recordings)
      .where(inFlight);
    position = last.next;
  }
  await tx.insert(recordings).values({ ...row, sequenceIndex: position });
}
