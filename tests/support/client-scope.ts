// Ties a client account to one of the organisation's clients (membership_clients), as an owner does
// on the members page, so tests can give the demo client account the work it may see.
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { flights, jobs, membershipClients, memberships, recordings, sites } from "@/db/schema";

export async function tieClientAccount(actor: { userId: string; organisationId: string }, clientId: string): Promise<void> {
  const [m] = await db()
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(eq(memberships.userId, actor.userId), eq(memberships.organisationId, actor.organisationId)));
  await db().insert(membershipClients).values({ membershipId: m.id, clientId, organisationId: actor.organisationId }).onConflictDoNothing();
}

export async function untieClientAccount(actor: { userId: string; organisationId: string }, clientId: string): Promise<void> {
  const [m] = await db()
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(eq(memberships.userId, actor.userId), eq(memberships.organisationId, actor.organisationId)));
  await db().delete(membershipClients).where(and(eq(membershipClients.membershipId, m.id), eq(membershipClients.clientId, clientId)));
}

/** The client a job, a flight or a recording was done for. */
export async function clientOf(what: { jobId?: string; flightId?: string; recordingId?: string; siteId?: string }): Promise<string> {
  if (what.siteId) return (await db().select({ c: sites.clientId }).from(sites).where(eq(sites.id, what.siteId)))[0].c;
  let jobId = what.jobId;
  if (what.flightId) jobId = (await db().select({ j: flights.jobId }).from(flights).where(eq(flights.id, what.flightId)))[0].j;
  if (what.recordingId) jobId = (await db().select({ j: recordings.jobId }).from(recordings).where(eq(recordings.id, what.recordingId)))[0].j;
  const [r] = await db().select({ c: sites.clientId }).from(jobs).innerJoin(sites, eq(sites.id, jobs.siteId)).where(eq(jobs.id, jobId!));
  return r.c;
}
