// Members of the organisation: list, change role, remove. An organisation always keeps at least one
// owner: the last owner can be neither demoted nor removed (409).
import "server-only";
import { and, asc, eq, ilike, inArray, or, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { jobs, memberships, users } from "@/db/schema";
import type { Role } from "@/db/schema/types";
import { ApiError, notFound } from "@/lib/api/errors";
import { pageOf, totalCount, type ListParams } from "@/lib/api/list";
import { endSessionsOf } from "@/lib/auth/user-sessions";

// owners first, then the crew who fly and review, then client accounts
const ROLE_ORDER = sql`array_position(array['owner','pilot','reviewer','client']::member_role[], ${memberships.role})`;

export async function listMembers(orgId: string, params: ListParams & { roles?: Role[] }, opts: { withEmail: boolean }) {
  const q = params.q?.trim();
  const pattern = q ? `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : undefined;
  const rows = await db()
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      joinedAt: memberships.createdAt,
      total: totalCount,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(
      and(
        eq(memberships.organisationId, orgId),
        params.roles?.length ? inArray(memberships.role, params.roles) : undefined,
        pattern ? or(ilike(users.name, pattern), ilike(users.email, pattern)) : undefined,
      ),
    )
    .orderBy(ROLE_ORDER, asc(users.name), asc(users.id))
    .limit(pageOf(params).limit)
    .offset(pageOf(params).offset);
  // e-mail addresses of the crew are for those who manage it
  return { items: rows.map(({ total: _t, email, ...r }) => (opts.withEmail ? { ...r, email } : r)), total: rows[0]?.total ?? 0 };
}

/** Locks the organisation's owner rows so two concurrent demotions cannot both pass the check. */
async function ownerCount(tx: DbOrTx, orgId: string): Promise<number> {
  const rows = await tx
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(eq(memberships.organisationId, orgId), eq(memberships.role, "owner")))
    .for("update");
  return rows.length;
}

/** The membership row of a person in an organisation, locked for the rest of the transaction (404 when none). */
export async function lockMembership(tx: DbOrTx, orgId: string, userId: string) {
  const [m] = await tx
    .select({ id: memberships.id, role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.organisationId, orgId), eq(memberships.userId, userId)))
    .for("update");
  if (!m) throw notFound("Member not found");
  return m;
}

export async function changeMemberRole(orgId: string, userId: string, role: Role) {
  return db().transaction(async (tx) => {
    const owners = await ownerCount(tx, orgId);
    const m = await lockMembership(tx, orgId, userId);
    if (m.role === "owner" && role !== "owner" && owners <= 1) {
      throw new ApiError("conflict", "This is the organisation's last owner. Make someone else an owner first.");
    }
    const [row] = await tx
      .update(memberships)
      .set({ role, updatedAt: new Date() })
      .where(eq(memberships.id, m.id))
      .returning({ userId: memberships.userId, role: memberships.role });
    // the person's open sessions end: the next request signs in again and meets the new role
    if (m.role !== role) await endSessionsOf(userId, tx);
    return row;
  });
}

export async function removeMember(orgId: string, userId: string) {
  return db().transaction(async (tx) => {
    const owners = await ownerCount(tx, orgId);
    const m = await lockMembership(tx, orgId, userId);
    if (m.role === "owner" && owners <= 1) {
      throw new ApiError("conflict", "This is the organisation's last owner and cannot be removed.");
    }
    await tx.delete(memberships).where(eq(memberships.id, m.id));
    await endSessionsOf(userId, tx);
    // open assignments go back to the owners to fill; flights keep who actually flew them
    await tx.update(jobs).set({ pilotId: null, updatedAt: new Date() }).where(and(eq(jobs.organisationId, orgId), eq(jobs.pilotId, userId)));
    await tx.update(jobs).set({ reviewerId: null, updatedAt: new Date() }).where(and(eq(jobs.organisationId, orgId), eq(jobs.reviewerId, userId)));
    return { userId, removed: true };
  });
}
