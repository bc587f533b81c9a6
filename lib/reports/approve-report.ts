// An owner approves one built version. From then on it is immutable: no build touches it, the
// database refuses any change to its row (migration 0002), and the custody log carries its PDF's SHA-256. The stored file is hashed again first: approval vouches for
// the bytes a client will download, not for what the database remembers of them.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { reports } from "@/db/schema";
import type { Role } from "@/db/schema/types";
import { ApiError, notFound } from "@/lib/api/errors";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { sha256OfStream } from "@/lib/custody/sha256-stream";
import { readKey } from "@/lib/storage/store";
import { loadReportView, type ReportView } from "./report-view";

export async function approveReport(
  organisationId: string,
  reportId: string,
  actor: { userId: string; role: Role; clientAddress: string | null; userAgent: string | null },
): Promise<ReportView> {
  await db().transaction(async (tx) => {
    const [r] = await tx
      .select()
      .from(reports)
      .where(and(eq(reports.id, reportId), eq(reports.organisationId, organisationId)))
      .for("update");
    if (!r) throw notFound("Report not found");
    if (r.state === "approved") throw new ApiError("conflict", `Version ${r.version} is approved already`);
    if (r.state !== "ready" || !r.storageKey || !r.sha256) throw new ApiError("conflict", `Version ${r.version} is not built (it is ${r.state}); only a built version can be approved`);
    let digest: string;
    try {
      digest = (await sha256OfStream(readKey(r.storageKey))).hex;
    } catch {
      throw new ApiError("conflict", "The report's PDF is missing from the store; build a new version");
    }
    if (digest !== r.sha256) throw new ApiError("conflict", "The stored PDF no longer matches the hash recorded when it was built; build a new version");
    const approvedAt = new Date();
    await tx.update(reports).set({ state: "approved", approvedBy: actor.userId, approvedAt, updatedAt: approvedAt }).where(eq(reports.id, r.id));
    await recordCustodyEvent(
      {
        organisationId,
        eventType: "report_approved",
        evidenceType: "report",
        evidenceId: r.id,
        jobId: r.jobId,
        actor: { userId: actor.userId, role: actor.role },
        clientAddress: actor.clientAddress,
        userAgent: actor.userAgent,
        storageLocation: r.storageKey,
        outputSha256: r.sha256,
        details: { version: r.version, sizeBytes: r.sizeBytes },
      },
      tx,
    );
  });
  return (await loadReportView(organisationId, reportId))!;
}
