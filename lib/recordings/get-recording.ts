// One recording of the organisation, with its facts and tags; another organisation's answers 404.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, jobs, recordings, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { recordingColumns } from "./list-recordings";

export async function getRecordingOrThrow(organisationId: string, id: string) {
  const [row] = await db()
    .select({ ...recordingColumns, facts: recordings.facts, processedAt: recordings.processedAt, fpsOverride: recordings.fpsOverride })
    .from(recordings)
    .innerJoin(flights, eq(flights.id, recordings.flightId))
    .innerJoin(jobs, eq(jobs.id, recordings.jobId))
    .leftJoin(users, eq(users.id, recordings.uploadedBy))
    .where(and(eq(recordings.id, id), eq(recordings.organisationId, organisationId), isNull(recordings.deletedAt)));
  if (!row) throw notFound("Recording not found");
  return row;
}
