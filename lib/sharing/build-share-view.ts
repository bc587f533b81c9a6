// Everything the client's page shows for one link, with fresh signed addresses for each file.
// Only what the scope holds goes in: the page cannot point at anything else.
import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { evidencePackages, jobs, renditions, sites } from "@/db/schema";
import { SEVERITY_SCALE, type Severity } from "@/lib/findings/severity-scale";
import { grantExpiry } from "./media-grant";
import { loadShareScope } from "./share-scope";
import { signedShareMediaPath } from "./share-media-url";
import type { ResolvedShareLink } from "./resolve-share-link";

export type ShareViewRecording = {
  id: string;
  name: string;
  durationSec: number | null;
  fps: number | null;
  sha256: string;
  sizeBytes: number;
  ready: boolean;
  playableUrl: string | null;
  posterUrl: string | null;
  thumbnailsUrl: string | null;
  originalUrl: string | null;
};
export type ShareViewFinding = {
  id: string;
  recordingId: string;
  startSec: number;
  endSec: number | null;
  startFrame: number;
  severity: Severity;
  severityLabel: string;
  severityMeaning: string;
  categoryName: string | null;
  note: string;
  stillUrl: string | null;
};
export type ShareView = {
  organisationName: string;
  jobTitle: string;
  siteName: string;
  siteTimeZone: string;
  label: string;
  scope: "recording" | "findings" | "report" | "job";
  expiresAt: string;
  allowOriginals: boolean;
  recordings: ShareViewRecording[];
  findings: ShareViewFinding[];
  report: { id: string; version: number; sha256: string | null; sizeBytes: number | null; approved: boolean; url: string } | null;
  /** the evidence package the link carries, once built and while kept (downloaded from /api/s/:token/package) */
  evidencePackage: { sha256: string | null; sizeBytes: number | null; expiresAt: string } | null;
  /** when the signed addresses above stop working: the page asks for fresh ones before then */
  addressesExpireAt: string;
};

export async function buildShareView(link: ResolvedShareLink, nowMs = Date.now()): Promise<ShareView> {
  const [job] = await db()
    .select({ title: jobs.title, siteName: sites.name, timeZone: sites.timeZone })
    .from(jobs)
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .where(and(eq(jobs.id, link.jobId), eq(jobs.organisationId, link.organisationId)));
  const scope = await loadShareScope(link);
  const ids = scope.recordings.map((r) => r.id);
  const have = new Set<string>();
  if (ids.length) {
    const rows = await db()
      .select({ recordingId: renditions.recordingId, kind: renditions.kind })
      .from(renditions)
      .where(and(eq(renditions.organisationId, link.organisationId), inArray(renditions.recordingId, ids)));
    for (const r of rows) have.add(`${r.recordingId}:${r.kind}`);
  }
  const sign = (kind: Parameters<typeof signedShareMediaPath>[1], id: string) => signedShareMediaPath(link.id, kind, id, nowMs);
  return {
    organisationName: link.organisationName,
    jobTitle: job?.title ?? "",
    siteName: job?.siteName ?? "",
    siteTimeZone: job?.timeZone ?? "UTC",
    label: link.label,
    scope: link.scope,
    expiresAt: link.expiresAt.toISOString(),
    allowOriginals: link.allowOriginals,
    recordings: scope.recordings.map((r) => ({
      id: r.id,
      name: r.originalName,
      durationSec: r.durationSec,
      fps: r.fps,
      sha256: r.sha256,
      sizeBytes: r.sizeBytes,
      ready: r.state === "ready",
      playableUrl: have.has(`${r.id}:playable`) ? sign("playable", r.id) : null,
      posterUrl: have.has(`${r.id}:poster`) ? sign("poster", r.id) : null,
      thumbnailsUrl: have.has(`${r.id}:thumbnails_vtt`) && have.has(`${r.id}:sprite`) ? sign("thumbnails", r.id) : null,
      originalUrl: link.allowOriginals ? sign("original", r.id) : null,
    })),
    findings: scope.findings.map((f) => ({
      id: f.id,
      recordingId: f.recordingId,
      startSec: f.startSec,
      endSec: f.endSec,
      startFrame: f.startFrame,
      severity: f.severity,
      severityLabel: SEVERITY_SCALE[f.severity].label,
      severityMeaning: SEVERITY_SCALE[f.severity].meaning,
      categoryName: f.categoryName,
      note: f.note,
      stillUrl: f.stillId ? sign("still", f.stillId) : null,
    })),
    report:
      scope.report && scope.report.storageKey
        ? {
            id: scope.report.id,
            version: scope.report.version,
            sha256: scope.report.sha256,
            sizeBytes: scope.report.sizeBytes,
            approved: scope.report.state === "approved",
            url: sign("report", scope.report.id),
          }
        : null,
    evidencePackage: await sharedPackage(link, nowMs),
    addressesExpireAt: new Date(grantExpiry(nowMs) * 1000).toISOString(),
  };
}

async function sharedPackage(link: ResolvedShareLink, nowMs: number): Promise<ShareView["evidencePackage"]> {
  if (!link.evidencePackageId) return null;
  const [p] = await db()
    .select({ state: evidencePackages.state, sha256: evidencePackages.sha256, sizeBytes: evidencePackages.sizeBytes, expiresAt: evidencePackages.expiresAt })
    .from(evidencePackages)
    .where(and(eq(evidencePackages.id, link.evidencePackageId), eq(evidencePackages.organisationId, link.organisationId), eq(evidencePackages.jobId, link.jobId)));
  if (!p || p.state !== "ready" || p.expiresAt.getTime() <= nowMs) return null;
  return { sha256: p.sha256, sizeBytes: p.sizeBytes, expiresAt: p.expiresAt.toISOString() };
}
