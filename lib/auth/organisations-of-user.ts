// The organisations a person belongs to, for the switcher in the user menu, and the check made
// before the session's active organisation changes: only to one the person is a member of now.
import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { memberships, organisations } from "@/db/schema";
import type { Role } from "@/db/schema/types";

export type OrganisationChoice = { id: string; name: string; role: Role };

export async function organisationsOfUser(userId: string): Promise<OrganisationChoice[]> {
  return db()
    .select({ id: organisations.id, name: organisations.name, role: memberships.role })
    .from(memberships)
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(organisations.name), asc(organisations.id));
}

export async function isMemberOf(userId: string, organisationId: string): Promise<boolean> {
  const [row] = await db()
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.organisationId, organisationId)));
  return Boolean(row);
}
