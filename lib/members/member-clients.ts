// Which of the organisation's clients a client account is tied to (membership_clients): set when an
// owner invites the account, and changed by an owner on the members page. The crew is never tied:
// it sees the whole organisation.
import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { clients, membershipClients, memberships } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { lockMembership } from "./members";

/** The given client ids, each checked to be one of the organisation's clients (422 on clientIds otherwise). */
export async function clientsOfOrganisation(tx: DbOrTx, orgId: string, clientIds: string[]): Promise<string[]> {
  const ids = [...new Set(clientIds.map((c) => c.toLowerCase()))];
  if (!ids.length) return [];
  const found = await tx.select({ id: clients.id }).from(clients).where(and(eq(clients.organisationId, orgId), inArray(clients.id, ids)));
  if (found.length !== ids.length) throw new ApiError("unprocessable", "Some of those clients are not in this organisation", { clientIds: ["Unknown client"] });
  return ids;
}

/** Replaces the client ties of a client account. */
export async function setMemberClients(orgId: string, userId: string, clientIds: string[]) {
  return db().transaction(async (tx) => {
    const m = await lockMembership(tx, orgId, userId);
    if (m.role !== "client") throw new ApiError("conflict", "Only client accounts are tied to clients; the crew sees the whole organisation.");
    const ids = await clientsOfOrganisation(tx, orgId, clientIds);
    await tx.delete(membershipClients).where(eq(membershipClients.membershipId, m.id));
    if (ids.length) await tx.insert(membershipClients).values(ids.map((clientId) => ({ membershipId: m.id, clientId, organisationId: orgId })));
    return { userId, clientIds: ids };
  });
}

/** The client ties of every client account of the organisation, by user id. */
export async function memberClientsOf(orgId: string): Promise<Record<string, string[]>> {
  const rows = await db()
    .select({ userId: memberships.userId, clientId: membershipClients.clientId })
    .from(membershipClients)
    .innerJoin(memberships, eq(memberships.id, membershipClients.membershipId))
    .where(eq(membershipClients.organisationId, orgId));
  const out: Record<string, string[]> = {};
  for (const r of rows) (out[r.userId] ??= []).push(r.clientId);
  return out;
}

/** Ties a new client account to the clients its invitation named (those still in the organisation). */
export async function tieInvitedClients(tx: DbOrTx, orgId: string, membershipId: string, clientIds: string[]): Promise<void> {
  if (!clientIds.length) return;
  const still = await tx.select({ id: clients.id }).from(clients).where(and(eq(clients.organisationId, orgId), inArray(clients.id, clientIds)));
  if (still.length) await tx.insert(membershipClients).values(still.map((c) => ({ membershipId, clientId: c.id, organisationId: orgId }))).onConflictDoNothing();
}
