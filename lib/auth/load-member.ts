// Who is asking, in which organisation, with which role: read from the database on every request.
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { memberships, organisations, users } from "@/db/schema";
import type { Role } from "@/db/schema/types";
import type { SessionClaims } from "./read-session";

export type Member = {
  userId: string;
  email: string;
  name: string;
  organisationId: string;
  organisationName: string;
  role: Role;
  preferredUnits: "ft" | "m";
};

export async function loadMember(claims: SessionClaims): Promise<Member | null> {
  if (!claims.organisationId) return null;
  const [row] = await db()
    .select({
      userId: users.id,
      email: users.email,
      name: users.name,
      organisationId: organisations.id,
      organisationName: organisations.name,
      role: memberships.role,
      preferredUnits: users.preferredUnits,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(and(eq(memberships.userId, claims.userId), eq(memberships.organisationId, claims.organisationId)));
  return row ?? null;
}
