// The commit of a "build-report" job's result, in one transaction: the version's row becomes "ready"
// with its stored PDF's key, size and SHA-256, and the build goes into the custody chain. Only a
// version still "building" is committed; anything else (approved, failed, rebuilt by another run)
// throws, so the job fails instead of overwriting a version that moved on, and nothing is recorded.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { reports } from "@/db/schema";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";

export interface BuiltReport {
  report: { id: string; organisationId: string; jobId: string; version: number; createdBy: string | null };
  /** Where the PDF was placed (lib/storage/storage-keys.ts reportKey). */
  storageKey: string;
  sizeBytes: number;
  sha256: string;
  findings: number;
  recordings: number;
}

export async function commitBuiltReport(built: BuiltReport): Promise<void> {
  const { report, storageKey, sizeBytes, sha256 } = built;
  await db().transaction(async (tx) => {
    const [done] = await tx
      .update(reports)
      .set({ state: "ready", progress: 100, storageKey, sizeBytes, sha256, failureReason: null, updatedAt: new Date() })
      .where(and(eq(reports.id, report.id), eq(reports.state, "building")))
      .returning({ id: reports.id });
    if (!done) throw new Error("the report left the building state while it was rendered");
    await recordCustodyEvent(
      {
        organisationId: report.organisationId,
        eventType: "report_built",
        evidenceType: "report",
        evidenceId: report.id,
        jobId: report.jobId,
        actor: { userId: report.createdBy },
        storageLocation: storageKey,
        tool: "@react-pdf/renderer",
        outputSha256: sha256,
        details: { version: report.version, findings: built.findings, recordings: built.recordings, sizeBytes },
      },
      tx,
    );
  });
}
