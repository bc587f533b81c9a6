// Who is asking, in which organisation, with which role: read from the database on every request,
// together with the server-side session row (an ended session gives no member) and, for a client
// account, the organisation's clients whose work it may see.
import "server-only";
import { and, eq, isNull, sql } from "drizzle-orm";
import { prepared } from "@/db/client";
import { membershipClients, memberships, organisations, userSessions, users } from "@/db/schema";
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
  /** the user_sessions row of this request's session */
  sessionId: string;
  /**
   * The clients whose work this member may see: null for the crew (everything in the organisation),
   * a list (possibly empty) for a client account.
   */
  clientIds: string[] | null;
};

/** Null when the session was ended on the server (sign-out, password or role change, removal) or the membership is gone. */
export async function loadMember(claims: SessionClaims): Promise<Member | null> {
  if (!claims.organisationId || !claims.sessionId) return null;
  // every request asks this, so it is built once (db/client.ts, prepared)
  const [row] = await prepared("load-member", (d) =>
    d
      .select({
        membershipId: memberships.id,
        userId: users.id,
        email: users.email,
        name: users.name,
        organisationId: organisations.id,
        organisationName: organisations.name,
        role: memberships.role,
        preferredUnits: users.preferredUnits,
        sessionId: userSessions.id,
      })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
      .innerJoin(userSessions, and(eq(userSessions.id, sql.placeholder("sessionId")), eq(userSessions.userId, users.id), isNull(userSessions.endedAt)))
      .where(and(eq(memberships.userId, sql.placeholder("userId")), eq(memberships.organisationId, sql.placeholder("organisationId"))))
      .prepare("load_member"),
  ).execute({ sessionId: claims.sessionId, userId: claims.userId, organisationId: claims.organisationId });
  if (!row) return null;
  const { membershipId, ...member } = row;
  if (member.role !== "client") return { ...member, clientIds: null };
  const tied = await prepared("load-member-clients", (d) =>
    d
      .select({ clientId: membershipClients.clientId })
      .from(membershipClients)
      .where(and(eq(membershipClients.membershipId, sql.placeholder("membershipId")), eq(membershipClients.organisationId, sql.placeholder("organisationId"))))
      .prepare("load_member_clients"),
  ).execute({ membershipId, organisationId: member.organisationId });
  return { ...member, clientIds: tied.map((t) => t.clientId) };
}
