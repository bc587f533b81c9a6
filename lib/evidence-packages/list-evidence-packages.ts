// Evidence packages as the workspace shows them: a job's packages, newest first, or one by id, within
// one organisation. Columns are chosen; a package past its keep date reads as expired even before the
// sweep has removed its file.
import "server-only";
import { and, desc, eq, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { evidencePackages, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { packageDownloadUrl } from "./package-urls";

export type PackageView = {
  id: string;
  jobId: string;
  flightId: string | null;
  recordingCount: number | null;
  state: "queued" | "building" | "ready" | "failed" | "expired";
  progress: number;
  estimatedBytes: number;
  sizeBytes: number | null;
  sha256: string | null;
  payloadFiles: number | null;
  purpose: string | null;
  failureReason: string | null;
  createdByName: string | null;
  createdAt: string;
  expiresAt: string;
  downloadUrl: string | null;
};

const columns = {
  id: evidencePackages.id,
  jobId: evidencePackages.jobId,
  flightId: evidencePackages.flightId,
  recordingIds: evidencePackages.recordingIds,
  state: evidencePackages.state,
  progress: evidencePackages.progress,
  estimatedBytes: evidencePackages.estimatedBytes,
  sizeBytes: evidencePackages.sizeBytes,
  sha256: evidencePackages.sha256,
  payloadFiles: evidencePackages.payloadFiles,
  purpose: evidencePackages.purpose,
  failureReason: evidencePackages.failureReason,
  createdByName: users.name,
  createdAt: evidencePackages.createdAt,
  expiresAt: evidencePackages.expiresAt,
};

type Row = { [K in keyof typeof columns]: unknown } & { recordingIds: string[] | null; state: PackageView["state"]; expiresAt: Date; createdAt: Date };

export { packageDownloadUrl };

function view(r: Row, now: Date): PackageView {
  const state = r.state === "ready" && r.expiresAt <= now ? "expired" : r.state;
  return {
    id: r.id as string,
    jobId: r.jobId as string,
    flightId: (r.flightId as string | null) ?? null,
    recordingCount: r.recordingIds ? r.recordingIds.length : null,
    state,
    progress: r.progress as number,
    estimatedBytes: r.estimatedBytes as number,
    sizeBytes: (r.sizeBytes as number | null) ?? null,
    sha256: (r.sha256 as string | null) ?? null,
    payloadFiles: (r.payloadFiles as number | null) ?? null,
    purpose: (r.purpose as string | null) ?? null,
    failureReason: (r.failureReason as string | null) ?? null,
    createdByName: (r.createdByName as string | null) ?? null,
    createdAt: r.createdAt.toISOString(),
    expiresAt: r.expiresAt.toISOString(),
    downloadUrl: state === "ready" ? packageDownloadUrl(r.id as string) : null,
  };
}

async function load(where: SQL, now: Date, limit = 50): Promise<PackageView[]> {
  const rows = await db().select(columns).from(evidencePackages).leftJoin(users, eq(users.id, evidencePackages.createdBy)).where(where).orderBy(desc(evidencePackages.createdAt)).limit(limit);
  return rows.map((r) => view(r as Row, now));
}

export async function listJobPackages(organisationId: string, jobId: string, now = new Date()): Promise<PackageView[]> {
  return load(and(eq(evidencePackages.organisationId, organisationId), eq(evidencePackages.jobId, jobId))!, now);
}

export async function getPackageView(organisationId: string, id: string, now = new Date()): Promise<PackageView> {
  const [one] = await load(and(eq(evidencePackages.organisationId, organisationId), eq(evidencePackages.id, id))!, now, 1);
  if (!one) throw notFound("Evidence package not found");
  return one;
}
