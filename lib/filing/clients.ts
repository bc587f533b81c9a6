// Clients of the organisation: list, read, create, update, archive.
import { and, asc, eq, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { clients, sites } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { listOrder, listWhere, pageOf, totalCount, type ListParams } from "@/lib/api/list";
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
  const rows = await db()
    .select({ ...columns, siteCount: db().$count(sites, and(eq(sites.clientId, clients.id), eq(sites.organisationId, orgId))), total: totalCount })
    .from(clients)
    .where(listWhere({ orgFilter: eq(clients.organisationId, orgId), params, searchColumns: [clients.name, clients.contactName, clients.contactEmail], archivedColumn: clients.archivedAt, extra: [scope] }))
    .orderBy(...listOrder(params, { name: clients.name, contactName: clients.contactName, createdAt: clients.createdAt }, asc(clients.name)))
    .limit(pageOf(params).limit)
    .offset(pageOf(params).offset);
  return { items: rows.map(({ total: _t, ...r }) => r), total: rows[0]?.total ?? 0 };
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
