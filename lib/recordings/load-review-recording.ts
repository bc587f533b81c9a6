// The recording a finding is marked on, read inside the caller's organisation, with the timing that
// turns frames into seconds and the flight's launch point that distances are measured from.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { flights, organisations, recordings } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { recordingTiming, type RecordingTiming } from "./recording-frame-rate";

export type ReviewRecording = {
  id: string;
  organisationId: string;
  jobId: string;
  flightId: string;
  originalName: string;
  sha256: string;
  sizeBytes: number;
  storageKey: string | null;
  state: "waiting" | "processing" | "ready" | "failed";
  timing: RecordingTiming | null;
  launch: { lat: number; lon: number } | null;
};

export async function loadReviewRecording(organisationId: string, recordingId: string, tx: DbOrTx = db()): Promise<ReviewRecording> {
  const [row] = await tx
    .select({
      id: recordings.id,
      organisationId: recordings.organisationId,
      jobId: recordings.jobId,
      flightId: recordings.flightId,
      originalName: recordings.originalName,
      sha256: recordings.sha256,
      sizeBytes: recordings.sizeBytes,
      storageKey: recordings.storageKey,
      state: recordings.state,
      fpsOverride: recordings.fpsOverride,
      durationSec: recordings.durationSec,
      facts: recordings.facts,
      figures: recordings.figures,
      defaultFps: organisations.defaultControllerFps,
      launchLatitude: flights.launchLatitude,
      launchLongitude: flights.launchLongitude,
    })
    .from(recordings)
    .innerJoin(organisations, eq(organisations.id, recordings.organisationId))
    .innerJoin(flights, and(eq(flights.id, recordings.flightId), eq(flights.organisationId, recordings.organisationId)))
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId), isNull(recordings.deletedAt)));
  if (!row) throw notFound("Recording not found");
  return {
    id: row.id,
    organisationId: row.organisationId,
    jobId: row.jobId,
    flightId: row.flightId,
    originalName: row.originalName,
    sha256: row.sha256,
    sizeBytes: row.sizeBytes,
    storageKey: row.storageKey,
    state: row.state,
    timing: row.state === "ready" ? recordingTiming(row, row.defaultFps) : null,
    launch: row.launchLatitude != null && row.launchLongitude != null ? { lat: row.launchLatitude, lon: row.launchLongitude } : null,
  };
}

/** Findings need frames: a recording still processing (or failed) has none to mark yet. */
export function requireTiming(rec: ReviewRecording): RecordingTiming {
  if (!rec.timing) {
    throw new ApiError("conflict", rec.state === "failed" ? "This recording could not be processed; findings need a playable recording" : "This recording is still being processed; mark findings once it is ready");
  }
  return rec.timing;
}
