// Closed jobs and when their evidence falls due for disposal, read for one organisation (the
// disposal list) or for all of them (the reminder sweep). A job without any retention period set has
// no disposal date and is not listed; a disposed job is not listed either.
import "server-only";
import { and, desc, eq, inArray, isNotNull, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, disposalReminders, evidencePackages, jobs, organisations, sites } from "@/db/schema";
import { FINAL_PACKAGE_PURPOSE } from "@/lib/validation/evidence-packages";
import { daysUntil, disposalDate, effectiveRetention, type RetentionSource } from "./retention-period";

export type DisposalItem = {
  organisationId: string;
  jobId: string;
  title: string;
  clientName: string;
  siteName: string;
  closedAt: string;
  retentionDays: number;
  source: RetentionSource;
  disposalDate: string;
  daysLeft: number;
  due: boolean;
  legalHold: boolean;
  legalHoldReason: string | null;
  remindersSent: { leadDays: number; sentAt: string }[];
  finalPackage: { id: string; state: string; progress: number; expiresAt: string } | null;
};

export { FINAL_PACKAGE_PURPOSE };

export async function listDisposals(filter: { organisationId?: string; horizonDays?: number }, now: Date): Promise<DisposalItem[]> {
  const rows = await db()
    .select({
      organisationId: jobs.organisationId,
      jobId: jobs.id,
      title: jobs.title,
      clientName: clients.name,
      siteName: sites.name,
      closedAt: jobs.closedAt,
      legalHold: jobs.legalHold,
      legalHoldReason: jobs.legalHoldReason,
      jobDays: jobs.retentionDays,
      clientDays: clients.retentionDays,
      organisationDays: organisations.retentionDays,
    })
    .from(jobs)
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .innerJoin(clients, eq(clients.id, sites.clientId))
    .innerJoin(organisations, eq(organisations.id, jobs.organisationId))
    .where(and(filter.organisationId ? eq(jobs.organisationId, filter.organisationId) : undefined, eq(jobs.status, "closed"), isNotNull(jobs.closedAt), isNull(jobs.disposedAt)));
  const items: DisposalItem[] = [];
  for (const r of rows) {
    const retention = effectiveRetention(r.jobDays, r.clientDays, r.organisationDays);
    if (!retention || !r.closedAt) continue;
    const date = disposalDate(r.closedAt, retention.days);
    const left = daysUntil(date, now);
    if (filter.horizonDays !== undefined && left > filter.horizonDays) continue;
    items.push({
      organisationId: r.organisationId,
      jobId: r.jobId,
      title: r.title,
      clientName: r.clientName,
      siteName: r.siteName,
      closedAt: r.closedAt.toISOString(),
      retentionDays: retention.days,
      source: retention.source,
      disposalDate: date,
      daysLeft: left,
      due: left <= 0,
      legalHold: r.legalHold,
      legalHoldReason: r.legalHoldReason,
      remindersSent: [],
      finalPackage: null,
    });
  }
  if (items.length) {
    const ids = items.map((i) => i.jobId);
    const sent = await db().select({ jobId: disposalReminders.jobId, disposalDate: disposalReminders.disposalDate, leadDays: disposalReminders.leadDays, sentAt: disposalReminders.sentAt }).from(disposalReminders).where(inArray(disposalReminders.jobId, ids));
    const finals = await db()
      .select({ id: evidencePackages.id, jobId: evidencePackages.jobId, state: evidencePackages.state, progress: evidencePackages.progress, expiresAt: evidencePackages.expiresAt })
      .from(evidencePackages)
      .where(and(inArray(evidencePackages.jobId, ids), eq(evidencePackages.purpose, FINAL_PACKAGE_PURPOSE)))
      .orderBy(desc(evidencePackages.createdAt));
    for (const item of items) {
      item.remindersSent = sent.filter((s) => s.jobId === item.jobId && s.disposalDate === item.disposalDate).map((s) => ({ leadDays: s.leadDays, sentAt: s.sentAt.toISOString() }));
      const f = finals.find((p) => p.jobId === item.jobId);
      item.finalPackage = f ? { id: f.id, state: f.state === "ready" && f.expiresAt <= now ? "expired" : f.state, progress: f.progress, expiresAt: f.expiresAt.toISOString() } : null;
    }
  }
  return items.sort((a, b) => a.disposalDate.localeCompare(b.disposalDate) || a.title.localeCompare(b.title));
}
