// One recording of the organisation, with its facts and tags; another organisation's answers 404.
import "server-only";
import { and, eq, isNull, sql } from "drizzle-orm";
import { prepared } from "@/db/client";
import { flights, jobs, recordings, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { recordingColumns } from "./list-recordings";

export async function getRecordingOrThrow(organisationId: string, id: string) {
  // the recording page asks this on every poll, so it is built once (db/client.ts, prepared)
  const [row] = await prepared("get-recording", (d) =>
    d
      .select({ ...recordingColumns, facts: recordings.facts, processedAt: recordings.processedAt, fpsOverride: recordings.fpsOverride })
      .from(recordings)
      .innerJoin(flights, eq(flights.id, recordings.flightId))
      .innerJoin(jobs, eq(jobs.id, recordings.jobId))
      .leftJoin(users, eq(users.id, recordings.uploadedBy))
      .where(and(eq(recordings.id, sql.placeholder("id")), eq(recordings.organisationId, sql.placeholder("organisationId")), isNull(recordings.deletedAt)))
      .prepare("get_recording"),
  ).execute({ id, organisationId });
  if (!row) throw notFound("Recording not found");
  return row;
}
