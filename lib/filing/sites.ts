// Sites of the organisation: list, read, create, update, archive.
import { and, asc, eq, isNull, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, jobs, sites } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { listOrder, listWhere, pageOf, totalCount } from "@/lib/api/list";
import { coordinatePairIssue, type SiteInput, type SitePatch } from "@/lib/validation/work";
import type { SiteListQuery } from "@/lib/validation/list-filters";
import { requireClientIn } from "./require-in-organisation";

const columns = {
  id: sites.id,
  clientId: sites.clientId,
  name: sites.name,
  address: sites.address,
  latitude: sites.latitude,
  longitude: sites.longitude,
  timeZone: sites.timeZone,
  assetKind: sites.assetKind,
  launchNotes: sites.launchNotes,
  archivedAt: sites.archivedAt,
  createdAt: sites.createdAt,
  updatedAt: sites.updatedAt,
};

/** `scope`: a further condition, e.g. a client account's clients (lib/auth/client-scope.ts). */
export async function listSites(orgId: string, params: SiteListQuery, scope?: SQL) {
  const rows = await db()
    .select({
      ...columns,
      clientName: clients.name,
      jobCount: db().$count(jobs, and(eq(jobs.siteId, sites.id), eq(jobs.organisationId, orgId), isNull(jobs.archivedAt))),
      total: totalCount,
    })
    .from(sites)
    .innerJoin(clients, eq(clients.id, sites.clientId))
    .where(
      listWhere({
        orgFilter: eq(sites.organisationId, orgId),
        params,
        searchColumns: [sites.name, sites.address, clients.name],
        archivedColumn: sites.archivedAt,
        extra: [scope, params.clientId ? eq(sites.clientId, params.clientId) : undefined, params.assetKind ? eq(sites.assetKind, params.assetKind) : undefined],
      }),
    )
    .orderBy(
      ...listOrder(params, { name: sites.name, clientName: clients.name, assetKind: sites.assetKind, timeZone: sites.timeZone, createdAt: sites.createdAt }, asc(sites.name)),
      asc(sites.id),
    )
    .limit(pageOf(params).limit)
    .offset(pageOf(params).offset);
  return { items: rows.map(({ total: _t, ...r }) => r), total: rows[0]?.total ?? 0 };
}

export async function getSiteOrThrow(orgId: string, id: string) {
  const [row] = await db()
    .select({ ...columns, clientName: clients.name })
    .from(sites)
    .innerJoin(clients, eq(clients.id, sites.clientId))
    .where(and(eq(sites.id, id), eq(sites.organisationId, orgId)));
  if (!row) throw notFound("Site not found");
  return row;
}

export async function createSite(orgId: string, input: SiteInput) {
  return db().transaction(async (tx) => {
    await requireClientIn(tx, orgId, input.clientId);
    const [row] = await tx.insert(sites).values({ ...input, organisationId: orgId }).returning(columns);
    return row;
  });
}

export async function updateSite(orgId: string, id: string, input: SitePatch) {
  const { archived, ...rest } = input;
  return db().transaction(async (tx) => {
    const [current] = await tx
      .select({ latitude: sites.latitude, longitude: sites.longitude })
      .from(sites)
      .where(and(eq(sites.id, id), eq(sites.organisationId, orgId)))
      .for("update");
    if (!current) throw notFound("Site not found");
    if (rest.clientId) await requireClientIn(tx, orgId, rest.clientId);
    // the pair rule holds for the row as it will be, not only for the fields sent
    const issue = coordinatePairIssue(
      rest.latitude !== undefined ? rest.latitude : current.latitude,
      rest.longitude !== undefined ? rest.longitude : current.longitude,
      ["latitude", "longitude"],
    );
    if (issue) throw new ApiError("unprocessable", issue.message, { [issue.field]: [issue.message] });
    const [row] = await tx
      .update(sites)
      .set({ ...rest, ...(archived === undefined ? {} : { archivedAt: archived ? sql`coalesce(${sites.archivedAt}, now())` : null }), updatedAt: new Date() })
      .where(and(eq(sites.id, id), eq(sites.organisationId, orgId)))
      .returning(columns);
    return row;
  });
}
