// What became of an upload, as the uploader shows it: still receiving, being stored, stored with
// its hash, the same bytes as a recording the organisation already holds, or refused with a reason.
// The same answer comes back in the last PATCH's headers (Cairn-Upload-Outcome, Cairn-Recording-Id,
// Cairn-Original-SHA256, Cairn-Duplicate-Of; a refusal is the PATCH's 422 JSON body) and from
// GET /api/uploads/<id>. The GET exists because the last PATCH's response can be lost (the link drops
// just then) and tus clients do not hand error bodies to the page reliably. It reads durable records
// only: the recording row (stored, or filed as a linked duplicate), the custody event of a duplicate
// the flight already held, or the tombstone in the staging folder (refused; kept 14 days).
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, jobs, recordings } from "@/db/schema";
import type { RecordingKind } from "./sniff-content";

export type DuplicateTarget = {
  recordingId: string;
  originalName: string;
  relativePath: string | null;
  flightId: string;
  flownOn: string;
  jobId: string;
  jobTitle: string;
};

type Common = { uploadId: string; fileName: string; relativePath: string | null };

export type UploadOutcome =
  | (Common & { state: "receiving"; offset: number; size: number })
  | (Common & { state: "storing" })
  | (Common & { state: "stored"; recordingId: string; sha256: string; kind: RecordingKind; sizeBytes: number })
  | (Common & {
      state: "duplicate";
      /** the recording that now stands for this upload in the chosen flight */
      recordingId: string;
      sha256: string;
      kind: RecordingKind;
      sizeBytes: number;
      /** true: a new recording was filed in this flight, pointing at the existing original; false: the flight already had it */
      linked: boolean;
      duplicateOf: DuplicateTarget;
    })
  | (Common & { state: "refused"; reason: string });

/** Response headers of the PATCH (or POST) that completed an upload. */
export function outcomeHeaders(o: UploadOutcome): Record<string, string> {
  const h: Record<string, string> = { "Cairn-Upload-Outcome": o.state };
  if (o.state === "stored" || o.state === "duplicate") {
    h["Cairn-Recording-Id"] = o.recordingId;
    h["Cairn-Original-SHA256"] = o.sha256;
  }
  if (o.state === "duplicate") h["Cairn-Duplicate-Of"] = o.duplicateOf.recordingId;
  return h;
}

/** The recording an upload duplicates, as the pilot is told of it, with the facts of its original. */
async function duplicateTarget(organisationId: string, recordingId: string) {
  const [row] = await db()
    .select({
      sha256: recordings.sha256,
      kind: recordings.kind,
      sizeBytes: recordings.sizeBytes,
      recordingId: recordings.id,
      originalName: recordings.originalName,
      relativePath: recordings.relativePath,
      flightId: recordings.flightId,
      flownOn: flights.flownOn,
      jobId: recordings.jobId,
      jobTitle: jobs.title,
    })
    .from(recordings)
    .innerJoin(flights, eq(flights.id, recordings.flightId))
    .innerJoin(jobs, eq(jobs.id, recordings.jobId))
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId)));
  if (!row) return null;
  const { sha256, kind, sizeBytes, ...target } = row;
  return { target: target satisfies DuplicateTarget, original: { sha256, kind, sizeBytes } };
}

/** The outcome of an upload that has its own recording row (stored, or filed as a linked duplicate). */
export async function outcomeOfRow(organisationId: string, uploadId: string): Promise<UploadOutcome | null> {
  const [row] = await db()
    .select({
      id: recordings.id,
      originalName: recordings.originalName,
      relativePath: recordings.relativePath,
      sha256: recordings.sha256,
      kind: recordings.kind,
      sizeBytes: recordings.sizeBytes,
      duplicateOfId: recordings.duplicateOfId,
    })
    .from(recordings)
    .where(and(eq(recordings.uploadId, uploadId), eq(recordings.organisationId, organisationId)));
  if (!row) return null;
  const common = { uploadId, fileName: row.originalName, relativePath: row.relativePath, recordingId: row.id, sha256: row.sha256, kind: row.kind, sizeBytes: row.sizeBytes };
  if (row.duplicateOfId) {
    const found = await duplicateTarget(organisationId, row.duplicateOfId);
    if (found) return { ...common, state: "duplicate", linked: true, duplicateOf: found.target };
  }
  return { ...common, state: "stored" };
}

/** The outcome of an upload whose bytes the flight already held (no new row was filed). */
export async function outcomeOfUnfiledDuplicate(
  organisationId: string,
  upload: Common,
  existingRecordingId: string,
): Promise<UploadOutcome | null> {
  const found = await duplicateTarget(organisationId, existingRecordingId);
  if (!found) return null;
  return { ...upload, state: "duplicate", recordingId: existingRecordingId, ...found.original, linked: false, duplicateOf: found.target };
}
