// What a share link lets its holder see, read fresh on every request: the recordings, findings and
// report inside the link's scope, within the link's own organisation and job only. Deleted
// recordings (and the findings on them) drop out at once; nothing outside the scope is ever listed,
// so nothing outside it can be addressed.
import "server-only";
import { and, desc, eq, inArray, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { findingCategories, findings, recordings, reports, stills } from "@/db/schema";
import type { ShareLink } from "@/db/schema/types";
import type { Severity } from "@/lib/findings/severity-scale";

export type ScopeLink = Pick<ShareLink, "id" | "organisationId" | "jobId" | "scope" | "recordingId" | "findingIds" | "reportId" | "allowOriginals">;

export type ScopeRecording = {
  id: string;
  originalName: string;
  sha256: string;
  sizeBytes: number;
  durationSec: number | null;
  fps: number | null;
  storageKey: string | null;
  duplicateOfId: string | null;
  state: "waiting" | "processing" | "ready" | "failed";
  sequenceIndex: number;
};
export type ScopeFinding = {
  id: string;
  recordingId: string;
  startSec: number;
  endSec: number | null;
  startFrame: number;
  severity: Severity;
  categoryName: string | null;
  note: string;
  stillId: string | null;
};
export type ScopeReport = { id: string; version: number; sha256: string | null; sizeBytes: number | null; storageKey: string | null; state: string; approvedAt: Date | null };
export type ShareScopeContents = { recordings: ScopeRecording[]; findings: ScopeFinding[]; report: ScopeReport | null };

const recordingColumns = {
  id: recordings.id,
  originalName: recordings.originalName,
  sha256: recordings.sha256,
  sizeBytes: recordings.sizeBytes,
  durationSec: recordings.durationSec,
  facts: recordings.facts,
  fpsOverride: recordings.fpsOverride,
  storageKey: recordings.storageKey,
  duplicateOfId: recordings.duplicateOfId,
  state: recordings.state,
  sequenceIndex: recordings.sequenceIndex,
};

async function loadRecordings(link: ScopeLink, ids: string[] | "job"): Promise<ScopeRecording[]> {
  if (ids !== "job" && ids.length === 0) return [];
  const rows = await db()
    .select(recordingColumns)
    .from(recordings)
    .where(
      and(
        eq(recordings.organisationId, link.organisationId),
        eq(recordings.jobId, link.jobId),
        isNull(recordings.deletedAt),
        ids === "job" ? undefined : inArray(recordings.id, ids),
      ),
    )
    .orderBy(recordings.sequenceIndex, recordings.createdAt);
  return rows.map(({ facts, fpsOverride, ...r }) => ({ ...r, fps: fpsOverride ?? facts?.fps ?? null }));
}

async function loadFindings(link: ScopeLink, filter: { recordingIds?: string[]; findingIds?: string[] }): Promise<ScopeFinding[]> {
  if (filter.recordingIds?.length === 0 || filter.findingIds?.length === 0) return [];
  const rows = await db()
    .select({
      id: findings.id,
      recordingId: findings.recordingId,
      startSec: findings.startSec,
      endSec: findings.endSec,
      startFrame: findings.startFrame,
      severity: findings.severity,
      categoryName: findingCategories.name,
      note: findings.note,
    })
    .from(findings)
    .innerJoin(recordings, eq(recordings.id, findings.recordingId))
    .leftJoin(findingCategories, and(eq(findingCategories.id, findings.categoryId), eq(findingCategories.organisationId, link.organisationId)))
    .where(
      and(
        eq(findings.organisationId, link.organisationId),
        eq(findings.jobId, link.jobId),
        isNull(findings.deletedAt),
        eq(recordings.organisationId, link.organisationId),
        isNull(recordings.deletedAt),
        filter.recordingIds ? inArray(findings.recordingId, filter.recordingIds) : undefined,
        filter.findingIds ? inArray(findings.id, filter.findingIds) : undefined,
      ),
    )
    .orderBy(findings.recordingId, findings.startSec);
  if (rows.length === 0) return [];
  const stillRows = await db()
    .select({ id: stills.id, findingId: stills.findingId })
    .from(stills)
    .where(
      and(
        eq(stills.organisationId, link.organisationId),
        inArray(
          stills.findingId,
          rows.map((r) => r.id),
        ),
        eq(stills.state, "ready"),
      ),
    )
    .orderBy(desc(stills.updatedAt));
  const stillOf = new Map<string, string>();
  for (const s of stillRows) if (s.findingId && !stillOf.has(s.findingId)) stillOf.set(s.findingId, s.id);
  return rows.map((r) => ({ ...r, stillId: stillOf.get(r.id) ?? null }));
}

async function loadReport(link: ScopeLink): Promise<ScopeReport | null> {
  const columns = {
    id: reports.id,
    version: reports.version,
    sha256: reports.sha256,
    sizeBytes: reports.sizeBytes,
    storageKey: reports.storageKey,
    state: reports.state,
    approvedAt: reports.approvedAt,
  };
  const inJob = and(eq(reports.organisationId, link.organisationId), eq(reports.jobId, link.jobId));
  if (link.reportId) {
    const [r] = await db()
      .select(columns)
      .from(reports)
      .where(and(inJob, eq(reports.id, link.reportId), eq(reports.state, "approved")));
    return r ?? null;
  }
  if (link.scope !== "job") return null;
  // a whole-job link follows the job: the newest approved version at the moment of the request
  const [r] = await db()
    .select(columns)
    .from(reports)
    .where(and(inJob, eq(reports.state, "approved")))
    .orderBy(desc(reports.version))
    .limit(1);
  return r ?? null;
}

export async function loadShareScope(link: ScopeLink): Promise<ShareScopeContents> {
  switch (link.scope) {
    case "recording": {
      const recs = await loadRecordings(link, link.recordingId ? [link.recordingId] : []);
      return { recordings: recs, findings: await loadFindings(link, { recordingIds: recs.map((r) => r.id) }), report: await loadReport(link) };
    }
    case "findings": {
      const found = await loadFindings(link, { findingIds: link.findingIds ?? [] });
      const recs = await loadRecordings(link, [...new Set(found.map((f) => f.recordingId))]);
      return { recordings: recs, findings: found, report: await loadReport(link) };
    }
    case "report":
      return { recordings: [], findings: [], report: await loadReport(link) };
    case "job": {
      const recs = await loadRecordings(link, "job");
      return { recordings: recs, findings: await loadFindings(link, { recordingIds: recs.map((r) => r.id) }), report: await loadReport(link) };
    }
  }
}
