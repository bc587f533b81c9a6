// Builds requests as a given user would send them: a real next-auth session JWT in the cookie,
// signed with the app's secret, so route handlers run their full authorization path.
import { encode } from "next-auth/jwt";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { memberships, organisations, users } from "@/db/schema";
import { env } from "@/lib/config/env";
import { startSession } from "@/lib/auth/user-sessions";
import { DEMO_USERS, OTHER_USER } from "@/db/seed/demo-scenario";

export type Actor = { userId: string; organisationId: string } | null;

/** A fresh session (its own user_sessions row, as a sign-in opens) unless `sessionId` names one. */
export async function sessionCookie(actor: NonNullable<Actor>, sessionId?: string): Promise<string> {
  const sid = sessionId ?? (await startSession(actor.userId));
  const token = await encode({ token: { uid: actor.userId, org: actor.organisationId, sub: actor.userId, sid }, secret: env().NEXTAUTH_SECRET });
  return `next-auth.session-token=${token}`;
}

export async function actorByEmail(email: string): Promise<NonNullable<Actor>> {
  const [row] = await db()
    .select({ userId: users.id, organisationId: memberships.organisationId })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .where(eq(users.email, email));
  if (!row) throw new Error(`no such test user ${email}`);
  return row;
}

export type DemoActorKey = (typeof DEMO_USERS)[number]["key"] | "other" | "anonymous";

export async function demoActors(): Promise<Record<DemoActorKey, Actor>> {
  const out = { anonymous: null } as Record<DemoActorKey, Actor>;
  for (const u of DEMO_USERS) out[u.key] = await actorByEmail(u.email);
  out.other = await actorByEmail(OTHER_USER.email);
  return out;
}

export async function demoOrganisationId(): Promise<string> {
  const [o] = await db().select({ id: organisations.id }).from(organisations).where(eq(organisations.slug, "kestrelmoor"));
  return o.id;
}

/**
 * A Request as the actor would send it from the app's own pages (JSON body when given). A
 * state-changing method carries the app's Origin as a browser would send it; pass `origin` in
 * `headers` to send another one, or `origin: ""` to send none.
 */
export async function req(actor: Actor, method: string, url: string, body?: unknown, headers: Record<string, string> = {}): Promise<Request> {
  const h: Record<string, string> = {};
  if (["POST", "PUT", "PATCH", "DELETE"].includes(method.toUpperCase())) h.origin = new URL(env().APP_URL).origin;
  for (const [k, v] of Object.entries(headers)) {
    if (k.toLowerCase() === "origin") delete h.origin;
    if (v !== "" || k.toLowerCase() !== "origin") h[k] = v;
  }
  if (actor) h.cookie = await sessionCookie(actor);
  if (body !== undefined) h["content-type"] = "application/json";
  return new Request(new URL(url, "http://localhost"), {
    method,
    headers: h,
    body: body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body),
  });
}

/** The second argument Next passes to a route handler. */
export const route = <P extends Record<string, string | string[]>>(params: P) => ({ params: Promise.resolve(params) });

export async function membershipRole(userId: string, organisationId: string) {
  const [m] = await db().select().from(memberships).where(and(eq(memberships.userId, userId), eq(memberships.organisationId, organisationId)));
  return m?.role;
}
