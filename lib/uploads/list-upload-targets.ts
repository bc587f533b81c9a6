// Where an upload can go: the organisation's open jobs (not closed, not archived) with their
// flights, newest first, for the uploader's job and flight pickers.
import "server-only";
import { and, asc, desc, eq, inArray, isNull, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, jobs, sites, users } from "@/db/schema";

export type UploadFlight = { id: string; flownOn: string; aircraft: string | null; pilotName: string | null };
export type UploadTarget = { jobId: string; title: string; siteName: string; status: string; flights: UploadFlight[] };

export async function listUploadTargets(organisationId: string): Promise<UploadTarget[]> {
  const jobRows = await db()
    .select({ jobId: jobs.id, title: jobs.title, siteName: sites.name, status: jobs.status })
    .from(jobs)
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .where(and(eq(jobs.organisationId, organisationId), isNull(jobs.archivedAt), ne(jobs.status, "closed")))
    .orderBy(asc(jobs.title));
  if (jobRows.length === 0) return [];
  const flightRows = await db()
    .select({ id: flights.id, jobId: flights.jobId, flownOn: flights.flownOn, aircraft: flights.aircraft, pilotName: users.name })
    .from(flights)
    .leftJoin(users, eq(users.id, flights.pilotId))
    .where(and(eq(flights.organisationId, organisationId), isNull(flights.archivedAt), inArray(flights.jobId, jobRows.map((j) => j.jobId))))
    .orderBy(desc(flights.flownOn), desc(flights.createdAt));
  return jobRows.map((j) => ({
    ...j,
    flights: flightRows.filter((f) => f.jobId === j.jobId).map(({ jobId: _j, ...f }) => f),
  }));
}
