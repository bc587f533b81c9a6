// What a client account may see: only the work of the organisation's clients it is tied to
// (membership_clients), i.e. the jobs at those clients' sites and everything hanging off those jobs
// (flights, recordings, findings, stills), and of reports only the approved versions. The crew
// (member.clientIds === null) sees the whole organisation. Anything out of scope answers 404, the same
// as a record of another organisation, so a client cannot even learn that it exists.
import "server-only";
import { and, eq, inArray, sql, type AnyColumn, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, flights, findings, jobs, recordings, reports, sites, stills } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import type { Member } from "./load-member";

type Scoped = Pick<Member, "organisationId" | "clientIds">;

/** True when the member is limited to some clients (a client account). */
export const isClientScoped = (m: Pick<Member, "clientIds">): m is { clientIds: string[] } => m.clientIds !== null;

const none = sql`false`;

/** A condition on a client id column: in the member's clients (undefined = no limit). */
export function clientScopeCondition(m: Scoped, clientIdColumn: AnyColumn): SQL | undefined {
  if (!isClientScoped(m)) return undefined;
  return m.clientIds.length ? inArray(clientIdColumn, m.clientIds) : none;
}

/** A condition on a job id column: the job is at a site of one of the member's clients (undefined = no limit). */
export function jobScopeCondition(m: Scoped, jobIdColumn: AnyColumn): SQL | undefined {
  if (!isClientScoped(m)) return undefined;
  if (!m.clientIds.length) return none;
  return inArray(
    jobIdColumn,
    db()
      .select({ id: jobs.id })
      .from(jobs)
      .innerJoin(sites, eq(sites.id, jobs.siteId))
      .where(and(eq(jobs.organisationId, m.organisationId), inArray(sites.clientId, m.clientIds))),
  );
}

/** Report versions a member may see: a client account only approved ones. */
export function reportScopeCondition(m: Scoped): SQL | undefined {
  if (!isClientScoped(m)) return undefined;
  return and(eq(reports.state, "approved"), jobScopeCondition(m, reports.jobId));
}

export type ScopeTarget = "client" | "site" | "job" | "flight" | "recording" | "finding" | "report" | "still";

/** The client a record belongs to (through its job), or null when it is not in the organisation. */
async function clientOf(orgId: string, kind: ScopeTarget, id: string): Promise<{ clientId: string; approved?: boolean } | null> {
  const q = db();
  switch (kind) {
    case "client": {
      const [r] = await q.select({ clientId: clients.id }).from(clients).where(and(eq(clients.id, id), eq(clients.organisationId, orgId)));
      return r ?? null;
    }
    case "site": {
      const [r] = await q.select({ clientId: sites.clientId }).from(sites).where(and(eq(sites.id, id), eq(sites.organisationId, orgId)));
      return r ?? null;
    }
    case "job": {
      const [r] = await q.select({ clientId: sites.clientId }).from(jobs).innerJoin(sites, eq(sites.id, jobs.siteId)).where(and(eq(jobs.id, id), eq(jobs.organisationId, orgId)));
      return r ?? null;
    }
    case "flight": {
      const [r] = await q
        .select({ clientId: sites.clientId })
        .from(flights)
        .innerJoin(jobs, eq(jobs.id, flights.jobId))
        .innerJoin(sites, eq(sites.id, jobs.siteId))
        .where(and(eq(flights.id, id), eq(flights.organisationId, orgId)));
      return r ?? null;
    }
    case "recording": {
      const [r] = await q
        .select({ clientId: sites.clientId })
        .from(recordings)
        .innerJoin(jobs, eq(jobs.id, recordings.jobId))
        .innerJoin(sites, eq(sites.id, jobs.siteId))
        .where(and(eq(recordings.id, id), eq(recordings.organisationId, orgId)));
      return r ?? null;
    }
    case "finding": {
      const [r] = await q
        .select({ clientId: sites.clientId })
        .from(findings)
        .innerJoin(jobs, eq(jobs.id, findings.jobId))
        .innerJoin(sites, eq(sites.id, jobs.siteId))
        .where(and(eq(findings.id, id), eq(findings.organisationId, orgId)));
      return r ?? null;
    }
    case "report": {
      const [r] = await q
        .select({ clientId: sites.clientId, state: reports.state })
        .from(reports)
        .innerJoin(jobs, eq(jobs.id, reports.jobId))
        .innerJoin(sites, eq(sites.id, jobs.siteId))
        .where(and(eq(reports.id, id), eq(reports.organisationId, orgId)));
      return r ? { clientId: r.clientId, approved: r.state === "approved" } : null;
    }
    case "still": {
      const [r] = await q
        .select({ clientId: sites.clientId })
        .from(stills)
        .innerJoin(recordings, eq(recordings.id, stills.recordingId))
        .innerJoin(jobs, eq(jobs.id, recordings.jobId))
        .innerJoin(sites, eq(sites.id, jobs.siteId))
        .where(and(eq(stills.id, id), eq(stills.organisationId, orgId)));
      return r ?? null;
    }
  }
}

/** Whether the member may see this record (always true for the crew, who are limited by organisation only). */
export async function inScope(m: Scoped, kind: ScopeTarget, id: string): Promise<boolean> {
  if (!isClientScoped(m)) return true;
  const owner = await clientOf(m.organisationId, kind, id);
  if (!owner || !m.clientIds.includes(owner.clientId)) return false;
  return kind !== "report" || owner.approved === true;
}

/** 404 (with the route's own message) when the record is outside the member's clients. */
export async function requireInScope(m: Scoped, kind: ScopeTarget, id: string, message = "Not found"): Promise<void> {
  if (!(await inScope(m, kind, id))) throw notFound(message);
}
