// Invitations of the organisation: list the pending ones, revoke one, and read what a link offers.
import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { invitations, organisations, users } from "@/db/schema";
import { ApiError, notFound } from "@/lib/api/errors";
import { INVITATION_TOKEN_PATTERN } from "@/lib/validation/members";
import { hashInvitationToken } from "./invitation-token";

export type InvitationState = "pending" | "expired" | "accepted" | "revoked";

export function invitationState(row: { acceptedAt: Date | null; revoked: boolean; expiresAt: Date }, now = new Date()): InvitationState {
  if (row.acceptedAt) return "accepted";
  if (row.revoked) return "revoked";
  return row.expiresAt.getTime() <= now.getTime() ? "expired" : "pending";
}

/** Invitations not yet accepted or revoked, newest first; expired ones stay listed so an owner can send a new one. */
export async function listInvitations(orgId: string) {
  const rows = await db()
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      invitedByName: users.name,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revoked: invitations.revoked,
      createdAt: invitations.createdAt,
    })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(and(eq(invitations.organisationId, orgId), isNull(invitations.acceptedAt), eq(invitations.revoked, false)))
    .orderBy(desc(invitations.createdAt));
  const items = rows.map(({ acceptedAt: _a, revoked: _r, ...r }) => ({ ...r, state: invitationState({ acceptedAt: null, revoked: false, expiresAt: r.expiresAt }) }));
  return { items, total: items.length };
}

export async function revokeInvitation(orgId: string, id: string) {
  return db().transaction(async (tx) => {
    const [row] = await tx
      .select({ acceptedAt: invitations.acceptedAt, revoked: invitations.revoked, expiresAt: invitations.expiresAt })
      .from(invitations)
      .where(and(eq(invitations.id, id), eq(invitations.organisationId, orgId)))
      .for("update");
    if (!row) throw notFound("Invitation not found");
    if (row.acceptedAt) throw new ApiError("conflict", "This invitation was already accepted; remove the member instead.");
    await tx.update(invitations).set({ revoked: true, updatedAt: new Date() }).where(eq(invitations.id, id));
    return { id, revoked: true };
  });
}

/** What an invitation link offers, for the accept page. A malformed or unknown token is simply "unknown". */
export async function describeInvitation(token: string) {
  if (!INVITATION_TOKEN_PATTERN.test(token)) return { state: "unknown" as const };
  const [row] = await db()
    .select({
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revoked: invitations.revoked,
      organisationName: organisations.name,
    })
    .from(invitations)
    .innerJoin(organisations, eq(organisations.id, invitations.organisationId))
    .where(eq(invitations.tokenHash, hashInvitationToken(token)));
  if (!row) return { state: "unknown" as const };
  const [account] = await db().select({ id: users.id }).from(users).where(eq(users.email, row.email));
  return {
    state: invitationState(row),
    email: row.email,
    role: row.role,
    organisationName: row.organisationName,
    expiresAt: row.expiresAt,
    hasAccount: Boolean(account),
  };
}
