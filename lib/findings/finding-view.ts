// What the API and pages show of a finding: its own columns, the category and author names, the
// recording's name and original hash, and its newest still. Never the whole row (DEVELOPERS.md, "Data").
import "server-only";
import { and, desc, eq, inArray, isNull, type SQL, sql } from "drizzle-orm";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, type KeyPart, type KeysetParams, countUpTo } from "@/lib/api/keyset";
import { db, type DbOrTx } from "@/db/client";
import { findingCategories, findings, recordings, stills, users } from "@/db/schema";
import type { FrameBox } from "@/db/schema/review";
import type { Severity } from "./severity-scale";

export type StillView = { id: string; state: "pending" | "ready" | "failed"; frameNumber: number; width: number | null; height: number | null; sha256: string | null; failureReason: string | null };

export type FindingView = {
  id: string;
  jobId: string;
  recordingId: string;
  recordingName: string;
  recordingSha256: string;
  startFrame: number;
  endFrame: number | null;
  startSec: number;
  endSec: number | null;
  severity: Severity;
  categoryId: string | null;
  categoryName: string | null;
  note: string;
  box: FrameBox | null;
  latitude: number | null;
  longitude: number | null;
  heightAglM: number | null;
  groundDistanceM: number | null;
  slantDistanceM: number | null;
  version: number;
  createdBy: { id: string; name: string } | null;
  createdAt: Date;
  updatedAt: Date;
  still: StillView | null;
};

const columns = {
  id: findings.id,
  jobId: findings.jobId,
  recordingId: findings.recordingId,
  recordingName: recordings.originalName,
  recordingSha256: recordings.sha256,
  startFrame: findings.startFrame,
  endFrame: findings.endFrame,
  startSec: findings.startSec,
  endSec: findings.endSec,
  severity: findings.severity,
  categoryId: findings.categoryId,
  categoryName: findingCategories.name,
  note: findings.note,
  box: findings.box,
  latitude: findings.latitude,
  longitude: findings.longitude,
  heightAglM: findings.heightAglM,
  groundDistanceM: findings.groundDistanceM,
  slantDistanceM: findings.slantDistanceM,
  version: findings.version,
  createdById: findings.createdBy,
  createdByName: users.name,
  createdAt: findings.createdAt,
  updatedAt: findings.updatedAt,
};

/**
 * The join to a finding's recording, on the organisation too. A job's findings are asked for by the
 * recording's job (`recordings.jobId`, the same set: a finding is filed under its recording's job and a
 * recording never changes job): the planner then walks the job's recordings in order through
 * recordings_org_job_idx and stops after one page (0.6 ms at 10,000 recordings), where a filter on
 * `findings.job_id` made it fetch and sort all of the job's findings (6 to 13 ms; bench/list-api.ts).
 */
const recordingOfFinding = and(eq(recordings.id, findings.recordingId), eq(recordings.organisationId, findings.organisationId));

// the flight's order of recordings, then time order within each; the ids make the order total
const KEYS: KeyPart[] = [
  { expr: recordings.sequenceIndex, dir: "asc", type: "int", notNull: true },
  { expr: recordings.createdAt, dir: "asc", type: "timestamptz", notNull: true },
  { expr: findings.recordingId, dir: "asc", type: "uuid", notNull: true },
  { expr: findings.startFrame, dir: "asc", type: "int", notNull: true },
  { expr: findings.createdAt, dir: "asc", type: "timestamptz", notNull: true },
  { expr: findings.id, dir: "asc", type: "uuid", notNull: true },
];

/** Live (not deleted) findings of the organisation matching `where`, in time order within each recording. */
export async function loadFindingViews(organisationId: string, where: SQL | undefined, tx: DbOrTx = db()): Promise<FindingView[]> {
  return (await pageFindingViews(organisationId, where, undefined, tx)).items;
}

/** One keyset page of loadFindingViews's list, with the count of all of it (the findings API). */
export async function listFindingViews(organisationId: string, where: SQL | undefined, page: KeysetParams) {
  const all = and(eq(findings.organisationId, organisationId), isNull(findings.deletedAt), where);
  const [result, counted] = await Promise.all([
    pageFindingViews(organisationId, where, page),
    countUpTo(db().select({ one: sql`1` }).from(findings).innerJoin(recordings, recordingOfFinding).where(all).$dynamic()),
  ]);
  return { ...result, ...counted };
}

async function pageFindingViews(organisationId: string, where: SQL | undefined, page: KeysetParams | undefined, tx: DbOrTx = db()) {
  const query = tx
    .select({ ...columns, ...keysetColumns(KEYS) })
    .from(findings)
    .innerJoin(recordings, recordingOfFinding)
    .leftJoin(findingCategories, eq(findingCategories.id, findings.categoryId))
    .leftJoin(users, eq(users.id, findings.createdBy))
    .where(and(eq(findings.organisationId, organisationId), isNull(findings.deletedAt), where, afterCursor(page?.cursor, "default", KEYS)))
    .orderBy(...keysetOrder(KEYS));
  const { items: rows, nextCursor } = page ? pageOfRows(await query.limit(page.pageSize + 1), page.pageSize, "default", KEYS) : pageOfRows(await query, Infinity, "default", KEYS);
  const latest = await latestStills(organisationId, rows.map((r) => r.id), tx);
  const items: FindingView[] = rows.map(({ createdById, createdByName, ...r }) => ({
    ...r,
    createdBy: createdById ? { id: createdById, name: createdByName ?? "" } : null,
    still: latest.get(r.id) ?? null,
  }));
  return { items, nextCursor };
}

/** The newest still of each finding: an edit that moves the finding asks for a new one. */
export async function latestStills(organisationId: string, findingIds: string[], tx: DbOrTx = db()): Promise<Map<string, StillView>> {
  const out = new Map<string, StillView>();
  if (!findingIds.length) return out;
  const rows = await tx
    .select({
      id: stills.id,
      findingId: stills.findingId,
      state: stills.state,
      frameNumber: stills.frameNumber,
      width: stills.width,
      height: stills.height,
      sha256: stills.sha256,
      failureReason: stills.failureReason,
    })
    .from(stills)
    .where(and(eq(stills.organisationId, organisationId), inArray(stills.findingId, findingIds)))
    .orderBy(desc(stills.createdAt));
  for (const { findingId, ...s } of rows) if (findingId && !out.has(findingId)) out.set(findingId, s);
  return out;
}

export async function loadFindingView(organisationId: string, id: string, tx: DbOrTx = db()): Promise<FindingView | null> {
  const [row] = await loadFindingViews(organisationId, eq(findings.id, id), tx);
  return row ?? null;
}
