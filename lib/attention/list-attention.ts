// What needs attention now, for one member's start page (app/(workspace)/today): recordings still
// processing or failed, findings not yet in a report, reports waiting for approval, share links about
// to expire, and flights with no recording. Each group is shown only to a role that may act on it or
// see it (lib/auth/permissions.ts), and a client account sees only its own clients' work
// (lib/auth/client-scope.ts). Every item carries the address where it is handled. Nothing here writes.
import "server-only";
import { and, asc, count, desc, eq, gt, inArray, isNull, lte, notExists, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { findings, flights, jobs, recordings, reports, shareLinks, sites } from "@/db/schema";
import { can, type Permission } from "@/lib/auth/permissions";
import { jobScopeCondition } from "@/lib/auth/client-scope";
import type { Member } from "@/lib/auth/load-member";

export const ATTENTION_KINDS = [
  "recordings_processing",
  "recordings_failed",
  "findings_unreported",
  "reports_awaiting_approval",
  "shares_expiring",
  "flights_without_recording",
] as const;
export type AttentionKind = (typeof ATTENTION_KINDS)[number];

/** Who sees each group: the permission that lets a role see (or act on) what it lists. */
export const ATTENTION_PERMISSION: Record<AttentionKind, Permission> = {
  recordings_processing: "recordings.read",
  recordings_failed: "recordings.read",
  findings_unreported: "reports.build",
  reports_awaiting_approval: "reports.approve",
  shares_expiring: "shares.manage",
  flights_without_recording: "recordings.upload",
};

/** A share link counts as "about to expire" within this many days of now (ours). */
export const SHARE_EXPIRY_WARNING_DAYS = 7;
const DAY_MS = 86_400_000;

export type AttentionItem = {
  id: string;
  /** what it is, in words: the file name, the job title, the share link's label */
  title: string;
  /** the state or the reason, in words */
  detail: string;
  /** where it is handled, one click away */
  href: string;
  /** the moment the item is about (expiry, failure, flight date), ISO 8601; null when none */
  at: string | null;
  jobTitle: string;
};

export type AttentionGroup = { kind: AttentionKind; count: number; items: AttentionItem[] };
export type Attention = { generatedAt: string; groups: AttentionGroup[] };

const iso = (d: Date | null) => (d ? d.toISOString() : null);
const and2 = (...c: (SQL | undefined)[]) => and(...c.filter(Boolean))!;

async function processing(m: Member, limit: number): Promise<AttentionGroup> {
  const where = and2(eq(recordings.organisationId, m.organisationId), isNull(recordings.deletedAt), inArray(recordings.state, ["waiting", "processing"]), jobScopeCondition(m, recordings.jobId));
  const [{ n }] = await db().select({ n: count() }).from(recordings).where(where);
  const rows = await db()
    .select({ id: recordings.id, name: recordings.originalName, state: recordings.state, progress: recordings.progress, at: recordings.createdAt, jobTitle: jobs.title })
    .from(recordings)
    .innerJoin(jobs, eq(jobs.id, recordings.jobId))
    .where(where)
    .orderBy(desc(recordings.createdAt), desc(recordings.id))
    .limit(limit);
  return {
    kind: "recordings_processing",
    count: n,
    items: rows.map((r) => ({
      id: r.id,
      title: r.name,
      detail: r.state === "waiting" ? "Waiting to be processed" : `Processing ${r.progress} %`,
      href: `/recordings/${r.id}`,
      at: iso(r.at),
      jobTitle: r.jobTitle,
    })),
  };
}

async function failed(m: Member, limit: number): Promise<AttentionGroup> {
  const where = and2(eq(recordings.organisationId, m.organisationId), isNull(recordings.deletedAt), eq(recordings.state, "failed"), jobScopeCondition(m, recordings.jobId));
  const [{ n }] = await db().select({ n: count() }).from(recordings).where(where);
  const rows = await db()
    .select({ id: recordings.id, name: recordings.originalName, reason: recordings.failureReason, at: recordings.updatedAt, jobTitle: jobs.title })
    .from(recordings)
    .innerJoin(jobs, eq(jobs.id, recordings.jobId))
    .where(where)
    .orderBy(desc(recordings.updatedAt), desc(recordings.id))
    .limit(limit);
  return {
    kind: "recordings_failed",
    count: n,
    items: rows.map((r) => ({ id: r.id, title: r.name, detail: `Failed: ${r.reason ?? "no reason recorded"}`, href: `/recordings/${r.id}`, at: iso(r.at), jobTitle: r.jobTitle })),
  };
}

// A finding is "in a report" when a report version of its job was started after the finding was last
// changed and did not fail: that version was built from it (lib/reports builds from the findings of the
// moment). Listed by job, since a report covers a job.
async function unreported(m: Member, limit: number): Promise<AttentionGroup> {
  const coveredBy = db()
    .select({ one: sql`1` })
    .from(reports)
    .where(and(eq(reports.jobId, findings.jobId), eq(reports.organisationId, m.organisationId), sql`${reports.state} <> 'failed'`, sql`${reports.createdAt} >= ${findings.updatedAt}`));
  const where = and2(eq(findings.organisationId, m.organisationId), isNull(findings.deletedAt), notExists(coveredBy), jobScopeCondition(m, findings.jobId));
  const [{ n }] = await db().select({ n: count() }).from(findings).where(where);
  const rows = await db()
    .select({ jobId: findings.jobId, jobTitle: jobs.title, n: count(), latest: sql<Date>`max(${findings.updatedAt})`.mapWith((v) => new Date(v)) })
    .from(findings)
    .innerJoin(jobs, eq(jobs.id, findings.jobId))
    .where(where)
    .groupBy(findings.jobId, jobs.title)
    .orderBy(desc(sql`max(${findings.updatedAt})`), asc(findings.jobId))
    .limit(limit);
  return {
    kind: "findings_unreported",
    count: n,
    items: rows.map((r) => ({
      id: r.jobId,
      title: r.jobTitle,
      detail: `${r.n} ${r.n === 1 ? "finding" : "findings"} not yet in a report`,
      href: `/jobs/${r.jobId}#reports`,
      at: iso(r.latest),
      jobTitle: r.jobTitle,
    })),
  };
}

async function awaitingApproval(m: Member, limit: number): Promise<AttentionGroup> {
  const where = and2(eq(reports.organisationId, m.organisationId), eq(reports.state, "ready"), jobScopeCondition(m, reports.jobId));
  const [{ n }] = await db().select({ n: count() }).from(reports).where(where);
  const rows = await db()
    .select({ id: reports.id, jobId: reports.jobId, version: reports.version, at: reports.updatedAt, jobTitle: jobs.title })
    .from(reports)
    .innerJoin(jobs, eq(jobs.id, reports.jobId))
    .where(where)
    .orderBy(desc(reports.updatedAt), desc(reports.id))
    .limit(limit);
  return {
    kind: "reports_awaiting_approval",
    count: n,
    items: rows.map((r) => ({ id: r.id, title: `${r.jobTitle}: report version ${r.version}`, detail: "Built, waiting for approval", href: `/jobs/${r.jobId}#reports`, at: iso(r.at), jobTitle: r.jobTitle })),
  };
}

async function expiringShares(m: Member, limit: number, now: Date): Promise<AttentionGroup> {
  const until = new Date(now.getTime() + SHARE_EXPIRY_WARNING_DAYS * DAY_MS);
  const where = and2(
    eq(shareLinks.organisationId, m.organisationId),
    isNull(shareLinks.revokedAt),
    gt(shareLinks.expiresAt, now),
    lte(shareLinks.expiresAt, until),
    jobScopeCondition(m, shareLinks.jobId),
  );
  const [{ n }] = await db().select({ n: count() }).from(shareLinks).where(where);
  const rows = await db()
    .select({ id: shareLinks.id, label: shareLinks.label, jobId: shareLinks.jobId, at: shareLinks.expiresAt, jobTitle: jobs.title })
    .from(shareLinks)
    .innerJoin(jobs, eq(jobs.id, shareLinks.jobId))
    .where(where)
    .orderBy(asc(shareLinks.expiresAt), asc(shareLinks.id))
    .limit(limit);
  return {
    kind: "shares_expiring",
    count: n,
    items: rows.map((r) => {
      const hours = Math.max(1, Math.round((r.at.getTime() - now.getTime()) / 3_600_000));
      return {
        id: r.id,
        title: r.label,
        detail: hours < 48 ? `Expires in ${hours} h` : `Expires in ${Math.round(hours / 24)} days`,
        href: `/custody/jobs/${r.jobId}#share-links`,
        at: iso(r.at),
        jobTitle: r.jobTitle,
      };
    }),
  };
}

// Flights already flown (on or before today in UTC, a day's slack for time zones ahead) with no
// recording that still has its files; archived flights and jobs are left out.
async function flightsWithout(m: Member, limit: number, now: Date): Promise<AttentionGroup> {
  const tomorrow = new Date(now.getTime() + DAY_MS).toISOString().slice(0, 10);
  const where = and2(
    eq(flights.organisationId, m.organisationId),
    isNull(flights.archivedAt),
    isNull(jobs.archivedAt),
    lte(flights.flownOn, tomorrow),
    notExists(db().select({ one: sql`1` }).from(recordings).where(and(eq(recordings.flightId, flights.id), isNull(recordings.deletedAt)))),
    jobScopeCondition(m, flights.jobId),
  );
  const [{ n }] = await db().select({ n: count() }).from(flights).innerJoin(jobs, eq(jobs.id, flights.jobId)).where(where);
  const rows = await db()
    .select({ id: flights.id, jobId: flights.jobId, flownOn: flights.flownOn, aircraft: flights.aircraft, jobTitle: jobs.title, siteName: sites.name })
    .from(flights)
    .innerJoin(jobs, eq(jobs.id, flights.jobId))
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .where(where)
    .orderBy(desc(flights.flownOn), desc(flights.createdAt), asc(flights.id))
    .limit(limit);
  return {
    kind: "flights_without_recording",
    count: n,
    items: rows.map((r) => ({
      id: r.id,
      title: `${r.flownOn} · ${r.jobTitle}`,
      detail: `${r.siteName}${r.aircraft ? ` · ${r.aircraft}` : ""} · no recording uploaded`,
      href: `/upload?jobId=${r.jobId}&flightId=${r.id}`,
      at: r.flownOn,
      jobTitle: r.jobTitle,
    })),
  };
}

/** The groups this member may see, each with its full count and its first `limit` items. */
export async function listAttention(member: Member, opts: { now?: Date; limit?: number } = {}): Promise<Attention> {
  const now = opts.now ?? new Date();
  const limit = opts.limit ?? 5;
  const load: Record<AttentionKind, () => Promise<AttentionGroup>> = {
    recordings_processing: () => processing(member, limit),
    recordings_failed: () => failed(member, limit),
    findings_unreported: () => unreported(member, limit),
    reports_awaiting_approval: () => awaitingApproval(member, limit),
    shares_expiring: () => expiringShares(member, limit, now),
    flights_without_recording: () => flightsWithout(member, limit, now),
  };
  const kinds = ATTENTION_KINDS.filter((k) => can(member.role, ATTENTION_PERMISSION[k]));
  const groups = await Promise.all(kinds.map((k) => load[k]()));
  return { generatedAt: now.toISOString(), groups };
}
