// Flights of the organisation: list, read, create, update, archive. A flight is one sortie flown for a job.
import { and, asc, desc, eq, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, type DbOrTx } from "@/db/client";
import { clients, flights, jobs, sites, users } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { listOrder, listWhere, pageOf, totalCount } from "@/lib/api/list";
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
    .select({ ...columns, ...related, total: totalCount })
    .from(flights)
    .innerJoin(jobs, eq(jobs.id, flights.jobId))
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .innerJoin(clients, eq(clients.id, sites.clientId))
    .leftJoin(pilot, eq(pilot.id, flights.pilotId));

/** `scope`: a further condition, e.g. a client account's clients (lib/auth/client-scope.ts). */
export async function listFlights(orgId: string, params: FlightListQuery, scope?: SQL) {
  const rows = await joined()
    .where(
      listWhere({
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
      }),
    )
    .orderBy(
      ...listOrder(
        params,
        { flownOn: flights.flownOn, jobTitle: jobs.title, siteName: sites.name, pilotName: pilot.name, aircraft: flights.aircraft, maxAltitudeAglM: flights.maxAltitudeAglM, createdAt: flights.createdAt },
        desc(flights.flownOn),
      ),
      desc(flights.createdAt),
      asc(flights.id),
    )
    .limit(pageOf(params).limit)
    .offset(pageOf(params).offset);
  return { items: rows.map(({ total: _t, ...r }) => r), total: rows[0]?.total ?? 0 };
}

export async function getFlightOrThrow(orgId: string, id: string) {
  const [row] = await joined().where(and(eq(flights.id, id), eq(flights.organisationId, orgId)));
  if (!row) throw notFound("Flight not found");
  const { total: _t, ...flight } = row;
  return flight;
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
