// The custody trail of one recording or one job, read from the organisation's chain. A recording's
// trail holds the events about the recording itself, its renditions and stills, and its findings;
// a job's trail holds every event filed under the job. The list pages by keyset and filters by kind of
// event, person and date. Nothing here writes.
import "server-only";
import { and, asc, desc, eq, gt, gte, inArray, isNotNull, isNull, lt, or, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { custodyEvents, findings, jobs, memberships, recordings, renditions, stills, users } from "@/db/schema";
import type { CustodyEventType } from "./record-custody-event";
import { notFound } from "@/lib/api/errors";
import { countUpTo, type ListTotal } from "@/lib/api/keyset";

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

export const CUSTODY_ORDERS = ["newest", "oldest"] as const;
export type CustodyOrder = (typeof CUSTODY_ORDERS)[number];
/** Largest page the custody list serves, in events; its own default is smaller. */
export const CUSTODY_PAGE_SIZE_MAX = 200;
export const CUSTODY_PAGE_SIZE_DEFAULT = 50;

/** Who acted: a member's user id, "system" (Cairn itself: processing, checkpoints) or "share" (a client through a share link). */
export type CustodyActorFilter = string | "system" | "share";

export type CustodyListFilter = CustodyTrailFilter & {
  eventTypes?: CustodyEventType[];
  actor?: CustodyActorFilter;
  /** UTC calendar dates (YYYY-MM-DD), both included */
  from?: string;
  to?: string;
};

export type CustodyListItem = {
  id: string;
  seq: number;
  eventType: string;
  evidenceType: string;
  evidenceId: string | null;
  jobId: string | null;
  jobTitle: string | null;
  /** the recording the event is about (itself, or the one its derived file, still or finding belongs to) */
  recordingId: string | null;
  recordingName: string | null;
  /** a derived file's kind (playable, poster, sprite, thumbnails_vtt), when the event is about one */
  fileKind: string | null;
  originalSha256: string | null;
  actorUserId: string | null;
  actorName: string | null;
  actorRole: string | null;
  actorShareLinkId: string | null;
  occurredAt: string;
  clientAddress: string | null;
  userAgent: string | null;
  purpose: string | null;
  tool: string | null;
  hash: string;
};

const DAY_MS = 86_400_000;

/** The filters other than the trail itself, as SQL (none of them can fail: their values are checked by the route's schema). */
function narrowing(filter: CustodyListFilter): SQL | undefined {
  const parts: SQL[] = [];
  if (filter.eventTypes?.length) parts.push(inArray(custodyEvents.eventType, filter.eventTypes));
  if (filter.actor === "system") parts.push(and(isNull(custodyEvents.actorUserId), isNull(custodyEvents.actorShareLinkId))!);
  else if (filter.actor === "share") parts.push(isNotNull(custodyEvents.actorShareLinkId));
  else if (filter.actor) parts.push(eq(custodyEvents.actorUserId, filter.actor));
  if (filter.from) parts.push(gte(custodyEvents.occurredAt, new Date(`${filter.from}T00:00:00.000Z`)));
  if (filter.to) parts.push(lt(custodyEvents.occurredAt, new Date(Date.parse(`${filter.to}T00:00:00.000Z`) + DAY_MS)));
  return parts.length ? and(...parts) : undefined;
}

/** A UUID as text (POSIX regular expression, matched case-insensitively with ~*) */
const UUID_PATTERN = "^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$";

/**
 * One page of a custody trail (or the organisation's whole log), filtered, newest first unless asked
 * otherwise. Keyset paging on the chain position `seq` (unique per organisation): `cursor` is the seq
 * of the previous page's last event, and the next page is the events strictly beyond it, so a deep page
 * costs what the first does and events appended meanwhile never shift a page. `total` counts the
 * filtered events up to COUNT_CAP (lib/api/keyset.ts); `nextCursor` is null on the last page.
 */
export async function listCustodyEvents(
  organisationId: string,
  filter: CustodyListFilter,
  opts: { order?: CustodyOrder; cursor?: number; pageSize?: number } = {},
): Promise<{ items: CustodyListItem[]; nextCursor: string | null } & ListTotal> {
  const order = opts.order ?? "newest";
  const pageSize = Math.min(Math.max(1, opts.pageSize ?? CUSTODY_PAGE_SIZE_DEFAULT), CUSTODY_PAGE_SIZE_MAX);
  const where = and(await trailCondition(organisationId, filter), narrowing(filter))!;
  const beyond = opts.cursor === undefined ? undefined : order === "newest" ? lt(custodyEvents.seq, opts.cursor) : gt(custodyEvents.seq, opts.cursor);
  // The recording an event is about: the one its details name (a derived file, still or finding of it),
  // else the recording itself. The UUID test comes first, so no other text is ever cast (CASE evaluates
  // its branches in order). Its file name and the job's title come in the same query, by left joins.
  const recordingIdOf = sql<string | null>`case when jsonb_typeof(${custodyEvents.details}->'recordingId') = 'string' and (${custodyEvents.details}->>'recordingId') ~* ${UUID_PATTERN} then (${custodyEvents.details}->>'recordingId')::uuid when ${custodyEvents.evidenceType} = 'recording' then ${custodyEvents.evidenceId} end`;
  const [counted, rows] = await Promise.all([
    countUpTo(db().select({ one: sql`1` }).from(custodyEvents).where(where).$dynamic()),
    db()
      .select({
        id: custodyEvents.id,
        seq: custodyEvents.seq,
        eventType: custodyEvents.eventType,
        evidenceType: custodyEvents.evidenceType,
        evidenceId: custodyEvents.evidenceId,
        jobId: custodyEvents.jobId,
        details: custodyEvents.details,
        originalSha256: custodyEvents.originalSha256,
        actorUserId: custodyEvents.actorUserId,
        actorName: users.name,
        actorRole: custodyEvents.actorRole,
        actorShareLinkId: custodyEvents.actorShareLinkId,
        occurredAt: custodyEvents.occurredAt,
        clientAddress: custodyEvents.clientAddress,
        userAgent: custodyEvents.userAgent,
        purpose: custodyEvents.purpose,
        tool: custodyEvents.tool,
        hash: custodyEvents.hash,
        recordingId: recordingIdOf,
        recordingName: recordings.originalName,
        jobTitle: jobs.title,
      })
      .from(custodyEvents)
      .leftJoin(users, eq(users.id, custodyEvents.actorUserId))
      .leftJoin(recordings, and(eq(recordings.organisationId, custodyEvents.organisationId), eq(recordings.id, recordingIdOf)))
      .leftJoin(jobs, and(eq(jobs.organisationId, custodyEvents.organisationId), eq(jobs.id, custodyEvents.jobId)))
      .where(beyond ? and(where, beyond) : where)
      .orderBy(order === "newest" ? desc(custodyEvents.seq) : asc(custodyEvents.seq))
      .limit(pageSize + 1),
  ]);
  const page = rows.slice(0, pageSize);
  const items = page.map(({ details, ...r }) => ({
    ...r,
    occurredAt: r.occurredAt.toISOString(),
    fileKind: r.evidenceType === "rendition" && details && typeof details.kind === "string" ? details.kind : null,
  }));
  const nextCursor = rows.length > pageSize ? String(page[page.length - 1].seq) : null;
  return { items, ...counted, nextCursor };
}

/** The people a custody log can be filtered by: the organisation's members (former members still show in the log by their role). */
export async function listCustodyPeople(organisationId: string) {
  return db()
    .select({ userId: users.id, name: users.name, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.organisationId, organisationId))
    .orderBy(asc(users.name), asc(users.id));
}

/** Recordings a log can be narrowed to: a job's recordings, or the organisation's newest RECORDING_CHOICES_MAX. */
export const RECORDING_CHOICES_MAX = 200;
export async function listCustodyRecordingChoices(organisationId: string, jobId?: string) {
  if (jobId) {
    const [job] = await db().select({ id: jobs.id }).from(jobs).where(and(eq(jobs.id, jobId), eq(jobs.organisationId, organisationId)));
    if (!job) throw notFound("Job not found");
  }
  return db()
    .select({ id: recordings.id, name: recordings.originalName, createdAt: recordings.createdAt })
    .from(recordings)
    .where(and(eq(recordings.organisationId, organisationId), jobId ? eq(recordings.jobId, jobId) : undefined))
    .orderBy(desc(recordings.createdAt), desc(recordings.id))
    .limit(RECORDING_CHOICES_MAX);
}

/** Every event of the trail in chain order, for export (streamed in pages by seq). */
export async function* custodyTrail(organisationId: string, filter: CustodyTrailFilter, pageSize = 2000) {
  yield* eventsInChainOrder(await trailCondition(organisationId, filter), pageSize);
}

/** The events matching `where`, with their actors' names, in chain order, read in keyset pages of seq. */
export async function* eventsInChainOrder(where: SQL | undefined, pageSize = 2000) {
  let after = 0;
  for (;;) {
    const rows = await db()
      .select({ event: custodyEvents, actorName: users.name })
      .from(custodyEvents)
      .leftJoin(users, eq(users.id, custodyEvents.actorUserId))
      .where(and(where, sql`${custodyEvents.seq} > ${after}`))
      .orderBy(asc(custodyEvents.seq))
      .limit(pageSize);
    for (const r of rows) yield { ...r.event, actorName: r.actorName };
    if (rows.length < pageSize) return;
    after = rows[rows.length - 1].event.seq;
  }
}
