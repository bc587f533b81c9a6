// Sessions end on the server: every request checks the token's user_sessions row, so sign-out, a
// password change, a role change and removal from the organisation refuse the old cookie at the next
// request (API 401, media 401). next-auth's own sign-out event is called as next-auth calls it.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as jobsApi from "@/app/api/jobs/route";
import * as memberApi from "@/app/api/members/[userId]/route";
import * as passwordApi from "@/app/api/users/me/password/route";
import { closeDb, db } from "@/db/client";
import { userSessions, users } from "@/db/schema";
import { authOptions } from "@/lib/auth/auth-options";
import { hashPassword } from "@/lib/auth/password";
import { startSession } from "@/lib/auth/user-sessions";
import { closeRedis } from "@/lib/queue/redis";
import { demoActors, demoOrganisationId, req, route, sessionCookie, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeMember } from "@/tests/support/factories";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

/** A GET of the jobs list with exactly this cookie. */
const jobsWith = (cookie: string) => jobsApi.GET(new Request("http://localhost/api/jobs", { headers: { cookie } }));

describe("sessions that end", () => {
  it("a token without a session id (as issued before sessions were recorded) is refused", async () => {
    const { encode } = await import("next-auth/jwt");
    const { env } = await import("@/lib/config/env");
    const a = actors.pilot!;
    const token = await encode({ token: { uid: a.userId, org: a.organisationId, sub: a.userId }, secret: env().NEXTAUTH_SECRET });
    expect((await jobsWith(`next-auth.session-token=${token}`)).status).toBe(401);
  });

  it("sign-in opens a session row; next-auth's signOut event ends it; the old cookie then gets 401", async () => {
    const m = await makeMember(orgId, "pilot");
    // next-auth calls the jwt callback with `user` at sign-in
    const jwt = authOptions.callbacks!.jwt! as unknown as (a: { token: Record<string, unknown>; user?: unknown }) => Promise<Record<string, unknown>>;
    const token = await jwt({ token: { sub: m.userId }, user: { id: m.userId, email: m.email, name: m.name } });
    expect(typeof token.sid).toBe("string");
    const cookie = await sessionCookie({ userId: m.userId, organisationId: orgId }, token.sid as string);
    expect((await jobsWith(cookie)).status).toBe(200);
    const other = await sessionCookie({ userId: m.userId, organisationId: orgId }); // the same person on another device
    await authOptions.events!.signOut!({ token: token as never, session: undefined as never });
    const after = await jobsWith(cookie);
    expect(after.status).toBe(401);
    expect((await after.json()).error.code).toBe("unauthenticated");
    // signing out here leaves the person's other device signed in
    expect((await jobsWith(other)).status).toBe(200);
  });

  it("a role change ends the person's sessions; the owner's own session stays", async () => {
    const m = await makeMember(orgId, "reviewer");
    const cookie = await sessionCookie({ userId: m.userId, organisationId: orgId });
    expect((await jobsWith(cookie)).status).toBe(200);
    const res = await memberApi.PATCH(await req(actors.owner, "PATCH", "/x", { role: "pilot" }), route({ userId: m.userId }));
    expect(res.status).toBe(200);
    expect((await jobsWith(cookie)).status).toBe(401);
    expect((await jobsWith(await sessionCookie(actors.owner!))).status).toBe(200);
  });

  it("the same role sent again ends nothing", async () => {
    const m = await makeMember(orgId, "reviewer");
    const cookie = await sessionCookie({ userId: m.userId, organisationId: orgId });
    expect((await memberApi.PATCH(await req(actors.owner, "PATCH", "/x", { role: "reviewer" }), route({ userId: m.userId }))).status).toBe(200);
    expect((await jobsWith(cookie)).status).toBe(200);
  });

  it("removal from the organisation ends the person's sessions", async () => {
    const m = await makeMember(orgId, "pilot");
    const cookie = await sessionCookie({ userId: m.userId, organisationId: orgId });
    expect((await memberApi.DELETE(await req(actors.owner, "DELETE", "/x"), route({ userId: m.userId }))).status).toBe(200);
    expect((await jobsWith(cookie)).status).toBe(401);
    const open = await db().select().from(userSessions).where(eq(userSessions.userId, m.userId));
    expect(open.every((s) => s.endedAt !== null)).toBe(true);
  });

  it("a password change ends every other session of the person, keeps the one that made it, and needs the current password", async () => {
    const m = await makeMember(orgId, "reviewer", { passwordHash: await hashPassword("the first long password") });
    const actor = { userId: m.userId, organisationId: orgId };
    const stolen = await sessionCookie(actor);
    const mine = await startSession(m.userId);
    const cookie = await sessionCookie(actor, mine);
    const post = (body: unknown) =>
      passwordApi.POST(new Request("http://localhost/api/users/me/password", { method: "POST", headers: { cookie, "content-type": "application/json", origin: new URL(process.env.APP_URL!).origin }, body: JSON.stringify(body) }));
    const wrong = await post({ currentPassword: "not the password", newPassword: "the second long password" });
    expect(wrong.status).toBe(422);
    expect((await jobsWith(stolen)).status).toBe(200);
    const short = await post({ currentPassword: "the first long password", newPassword: "short" });
    expect(short.status).toBe(422);
    expect((await short.json()).error.fields.newPassword).toBeDefined();
    const res = await post({ currentPassword: "the first long password", newPassword: "the second long password" });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ endedSessions: 1 });
    expect((await jobsWith(stolen)).status).toBe(401);
    expect((await jobsWith(cookie)).status).toBe(200);
    const [u] = await db().select({ h: users.passwordHash }).from(users).where(eq(users.id, m.userId));
    const { verifyPassword } = await import("@/lib/auth/password");
    expect(await verifyPassword("the second long password", u.h)).toBe(true);
  });
});
