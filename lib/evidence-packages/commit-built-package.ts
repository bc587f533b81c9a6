// The commit of a built evidence package: the row becomes ready with its ZIP's key, size and SHA-256,
// and the build is one custody event (package_built), in one transaction. Refused (false) unless the
// row is still building, so a second run of the job never records a second build.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { evidencePackages } from "@/db/schema";
import type { EvidencePackage } from "@/db/schema/types";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import type { WrittenPackage } from "./write-evidence-package";

export async function commitBuiltPackage(pkg: Pick<EvidencePackage, "id" | "organisationId" | "jobId" | "createdBy" | "flightId" | "recordingIds">, written: WrittenPackage, meta: { queueJobId?: string | null } = {}): Promise<boolean> {
  return db().transaction(async (tx) => {
    const [row] = await tx
      .update(evidencePackages)
      .set({
        state: "ready",
        progress: 100,
        storageKey: written.storageKey,
        sizeBytes: written.sizeBytes,
        sha256: written.sha256,
        payloadFiles: written.payloadFiles,
        payloadBytes: written.payloadBytes,
        failureReason: null,
        updatedAt: new Date(),
      })
      .where(and(eq(evidencePackages.id, pkg.id), eq(evidencePackages.organisationId, pkg.organisationId), eq(evidencePackages.state, "building")))
      .returning({ id: evidencePackages.id });
    if (!row) return false;
    await recordCustodyEvent(
      {
        organisationId: pkg.organisationId,
        eventType: "package_built",
        evidenceType: "evidence_package",
        evidenceId: pkg.id,
        jobId: pkg.jobId,
        actor: { userId: pkg.createdBy },
        storageLocation: written.storageKey,
        purpose: "evidence package (BagIt ZIP)",
        tool: "archiver (zip)",
        outputSha256: written.sha256,
        details: {
          sizeBytes: written.sizeBytes,
          payloadFiles: written.payloadFiles,
          payloadBytes: written.payloadBytes,
          bagName: written.bagName,
          custodyEvents: written.custodyEvents,
          checkpointNumber: written.checkpointNumber,
          flightId: pkg.flightId,
          recordingIds: pkg.recordingIds,
          queueJobId: meta.queueJobId ?? null,
        },
      },
      tx,
    );
    return true;
  });
}
