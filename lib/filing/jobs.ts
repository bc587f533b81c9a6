// Jobs of the organisation: list, read, create, update, archive. A job is a piece of inspection work
// at a site, with a status and an assigned pilot and reviewer.
import "server-only";
import { and, count, eq, inArray, isNull, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, type DbOrTx } from "@/db/client";
import { clients, flights, jobStatusEnum, jobs, sites, users } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { keysetOf, keysetPage, listWhere } from "@/lib/api/list";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, countUpTo } from "@/lib/api/keyset";
import type { JobInput, JobPatch } from "@/lib/validation/work";
import type { JobListQuery } from "@/lib/validation/list-filters";
import { requireCrewIn, requireSiteIn } from "./require-in-organisation";

const pilot = alias(users, "pilot");
const reviewer = alias(users, "reviewer");

const columns = {
  id: jobs.id,
  siteId: jobs.siteId,
  title: jobs.title,
  scope: jobs.scope,
  dueDate: jobs.dueDate,
  status: jobs.status,
  pilotId: jobs.pilotId,
  reviewerId: jobs.reviewerId,
  legalHold: jobs.legalHold,
  archivedAt: jobs.archivedAt,
  createdAt: jobs.createdAt,
  updatedAt: jobs.updatedAt,
};

const related = {
  siteName: sites.name,
  siteTimeZone: sites.timeZone,
  clientId: clients.id,
  clientName: clients.name,
  pilotName: pilot.name,
  reviewerName: reviewer.name,
};

/** `scope`: a further condition, e.g. a client account's clients (lib/auth/client-scope.ts). */
export async function listJobs(orgId: string, params: JobListQuery, scope?: SQL) {
  const where = listWhere({
    orgFilter: eq(jobs.organisationId, orgId),
    params,
    searchColumns: [jobs.title, jobs.scope, sites.name, clients.name],
    archivedColumn: jobs.archivedAt,
    extra: [
      scope,
      params.clientId ? eq(sites.clientId, params.clientId) : undefined,
      params.siteId ? eq(jobs.siteId, params.siteId) : undefined,
      params.pilotId ? eq(jobs.pilotId, params.pilotId) : undefined,
      params.reviewerId ? eq(jobs.reviewerId, params.reviewerId) : undefined,
      params.status?.length ? inArray(jobs.status, params.status) : undefined,
    ],
  });
  const { ordering, keys } = keysetOf(
    params,
    {
      title: { expr: jobs.title, type: "text", notNull: true },
      status: { expr: jobs.status, type: jobStatusEnum, notNull: true },
      dueDate: { expr: jobs.dueDate, type: "date" },
      siteName: { expr: sites.name, type: "text", notNull: true },
      clientName: { expr: clients.name, type: "text", notNull: true },
      pilotName: { expr: pilot.name, type: "text" },
      reviewerName: { expr: reviewer.name, type: "text" },
      createdAt: { expr: jobs.createdAt, type: "timestamptz", notNull: true },
    },
    // soonest due first; undated work after dated work (jobs_org_due_idx)
    [
      { expr: jobs.dueDate, dir: "asc", type: "date" },
      { expr: jobs.id, dir: "asc", type: "uuid", notNull: true },
    ],
    jobs.id,
  );
  const page = keysetPage(params);
  const [rows, counted] = await Promise.all([
    db()
      .select({
        ...columns,
        ...related,
        flightCount: db().$count(flights, and(eq(flights.jobId, jobs.id), eq(flights.organisationId, orgId), isNull(flights.archivedAt))),
        ...keysetColumns(keys),
      })
      .from(jobs)
      .innerJoin(sites, eq(sites.id, jobs.siteId))
      .innerJoin(clients, eq(clients.id, sites.clientId))
      .leftJoin(pilot, eq(pilot.id, jobs.pilotId))
      .leftJoin(reviewer, eq(reviewer.id, jobs.reviewerId))
      .where(and(where, afterCursor(params.cursor, ordering, keys)))
      .orderBy(...keysetOrder(keys))
      .limit(page.limit)
      .offset(page.offset),
    // the crew joins cannot change the count (one user per id); the search needs the site and client
    countUpTo(db().select({ one: sql`1` }).from(jobs).innerJoin(sites, eq(sites.id, jobs.siteId)).innerJoin(clients, eq(clients.id, sites.clientId)).where(where).$dynamic()),
  ]);
  return { ...pageOfRows(rows, params.pageSize, ordering, keys), ...counted };
}

export async function getJobOrThrow(orgId: string, id: string) {
  const [row] = await db()
    .select({
      ...columns,
      ...related,
      siteAddress: sites.address,
      siteLatitude: sites.latitude,
      siteLongitude: sites.longitude,
      siteAssetKind: sites.assetKind,
      siteLaunchNotes: sites.launchNotes,
    })
    .from(jobs)
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .innerJoin(clients, eq(clients.id, sites.clientId))
    .leftJoin(pilot, eq(pilot.id, jobs.pilotId))
    .leftJoin(reviewer, eq(reviewer.id, jobs.reviewerId))
    .where(and(eq(jobs.id, id), eq(jobs.organisationId, orgId)));
  if (!row) throw notFound("Job not found");
  return row;
}
export type JobDetail = Awaited<ReturnType<typeof getJobOrThrow>>;

async function checkReferences(tx: DbOrTx, orgId: string, input: Partial<Pick<JobInput, "siteId" | "pilotId" | "reviewerId">>) {
  if (input.siteId) await requireSiteIn(tx, orgId, input.siteId);
  if (input.pilotId) await requireCrewIn(tx, orgId, input.pilotId, "pilot", "pilotId");
  if (input.reviewerId) await requireCrewIn(tx, orgId, input.reviewerId, "reviewer", "reviewerId");
}

export async function createJob(orgId: string, input: JobInput) {
  return db().transaction(async (tx) => {
    await checkReferences(tx, orgId, input);
    const [row] = await tx.insert(jobs).values({ ...input, organisationId: orgId }).returning(columns);
    return row;
  });
}

export async function updateJob(orgId: string, id: string, input: JobPatch) {
  const { archived, ...rest } = input;
  return db().transaction(async (tx) => {
    // an unknown job answers 404 before its body is looked at
    const [current] = await tx.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.id, id), eq(jobs.organisationId, orgId))).for("update");
    if (!current) throw notFound("Job not found");
    await checkReferences(tx, orgId, rest);
    const [row] = await tx
      .update(jobs)
      .set({ ...rest, ...(archived === undefined ? {} : { archivedAt: archived ? sql`coalesce(${jobs.archivedAt}, now())` : null }), updatedAt: new Date() })
      .where(and(eq(jobs.id, id), eq(jobs.organisationId, orgId)))
      .returning(columns);
    return row;
  });
}
