// Who "the job's crew" is for notifications: the job's assigned pilot and reviewer, the pilots in
// command of its flights, and anyone the caller adds (the uploader, the report's author), as long
// as they are still members of the organisation. Client accounts are not crew.
import "server-only";
import { and, eq, inArray, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, jobs, memberships, users } from "@/db/schema";

export type CrewMember = { userId: string; email: string; name: string };

export async function jobCrew(organisationId: string, jobId: string, extraUserIds: (string | null | undefined)[] = []): Promise<CrewMember[]> {
  const [job] = await db()
    .select({ pilotId: jobs.pilotId, reviewerId: jobs.reviewerId })
    .from(jobs)
    .where(and(eq(jobs.id, jobId), eq(jobs.organisationId, organisationId)));
  if (!job) return [];
  const flightPilots = await db()
    .select({ pilotId: flights.pilotId })
    .from(flights)
    .where(and(eq(flights.jobId, jobId), eq(flights.organisationId, organisationId)));
  const ids = [job.pilotId, job.reviewerId, ...flightPilots.map((f) => f.pilotId), ...extraUserIds].filter((x): x is string => Boolean(x));
  if (ids.length === 0) return [];
  return db()
    .select({ userId: users.id, email: users.email, name: users.name })
    .from(users)
    .innerJoin(memberships, and(eq(memberships.userId, users.id), eq(memberships.organisationId, organisationId)))
    .where(and(inArray(users.id, [...new Set(ids)]), ne(memberships.role, "client")))
    .orderBy(users.name);
}
