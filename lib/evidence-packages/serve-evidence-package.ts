// Serves a built evidence package: one verified file with its own SHA-256 (its ETag), with HTTP Range
// so a cut download resumes where it stopped (lib/media-serving/serve-stored-file.ts, RFC 9110 14).
// One custody event per download, judged on the answer sent (lib/custody/counts-as-download.ts), for a
// member and for a share link alike; a share link's download is also in the link's own event list.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { evidencePackages, jobs, shareLinkEvents } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { countsAsDownload } from "@/lib/custody/counts-as-download";
import { recordCustodyEvent, type RequestFacts } from "@/lib/custody/record-custody-event";
import type { MediaFile } from "@/lib/media-serving/media-file";
import { serveStoredFile } from "@/lib/media-serving/serve-stored-file";
import type { Role } from "@/db/schema/types";

export type PackageDownloader = { userId: string; role: Role } | { shareLinkId: string };

export async function loadServablePackage(organisationId: string, packageId: string, now = new Date(), jobId?: string): Promise<MediaFile> {
  const [p] = await db()
    .select({ id: evidencePackages.id, jobId: evidencePackages.jobId, state: evidencePackages.state, progress: evidencePackages.progress, storageKey: evidencePackages.storageKey, sha256: evidencePackages.sha256, expiresAt: evidencePackages.expiresAt, updatedAt: evidencePackages.updatedAt, jobTitle: jobs.title })
    .from(evidencePackages)
    .innerJoin(jobs, eq(jobs.id, evidencePackages.jobId))
    .where(and(eq(evidencePackages.id, packageId), eq(evidencePackages.organisationId, organisationId), jobId ? eq(evidencePackages.jobId, jobId) : undefined));
  if (!p) throw notFound("Evidence package not found");
  if (p.state === "expired" || (p.state === "ready" && p.expiresAt <= now)) throw new ApiError("gone", `This evidence package was kept until ${p.expiresAt.toISOString().slice(0, 10)} and has been removed; build a new one.`);
  if (p.state === "failed") throw new ApiError("conflict", "This evidence package could not be built; build a new one.");
  if (p.state !== "ready" || !p.storageKey) throw new ApiError("conflict", `This evidence package is still being built (${p.progress} %).`);
  const slug = p.jobTitle.replace(/[^A-Za-z0-9]+/g, "-").replace(/^-+|-+$/g, "").toLowerCase().slice(0, 48) || "job";
  return {
    kind: "evidence_package",
    id: p.id,
    organisationId,
    storageKey: p.storageKey,
    contentType: "application/zip",
    sha256: p.sha256,
    recordingId: null,
    jobId: p.jobId,
    findingId: null,
    reportId: null,
    downloadName: `cairn-evidence-${slug}-${p.id.slice(0, 8)}.zip`,
    updatedAt: p.updatedAt,
  };
}

export async function servePackageDownload(req: Request, file: MediaFile, who: PackageDownloader, facts: RequestFacts): Promise<Response> {
  const res = await serveStoredFile(req, file, "attachment");
  // Digest of the whole file for the receiver's check (the ETag carries only its first 128 bits)
  if (file.sha256) res.headers.set("X-Cairn-Package-SHA256", file.sha256);
  if (res.status === 416 || !countsAsDownload(req.method, res.status, res.headers.get("content-range"))) return res;
  try {
    await db().transaction(async (tx) => {
      if ("shareLinkId" in who) {
        await tx.insert(shareLinkEvents).values({ organisationId: file.organisationId, shareLinkId: who.shareLinkId, kind: "download", detail: `evidence_package:${file.id}`, ...facts });
      }
      await recordCustodyEvent(
        {
          organisationId: file.organisationId,
          eventType: "download",
          evidenceType: "evidence_package",
          evidenceId: file.id,
          jobId: file.jobId,
          actor: "shareLinkId" in who ? { shareLinkId: who.shareLinkId } : { userId: who.userId, role: who.role },
          ...facts,
          storageLocation: file.storageKey,
          outputSha256: file.sha256,
          purpose: "shareLinkId" in who ? "evidence package download through a share link" : "evidence package download",
        },
        tx,
      );
    });
  } catch (err) {
    console.warn("[cairn] package served, but recording the download failed:", (err as Error).message);
  }
  return res;
}
