// The organisation switcher's server side: next-auth's jwt callback with trigger "update" (what
// useSession().update({ organisationId }) calls) moves the session to an organisation only if the
// person is a member of it now. The session token is then read back as every request reads it.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import type { JWT } from "next-auth/jwt";
import { closeDb, db } from "@/db/client";
import { memberships } from "@/db/schema";
import { authOptions } from "@/lib/auth/auth-options";
import { loadMember } from "@/lib/auth/load-member";
import { organisationsOfUser } from "@/lib/auth/organisations-of-user";
import { startSession } from "@/lib/auth/user-sessions";
import { demoActors, type Actor, type DemoActorKey } from "@/tests/support/session";

let actors: Record<DemoActorKey, Actor>;
let home: string;
let second: string;
let pilotId: string;

beforeAll(async () => {
  actors = await demoActors();
  pilotId = actors.pilot!.userId;
  home = actors.pilot!.organisationId;
  second = actors.other!.organisationId;
  // the pilot also flies for the second organisation, as a reviewer there
  await db().insert(memberships).values({ organisationId: second, userId: pilotId, role: "reviewer" }).onConflictDoNothing();
});
afterAll(async () => {
  await db().delete(memberships).where(and(eq(memberships.userId, pilotId), eq(memberships.organisationId, second)));
  await closeDb();
});

const jwt = authOptions.callbacks!.jwt!;
const tokenFor = (org: string): JWT => ({ uid: pilotId, org });
type JwtArgs = Parameters<typeof jwt>[0];
const update = (token: JWT, session: unknown) => jwt({ token, trigger: "update", session } as unknown as JwtArgs) as Promise<JWT>;

describe("switching the active organisation", () => {
  it("lists every organisation of the person, with the role in each", async () => {
    const list = await organisationsOfUser(pilotId);
    expect(list.map((o) => [o.id, o.role]).sort()).toEqual(
      [
        [home, "pilot"],
        [second, "reviewer"],
      ].sort(),
    );
  });

  it("moves the session to an organisation the person belongs to; requests then act there with that role", async () => {
    const token = await update(tokenFor(home), { organisationId: second });
    expect(token.org).toBe(second);
    const member = await loadMember({ userId: pilotId, organisationId: token.org as string, sessionId: await startSession(pilotId) });
    expect(member).toMatchObject({ organisationId: second, role: "reviewer" });
  });

  it("leaves the session as it was for an organisation the person does not belong to, or a malformed id", async () => {
    const stranger = randomUUID();
    for (const organisationId of [stranger, "not-a-uuid", 42, null, undefined]) {
      const token = await update(tokenFor(home), { organisationId });
      expect(token.org).toBe(home);
    }
  });

  it("refuses once the membership has ended", async () => {
    await db().delete(memberships).where(and(eq(memberships.userId, pilotId), eq(memberships.organisationId, second)));
    try {
      const token = await update(tokenFor(home), { organisationId: second });
      expect(token.org).toBe(home);
    } finally {
      await db().insert(memberships).values({ organisationId: second, userId: pilotId, role: "reviewer" }).onConflictDoNothing();
    }
  });

  it("an ordinary token refresh (no update) never changes the organisation", async () => {
    const token = (await jwt({ token: tokenFor(home), session: { organisationId: second } } as unknown as JwtArgs)) as JWT;
    expect(token.org).toBe(home);
  });
});
