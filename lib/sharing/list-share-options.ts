// What a job offers to share: its recordings (not deleted), live findings and approved report
// versions (a draft is never shared). The share form picks from these; create-share-link checks the choice again.
import "server-only";
import { and, asc, desc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { findingCategories, findings, jobs, recordings, reports } from "@/db/schema";
import { notFound } from "@/lib/api/errors";

export async function listShareOptions(organisationId: string, jobId: string) {
  const [job] = await db().select({ id: jobs.id, title: jobs.title }).from(jobs).where(and(eq(jobs.id, jobId), eq(jobs.organisationId, organisationId)));
  if (!job) throw notFound("Job not found");
  const recs = await db()
    .select({ id: recordings.id, name: recordings.originalName, state: recordings.state, sha256: recordings.sha256 })
    .from(recordings)
    .where(and(eq(recordings.organisationId, organisationId), eq(recordings.jobId, jobId), isNull(recordings.deletedAt)))
    .orderBy(asc(recordings.sequenceIndex), asc(recordings.createdAt));
  const found = await db()
    .select({
      id: findings.id,
      recordingId: findings.recordingId,
      startSec: findings.startSec,
      severity: findings.severity,
      categoryName: findingCategories.name,
      note: findings.note,
    })
    .from(findings)
    .innerJoin(recordings, eq(recordings.id, findings.recordingId))
    .leftJoin(findingCategories, eq(findingCategories.id, findings.categoryId))
    .where(and(eq(findings.organisationId, organisationId), eq(findings.jobId, jobId), isNull(findings.deletedAt), isNull(recordings.deletedAt)))
    .orderBy(asc(findings.recordingId), asc(findings.startSec));
  const reps = await db()
    .select({ id: reports.id, version: reports.version, state: reports.state, approvedAt: reports.approvedAt })
    .from(reports)
    .where(and(eq(reports.organisationId, organisationId), eq(reports.jobId, jobId), eq(reports.state, "approved")))
    .orderBy(desc(reports.version));
  return { job, recordings: recs, findings: found, reports: reps };
}
