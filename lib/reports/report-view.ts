// What the API shows of a report version (never the whole row).
import "server-only";
import { and, desc, eq, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, type DbOrTx } from "@/db/client";
import { reports, users } from "@/db/schema";
import { reportDownloadUrl } from "@/lib/media-serving/media-urls";

const builder = alias(users, "builder");
const approver = alias(users, "approver");

export type ReportView = {
  id: string;
  jobId: string;
  version: number;
  state: "queued" | "building" | "ready" | "approved" | "failed";
  progress: number;
  sizeBytes: number | null;
  sha256: string | null;
  failureReason: string | null;
  createdBy: string | null;
  createdAt: Date;
  approvedBy: string | null;
  approvedAt: Date | null;
  downloadUrl: string | null;
};

export async function loadReportViews(organisationId: string, where: SQL | undefined, tx: DbOrTx = db()): Promise<ReportView[]> {
  const rows = await tx
    .select({
      id: reports.id,
      jobId: reports.jobId,
      version: reports.version,
      state: reports.state,
      progress: reports.progress,
      sizeBytes: reports.sizeBytes,
      sha256: reports.sha256,
      failureReason: reports.failureReason,
      createdBy: builder.name,
      createdAt: reports.createdAt,
      approvedBy: approver.name,
      approvedAt: reports.approvedAt,
    })
    .from(reports)
    .leftJoin(builder, eq(builder.id, reports.createdBy))
    .leftJoin(approver, eq(approver.id, reports.approvedBy))
    .where(and(eq(reports.organisationId, organisationId), where))
    .orderBy(desc(reports.version));
  return rows.map((r) => ({ ...r, downloadUrl: r.state === "ready" || r.state === "approved" ? reportDownloadUrl(r.id) : null }));
}

export async function loadReportView(organisationId: string, id: string, tx: DbOrTx = db()): Promise<ReportView | null> {
  const [row] = await loadReportViews(organisationId, eq(reports.id, id), tx);
  return row ?? null;
}
