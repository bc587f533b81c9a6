// Imports a flight track as evidence: parsed first (a refusal stores nothing), then the exact bytes are
// placed write-once in the store (lib/storage/store.ts), then the row and its custody event are
// written in one transaction. If that transaction fails, the placed file is removed again: nothing is
// ever half-saved.
import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { mkdtemp, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { db } from "@/db/client";
import { flightTracks } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { Member } from "@/lib/auth/load-member";
import { recordCustodyEvent, type RequestFacts } from "@/lib/custody/record-custody-event";
import { getRangeCheckFlightOrThrow } from "@/lib/range-checks/flight-for-range-check";
import { placeOriginal, removeKey } from "@/lib/storage/store";
import { trackKey } from "@/lib/storage/storage-keys";
import { describeTrackProblem } from "./describe-track-problem";
import { loadTrackRow } from "./load-flight-track";
import { parseTrack } from "./parse-track";
import { toStoredPoint } from "./track-types";

export type TrackFile = { name: string; bytes: Uint8Array };

export async function importTrack(member: Pick<Member, "organisationId" | "userId" | "role">, flightId: string, file: TrackFile, facts: RequestFacts = { clientAddress: null, userAgent: null }) {
  const orgId = member.organisationId;
  const flight = await getRangeCheckFlightOrThrow(orgId, flightId);
  if (await loadTrackRow(orgId, flight.id)) throw new ApiError("conflict", `This flight already has a track; ${file.name} was not imported`);

  const parsed = parseTrack(file.bytes);
  if (!parsed.ok) {
    const described = parsed.problems.map((p) => describeTrackProblem(file.name, p));
    const more = parsed.problems.length > 1 ? ` (and ${parsed.problems.length - 1} more)` : "";
    throw new ApiError(parsed.problems[0].reason.startsWith("the file is ") && parsed.problems[0].reason.includes("at most") ? "payload_too_large" : "unprocessable", `${described[0]}${more}. Nothing was saved.`, { file: described });
  }
  const { points, format, heightSource, warnings } = parsed.track;
  const sha256 = createHash("sha256").update(file.bytes).digest("hex");
  const id = randomUUID();
  const key = trackKey(orgId, id);

  const work = await mkdtemp(path.join(os.tmpdir(), "cairn-track-"));
  try {
    const tmp = path.join(work, "track");
    await writeFile(tmp, file.bytes);
    await placeOriginal(tmp, key);
  } finally {
    await rm(work, { recursive: true, force: true });
  }
  try {
    await db().transaction(async (tx) => {
      await tx.insert(flightTracks).values({
        id,
        organisationId: orgId,
        jobId: flight.jobId,
        flightId: flight.id,
        originalName: file.name,
        format,
        sizeBytes: file.bytes.byteLength,
        sha256,
        storageKey: key,
        pointCount: points.length,
        startsAt: new Date(points[0].t),
        endsAt: new Date(points[points.length - 1].t),
        heightSource,
        points: points.map(toStoredPoint),
        warnings: warnings.map((w) => `${file.name}: ${w}`),
        uploadedBy: member.userId,
      });
      await recordCustodyEvent(
        {
          organisationId: orgId,
          eventType: "track_imported",
          evidenceType: "track",
          evidenceId: id,
          jobId: flight.jobId,
          originalSha256: sha256,
          originalSize: file.bytes.byteLength,
          actor: { userId: member.userId, role: member.role },
          ...facts,
          storageLocation: key,
          purpose: "flight track imported",
          details: { flightId: flight.id, fileName: file.name, format, pointCount: points.length, startsAt: new Date(points[0].t).toISOString(), endsAt: new Date(points[points.length - 1].t).toISOString() },
        },
        tx,
      );
    });
  } catch (err) {
    await removeKey(key).catch(() => {});
    // two imports at once: the unique index lets one in
    if ((err as { code?: string; cause?: { code?: string } }).code === "23505" || (err as { cause?: { code?: string } }).cause?.code === "23505") {
      throw new ApiError("conflict", `This flight already has a track; ${file.name} was not imported`);
    }
    throw err;
  }
  return { id, originalName: file.name, format, sizeBytes: file.bytes.byteLength, sha256, pointCount: points.length, warnings };
}
