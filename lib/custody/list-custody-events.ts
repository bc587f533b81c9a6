// The custody trail of one recording or one job, read from the organisation's chain. A recording's
// trail holds the events about the recording itself, its renditions and stills, and its findings;
// a job's trail holds every event filed under the job. Nothing here writes.
import { and, asc, count, eq, inArray, or, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { custodyEvents, findings, jobs, recordings, renditions, stills, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";

export type CustodyTrailFilter = { recordingId?: string; jobId?: string };

export async function trailCondition(organisationId: string, filter: CustodyTrailFilter): Promise<SQL> {
  const inOrg = eq(custodyEvents.organisationId, organisationId);
  if (filter.recordingId) {
    const id = filter.recordingId;
    const [rec] = await db().select({ id: recordings.id }).from(recordings).where(and(eq(recordings.id, id), eq(recordings.organisationId, organisationId)));
    if (!rec) throw notFound("Recording not found");
    const related = or(
      eq(custodyEvents.evidenceId, id),
      inArray(custodyEvents.evidenceId, db().select({ id: renditions.id }).from(renditions).where(and(eq(renditions.recordingId, id), eq(renditions.organisationId, organisationId)))),
      inArray(custodyEvents.evidenceId, db().select({ id: stills.id }).from(stills).where(and(eq(stills.recordingId, id), eq(stills.organisationId, organisationId)))),
      inArray(custodyEvents.evidenceId, db().select({ id: findings.id }).from(findings).where(and(eq(findings.recordingId, id), eq(findings.organisationId, organisationId)))),
      sql`${custodyEvents.details}->>'recordingId' = ${id}`,
    );
    return and(inOrg, related)!;
  }
  if (filter.jobId) {
    const id = filter.jobId;
    const [job] = await db().select({ id: jobs.id }).from(jobs).where(and(eq(jobs.id, id), eq(jobs.organisationId, organisationId)));
    if (!job) throw notFound("Job not found");
    return and(inOrg, or(eq(custodyEvents.jobId, id), eq(custodyEvents.evidenceId, id)))!;
  }
  return inOrg;
}

export async function listCustodyEvents(organisationId: string, filter: CustodyTrailFilter, page = 1, pageSize = 100) {
  const where = await trailCondition(organisationId, filter);
  const [{ total }] = await db().select({ total: count() }).from(custodyEvents).where(where);
  const rows = await db()
    .select({ event: custodyEvents, actorName: users.name })
    .from(custodyEvents)
    .leftJoin(users, eq(users.id, custodyEvents.actorUserId))
    .where(where)
    .orderBy(asc(custodyEvents.seq))
    .limit(pageSize)
    .offset((page - 1) * pageSize);
  return { items: rows.map((r) => ({ ...r.event, actorName: r.actorName })), total };
}

/** Every event of the trail in chain order, for export (streamed in pages by seq). */
export async function* custodyTrail(organisationId: string, filter: CustodyTrailFilter, pageSize = 2000) {
  const where = await trailCondition(organisationId, filter);
  let after = 0;
  for (;;) {
    const rows = await db()
      .select({ event: custodyEvents, actorName: users.name })
      .from(custodyEvents)
      .leftJoin(users, eq(users.id, custodyEvents.actorUserId))
      .where(and(where, sql`${custodyEvents.seq} > ${after}`))
      .orderBy(asc(custodyEvents.seq))
      .limit(pageSize);
    if (rows.length === 0) return;
    for (const r of rows) yield { ...r.event, actorName: r.actorName };
    after = rows[rows.length - 1].event.seq;
    if (rows.length < pageSize) return;
  }
}
