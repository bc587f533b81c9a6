// Deleting a finding is a recorded act, not an erasure: the row is marked deleted, a final revision
// keeps its last state, and the custody log says who removed it and when.
import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { findingRevisions, findings } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { findingSnapshot } from "./finding-snapshot";
import { latestStills } from "./finding-view";
import { loadReviewRecording } from "../recordings/load-review-recording";
import type { FindingActor } from "./create-finding";

export async function deleteFinding(organisationId: string, id: string, actor: FindingActor, reason: string | null): Promise<{ id: string; version: number; deletedAt: Date }> {
  return db().transaction(async (tx) => {
    const [current] = await tx
      .select()
      .from(findings)
      .where(and(eq(findings.id, id), eq(findings.organisationId, organisationId), isNull(findings.deletedAt)))
      .for("update");
    if (!current) throw notFound("Finding not found");
    const rec = await loadReviewRecording(organisationId, current.recordingId, tx).catch(() => null);
    const version = current.version + 1;
    const deletedAt = new Date();
    const [deleted] = await tx
      .update(findings)
      .set({ deletedAt, version, updatedAt: deletedAt })
      .where(and(eq(findings.id, id), eq(findings.organisationId, organisationId)))
      .returning();
    const stillId = (await latestStills(organisationId, [id], tx)).get(id)?.id ?? null;
    await tx.insert(findingRevisions).values({
      organisationId,
      findingId: id,
      version,
      action: "deleted",
      snapshot: { ...findingSnapshot(deleted, stillId), reason },
      editedBy: actor.userId,
    });
    await recordCustodyEvent(
      {
        organisationId,
        eventType: "finding_deleted",
        evidenceType: "finding",
        evidenceId: id,
        jobId: current.jobId,
        originalSha256: rec?.sha256 ?? null,
        originalSize: rec?.sizeBytes ?? null,
        actor: { userId: actor.userId, role: actor.role },
        clientAddress: actor.clientAddress,
        userAgent: actor.userAgent,
        purpose: reason,
        details: { recordingId: current.recordingId, version },
      },
      tx,
    );
    return { id, version, deletedAt };
  });
}
