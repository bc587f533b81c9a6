// A job's share links as the sender sees them: state, recipients, and how often each was opened
// and downloaded. Never the token hash or the passcode hash.
import "server-only";
import { and, count as countRows, desc, eq, sql } from "drizzle-orm";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, type KeyPart, type KeysetParams } from "@/lib/api/keyset";
import { db } from "@/db/client";
import { jobs, shareLinkEvents, shareLinks, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { shareLinkStatus, type ShareLinkStatus } from "./share-link-status";

export type ShareLinkRow = {
  id: string;
  label: string;
  scope: "recording" | "findings" | "report" | "job";
  recordingId: string | null;
  findingIds: string[] | null;
  reportId: string | null;
  recipientEmails: string[];
  expiresAt: Date;
  revokedAt: Date | null;
  allowOriginals: boolean;
  hasPasscode: boolean;
  lockedUntil: Date | null;
  createdAt: Date;
  createdByName: string | null;
  status: ShareLinkStatus;
  opens: number;
  downloads: number;
  lastOpenedAt: Date | null;
};

const count = (kind: "open" | "download") =>
  sql<number>`(select count(*) from ${shareLinkEvents} e where e.share_link_id = ${shareLinks.id} and e.organisation_id = ${shareLinks.organisationId} and e.kind = ${kind})`.mapWith(Number);

function selection() {
  return {
    id: shareLinks.id,
    label: shareLinks.label,
    scope: shareLinks.scope,
    recordingId: shareLinks.recordingId,
    findingIds: shareLinks.findingIds,
    reportId: shareLinks.reportId,
    recipientEmails: shareLinks.recipientEmails,
    expiresAt: shareLinks.expiresAt,
    revokedAt: shareLinks.revokedAt,
    allowOriginals: shareLinks.allowOriginals,
    hasPasscode: sql<boolean>`${shareLinks.passcodeHash} is not null`,
    lockedUntil: shareLinks.lockedUntil,
    createdAt: shareLinks.createdAt,
    createdByName: users.name,
    opens: count("open"),
    downloads: count("download"),
    lastOpenedAt: sql<Date | null>`(select max(e.created_at) from ${shareLinkEvents} e where e.share_link_id = ${shareLinks.id} and e.kind = 'open')`.mapWith(
      (v: string | Date | null) => (v === null ? null : new Date(v)),
    ),
  };
}

// newest first (share_links_org_job_idx serves the order)
const KEYS: KeyPart[] = [
  { expr: shareLinks.createdAt, dir: "desc", type: "timestamptz", notNull: true },
  { expr: shareLinks.id, dir: "desc", type: "uuid", notNull: true },
];

export async function listJobShareLinks(
  organisationId: string,
  jobId: string,
  page: KeysetParams = { pageSize: 100 },
  now = new Date(),
): Promise<{ items: ShareLinkRow[]; total: number; nextCursor: string | null }> {
  const [job] = await db().select({ id: jobs.id }).from(jobs).where(and(eq(jobs.id, jobId), eq(jobs.organisationId, organisationId)));
  if (!job) throw notFound("Job not found");
  const where = and(eq(shareLinks.organisationId, organisationId), eq(shareLinks.jobId, jobId));
  const [rows, [{ total }]] = await Promise.all([
    db()
      .select({ ...selection(), ...keysetColumns(KEYS) })
      .from(shareLinks)
      .leftJoin(users, eq(users.id, shareLinks.createdBy))
      .where(and(where, afterCursor(page.cursor, "default", KEYS)))
      .orderBy(...keysetOrder(KEYS))
      .limit(page.pageSize + 1),
    db().select({ total: countRows() }).from(shareLinks).where(where),
  ]);
  const { items, nextCursor } = pageOfRows(rows, page.pageSize, "default", KEYS);
  return { items: items.map((r) => ({ ...r, status: shareLinkStatus(r, now) })), total, nextCursor };
}

export type ShareLinkEventRow = { id: string; kind: "open" | "download" | "passcode_refused" | "media"; detail: string | null; clientAddress: string | null; userAgent: string | null; createdAt: Date };

export async function getShareLinkOrThrow(organisationId: string, id: string, now = new Date()): Promise<ShareLinkRow & { events: ShareLinkEventRow[] }> {
  const [row] = await db()
    .select(selection())
    .from(shareLinks)
    .leftJoin(users, eq(users.id, shareLinks.createdBy))
    .where(and(eq(shareLinks.id, id), eq(shareLinks.organisationId, organisationId)));
  if (!row) throw notFound("Share link not found");
  const events = await db()
    .select({
      id: shareLinkEvents.id,
      kind: shareLinkEvents.kind,
      detail: shareLinkEvents.detail,
      clientAddress: shareLinkEvents.clientAddress,
      userAgent: shareLinkEvents.userAgent,
      createdAt: shareLinkEvents.createdAt,
    })
    .from(shareLinkEvents)
    .where(and(eq(shareLinkEvents.shareLinkId, id), eq(shareLinkEvents.organisationId, organisationId)))
    .orderBy(desc(shareLinkEvents.createdAt))
    .limit(200);
  return { ...row, status: shareLinkStatus(row, now), events };
}
