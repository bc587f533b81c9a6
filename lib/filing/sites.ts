// Sites of the organisation: list, read, create, update, archive.
import "server-only";
import { and, count, eq, isNull, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { assetKindEnum, clients, jobs, sites } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { keysetOf, keysetPage, listWhere } from "@/lib/api/list";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, countUpTo } from "@/lib/api/keyset";
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
  const where = listWhere({
    orgFilter: eq(sites.organisationId, orgId),
    params,
    searchColumns: [sites.name, sites.address, clients.name],
    archivedColumn: sites.archivedAt,
    extra: [scope, params.clientId ? eq(sites.clientId, params.clientId) : undefined, params.assetKind ? eq(sites.assetKind, params.assetKind) : undefined],
  });
  const { ordering, keys } = keysetOf(
    params,
    {
      name: { expr: sites.name, type: "text", notNull: true },
      clientName: { expr: clients.name, type: "text", notNull: true },
      assetKind: { expr: sites.assetKind, type: assetKindEnum, notNull: true },
      timeZone: { expr: sites.timeZone, type: "text", notNull: true },
      createdAt: { expr: sites.createdAt, type: "timestamptz", notNull: true },
    },
    // by name (sites_org_name_idx)
    [
      { expr: sites.name, dir: "asc", type: "text", notNull: true },
      { expr: sites.id, dir: "asc", type: "uuid", notNull: true },
    ],
    sites.id,
  );
  const page = keysetPage(params);
  const [rows, counted] = await Promise.all([
    db()
      .select({
        ...columns,
        clientName: clients.name,
        jobCount: db().$count(jobs, and(eq(jobs.siteId, sites.id), eq(jobs.organisationId, orgId), isNull(jobs.archivedAt))),
        ...keysetColumns(keys),
      })
      .from(sites)
      .innerJoin(clients, eq(clients.id, sites.clientId))
      .where(and(where, afterCursor(params.cursor, ordering, keys)))
      .orderBy(...keysetOrder(keys))
      .limit(page.limit)
      .offset(page.offset),
    countUpTo(db().select({ one: sql`1` }).from(sites).innerJoin(clients, eq(clients.id, sites.clientId)).where(where).$dynamic()),
  ]);
  return { ...pageOfRows(rows, params.pageSize, ordering, keys), ...counted };
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
