// Clients of the organisation: list, read, create, update, archive.
import "server-only";
import { and, count, eq, type SQL, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, sites } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { keysetOf, keysetPage, listWhere, type ListParams } from "@/lib/api/list";
import { afterCursor, keysetColumns, keysetOrder, pageOfRows, countUpTo } from "@/lib/api/keyset";
import type { ClientInput } from "@/lib/validation/work";

const columns = {
  id: clients.id,
  name: clients.name,
  contactName: clients.contactName,
  contactEmail: clients.contactEmail,
  notes: clients.notes,
  archivedAt: clients.archivedAt,
  createdAt: clients.createdAt,
  updatedAt: clients.updatedAt,
};

/** `scope`: a further condition, e.g. a client account's clients (lib/auth/client-scope.ts). */
export async function listClients(orgId: string, params: ListParams, scope?: SQL) {
  const where = listWhere({ orgFilter: eq(clients.organisationId, orgId), params, searchColumns: [clients.name, clients.contactName, clients.contactEmail], archivedColumn: clients.archivedAt, extra: [scope] });
  const { ordering, keys } = keysetOf(
    params,
    { name: { expr: clients.name, type: "text", notNull: true }, contactName: { expr: clients.contactName, type: "text" }, createdAt: { expr: clients.createdAt, type: "timestamptz", notNull: true } },
    // by name (clients_org_name_idx)
    [
      { expr: clients.name, dir: "asc", type: "text", notNull: true },
      { expr: clients.id, dir: "asc", type: "uuid", notNull: true },
    ],
    clients.id,
  );
  const page = keysetPage(params);
  const [rows, counted] = await Promise.all([
    db()
      .select({ ...columns, siteCount: db().$count(sites, and(eq(sites.clientId, clients.id), eq(sites.organisationId, orgId))), ...keysetColumns(keys) })
      .from(clients)
      .where(and(where, afterCursor(params.cursor, ordering, keys)))
      .orderBy(...keysetOrder(keys))
      .limit(page.limit)
      .offset(page.offset),
    countUpTo(db().select({ one: sql`1` }).from(clients).where(where).$dynamic()),
  ]);
  return { ...pageOfRows(rows, params.pageSize, ordering, keys), ...counted };
}

export async function getClientOrThrow(orgId: string, id: string) {
  const [row] = await db().select(columns).from(clients).where(and(eq(clients.id, id), eq(clients.organisationId, orgId)));
  if (!row) throw notFound("Client not found");
  return row;
}

export async function createClient(orgId: string, input: ClientInput) {
  const [row] = await db().insert(clients).values({ ...input, organisationId: orgId }).returning(columns);
  return row;
}

export async function updateClient(orgId: string, id: string, input: Partial<ClientInput> & { archived?: boolean }) {
  const { archived, ...rest } = input;
  const [row] = await db()
    .update(clients)
    .set({ ...rest, ...(archived === undefined ? {} : { archivedAt: archived ? new Date() : null }), updatedAt: new Date() })
    .where(and(eq(clients.id, id), eq(clients.organisationId, orgId)))
    .returning(columns);
  if (!row) throw notFound("Client not found");
  return row;
}
