// Flights of the organisation: list, read, create, update, archive. A flight is one sortie flown for a job.
import "server-only";
import { and, eq, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, type DbOrTx } from "@/db/client";
import { clients, flights, jobs, sites, users } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { keysetOf, keysetPage, listWhere } from "@/lib/api/list";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, type KeyPart, countUpTo } from "@/lib/api/keyset";
import type { Member } from "@/lib/auth/load-member";
import { FLIGHT_LAUNCH_PAIR, coordinatePairIssue, type FlightInput, type FlightPatch } from "@/lib/validation/work";
import type { FlightListQuery } from "@/lib/validation/list-filters";
import { requireCrewIn, requireJobIn } from "./require-in-organisation";

const pilot = alias(users, "pilot");

const columns = {
  id: flights.id,
  jobId: flights.jobId,
  flownOn: flights.flownOn,
  pilotId: flights.pilotId,
  aircraft: flights.aircraft,
  launchLatitude: flights.launchLatitude,
  launchLongitude: flights.launchLongitude,
  launchNotes: flights.launchNotes,
  maxAltitudeAglM: flights.maxAltitudeAglM,
  notes: flights.notes,
  archivedAt: flights.archivedAt,
  createdAt: flights.createdAt,
  updatedAt: flights.updatedAt,
};

const related = {
  jobTitle: jobs.title,
  jobStatus: jobs.status,
  siteId: sites.id,
  siteName: sites.name,
  siteTimeZone: sites.timeZone,
  clientId: clients.id,
  clientName: clients.name,
  pilotName: pilot.name,
};

const joined = () =>
  db()
    .select({ ...columns, ...related })
    .from(flights)
    .innerJoin(jobs, eq(jobs.id, flights.jobId))
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .innerJoin(clients, eq(clients.id, sites.clientId))
    .leftJoin(pilot, eq(pilot.id, flights.pilotId));

// newest flight first, then the newest logged (flights_org_date_idx, read backwards)
const DEFAULT_KEYS: KeyPart[] = [
  { expr: flights.flownOn, dir: "desc", type: "date", notNull: true },
  { expr: flights.createdAt, dir: "desc", type: "timestamptz", notNull: true },
  { expr: flights.id, dir: "desc", type: "uuid", notNull: true },
];

/** `scope`: a further condition, e.g. a client account's clients (lib/auth/client-scope.ts). */
export async function listFlights(orgId: string, params: FlightListQuery, scope?: SQL) {
  const where = listWhere({
    orgFilter: eq(flights.organisationId, orgId),
    params,
    searchColumns: [flights.aircraft, flights.notes, jobs.title, sites.name, clients.name, pilot.name],
    archivedColumn: flights.archivedAt,
    extra: [
      scope,
      params.jobId ? eq(flights.jobId, params.jobId) : undefined,
      params.siteId ? eq(jobs.siteId, params.siteId) : undefined,
      params.clientId ? eq(sites.clientId, params.clientId) : undefined,
      params.pilotId ? eq(flights.pilotId, params.pilotId) : undefined,
    ],
  });
  const { ordering, keys } = keysetOf(
    params,
    {
      flownOn: { expr: flights.flownOn, type: "date", notNull: true },
      jobTitle: { expr: jobs.title, type: "text", notNull: true },
      siteName: { expr: sites.name, type: "text", notNull: true },
      pilotName: { expr: pilot.name, type: "text" },
      aircraft: { expr: flights.aircraft, type: "text" },
      maxAltitudeAglM: { expr: flights.maxAltitudeAglM, type: "double precision" },
      createdAt: { expr: flights.createdAt, type: "timestamptz", notNull: true },
    },
    DEFAULT_KEYS,
    flights.id,
  );
  const page = keysetPage(params);
  const [rows, counted] = await Promise.all([
    db()
      .select({ ...columns, ...related, ...keysetColumns(keys) })
      .from(flights)
      .innerJoin(jobs, eq(jobs.id, flights.jobId))
      .innerJoin(sites, eq(sites.id, jobs.siteId))
      .innerJoin(clients, eq(clients.id, sites.clientId))
      .leftJoin(pilot, eq(pilot.id, flights.pilotId))
      .where(and(where, afterCursor(params.cursor, ordering, keys)))
      .orderBy(...keysetOrder(keys))
      .limit(page.limit)
      .offset(page.offset),
    countUpTo(
      db()
        .select({ one: sql`1` })
        .from(flights)
        .innerJoin(jobs, eq(jobs.id, flights.jobId))
        .innerJoin(sites, eq(sites.id, jobs.siteId))
        .innerJoin(clients, eq(clients.id, sites.clientId))
        .leftJoin(pilot, eq(pilot.id, flights.pilotId))
        .where(where)
        .$dynamic(),
    ),
  ]);
  return { ...pageOfRows(rows, params.pageSize, ordering, keys), ...counted };
}

export async function getFlightOrThrow(orgId: string, id: string) {
  const [row] = await joined().where(and(eq(flights.id, id), eq(flights.organisationId, orgId)));
  if (!row) throw notFound("Flight not found");
  return row;
}
export type FlightDetail = Awaited<ReturnType<typeof getFlightOrThrow>>;

async function checkReferences(tx: DbOrTx, orgId: string, input: Partial<Pick<FlightInput, "jobId" | "pilotId">>) {
  if (input.jobId) await requireJobIn(tx, orgId, input.jobId);
  if (input.pilotId) await requireCrewIn(tx, orgId, input.pilotId, "pilot", "pilotId");
}

/** A pilot logging their own flight need not pick themselves as pilot in command. */
export async function createFlight(member: Pick<Member, "organisationId" | "userId" | "role">, input: FlightInput) {
  const orgId = member.organisationId;
  const values = { ...input, pilotId: input.pilotId ?? (member.role === "pilot" ? member.userId : null) };
  return db().transaction(async (tx) => {
    await checkReferences(tx, orgId, values);
    const [row] = await tx.insert(flights).values({ ...values, organisationId: orgId }).returning(columns);
    return row;
  });
}

export async function updateFlight(orgId: string, id: string, input: FlightPatch) {
  const { archived, ...rest } = input;
  return db().transaction(async (tx) => {
    const [current] = await tx
      .select({ launchLatitude: flights.launchLatitude, launchLongitude: flights.launchLongitude })
      .from(flights)
      .where(and(eq(flights.id, id), eq(flights.organisationId, orgId)))
      .for("update");
    if (!current) throw notFound("Flight not found");
    await checkReferences(tx, orgId, rest);
    const issue = coordinatePairIssue(
      rest.launchLatitude !== undefined ? rest.launchLatitude : current.launchLatitude,
      rest.launchLongitude !== undefined ? rest.launchLongitude : current.launchLongitude,
      FLIGHT_LAUNCH_PAIR,
    );
    if (issue) throw new ApiError("unprocessable", issue.message, { [issue.field]: [issue.message] });
    const [row] = await tx
      .update(flights)
      .set({ ...rest, ...(archived === undefined ? {} : { archivedAt: archived ? sql`coalesce(${flights.archivedAt}, now())` : null }), updatedAt: new Date() })
      .where(and(eq(flights.id, id), eq(flights.organisationId, orgId)))
      .returning(columns);
    return row;
  });
}
