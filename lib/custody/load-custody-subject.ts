// The job or recording a custody page is about, inside the member's organisation only.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { jobs, recordings, sites } from "@/db/schema";

export async function loadCustodyJob(organisationId: string, jobId: string) {
  const [job] = await db()
    .select({ id: jobs.id, title: jobs.title, siteName: sites.name, legalHold: jobs.legalHold })
    .from(jobs)
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .where(and(eq(jobs.id, jobId), eq(jobs.organisationId, organisationId)));
  return job ?? null;
}

export async function loadCustodyRecording(organisationId: string, recordingId: string) {
  const [rec] = await db()
    .select({
      id: recordings.id,
      originalName: recordings.originalName,
      sha256: recordings.sha256,
      sizeBytes: recordings.sizeBytes,
      jobId: recordings.jobId,
      jobTitle: jobs.title,
      legalHold: jobs.legalHold,
      deletedAt: recordings.deletedAt,
      createdAt: recordings.createdAt,
    })
    .from(recordings)
    .innerJoin(jobs, eq(jobs.id, recordings.jobId))
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId)));
  return rec ?? null;
}
