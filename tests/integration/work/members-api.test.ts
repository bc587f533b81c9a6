// The members API against the real Postgres: who may see and manage the crew, the last-owner rule,
// and what removing a member does.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import * as list from "@/app/api/members/route";
import * as one from "@/app/api/members/[userId]/route";
import * as clientsApi from "@/app/api/clients/route";
import { db, closeDb } from "@/db/client";
import { flights, jobs, memberships, users } from "@/db/schema";
import { demoActors, demoOrganisationId, membershipRole, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight, makeJob, makeMember } from "@/tests/support/factories";
import { closeRedis } from "@/lib/queue/redis";
import { createOrganisation } from "@/lib/members/create-organisation";

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

/** A fresh organisation with a single owner, so the demo owner is never demoted by these tests. */
async function soloOrganisation(tag: string) {
  const { organisation, owner } = await createOrganisation({
    name: `Solo ${tag}`,
    slug: `solo-${tag}-${Math.random().toString(36).slice(2, 8)}`,
    owner: { email: `solo-${tag}-${Math.random().toString(36).slice(2, 8)}@test.example`, name: `Solo owner ${tag}`, password: "a long enough password" },
  });
  return { orgId: organisation.id, owner: { userId: owner.id, organisationId: organisation.id } };
}

describe("authorization matrix", () => {
  // actor, GET list, PATCH role, DELETE member
  const cases: [DemoActorKey, number, number, number][] = [
    ["owner", 200, 200, 200],
    ["pilot", 200, 403, 403],
    ["reviewer", 200, 403, 403],
    ["client", 200, 403, 403],
    ["other", 200, 404, 404],
    ["anonymous", 401, 401, 401],
  ];
  it.each(cases)("%s: list %i, change role %i, remove %i", async (who, l, p, d) => {
    const a = actors[who];
    const target = await makeMember(orgId, "pilot");
    const other = await makeMember(orgId, "reviewer");
    expect((await list.GET(await req(a, "GET", "/api/members"))).status).toBe(l);
    expect((await one.PATCH(await req(a, "PATCH", "/x", { role: "reviewer" }), route({ userId: target.userId }))).status).toBe(p);
    expect((await one.DELETE(await req(a, "DELETE", "/x"), route({ userId: other.userId }))).status).toBe(d);
    expect(await membershipRole(target.userId, orgId)).toBe(p === 200 ? "reviewer" : "pilot");
    expect(await membershipRole(other.userId, orgId)).toBe(d === 200 ? undefined : "reviewer");
  });

  it("e-mail addresses are shown to those who manage members only", async () => {
    const asOwner = await (await list.GET(await req(actors.owner, "GET", "/api/members?pageSize=200"))).json();
    const asPilot = await (await list.GET(await req(actors.pilot, "GET", "/api/members?pageSize=200"))).json();
    expect(asOwner.items.find((m: { userId: string }) => m.userId === actors.pilot!.userId).email).toBe("pilot@kestrelmoor.example");
    expect(asPilot.items.every((m: Record<string, unknown>) => !("email" in m))).toBe(true);
    expect(asPilot.total).toBe(asOwner.total);
  });

  it("the list is the caller's organisation only; ?role= filters; owners come first", async () => {
    const body = await (await list.GET(await req(actors.owner, "GET", "/api/members?pageSize=200"))).json();
    const ids = body.items.map((m: { userId: string }) => m.userId);
    expect(ids).not.toContain(actors.other!.userId);
    expect(body.items[0]).toMatchObject({ userId: actors.owner!.userId, role: "owner", name: "Ada Thornbury" });
    const crew = await (await list.GET(await req(actors.owner, "GET", "/api/members?role=pilot,owner&pageSize=200"))).json();
    expect(new Set(crew.items.map((m: { role: string }) => m.role))).toEqual(new Set(["owner", "pilot"]));
    expect((await list.GET(await req(actors.owner, "GET", "/api/members?role=captain"))).status).toBe(422);
  });
});

describe("the last owner", () => {
  it("cannot be demoted or removed (409), and stays owner", async () => {
    const solo = await soloOrganisation("last");
    for (const res of [
      await one.PATCH(await req(solo.owner, "PATCH", "/x", { role: "pilot" }), route({ userId: solo.owner.userId })),
      await one.DELETE(await req(solo.owner, "DELETE", "/x"), route({ userId: solo.owner.userId })),
    ]) {
      expect(res.status).toBe(409);
      expect((await res.json()).error.code).toBe("conflict");
    }
    expect(await membershipRole(solo.owner.userId, solo.orgId)).toBe("owner");
  });

  it("can step down once a second owner exists", async () => {
    const solo = await soloOrganisation("second");
    const second = await makeMember(solo.orgId, "pilot");
    expect((await one.PATCH(await req(solo.owner, "PATCH", "/x", { role: "owner" }), route({ userId: second.userId }))).status).toBe(200);
    expect((await one.PATCH(await req(solo.owner, "PATCH", "/x", { role: "reviewer" }), route({ userId: solo.owner.userId }))).status).toBe(200);
    expect(await membershipRole(solo.owner.userId, solo.orgId)).toBe("reviewer");
    // and now the second is the last one
    const secondActor = { userId: second.userId, organisationId: solo.orgId };
    expect((await one.DELETE(await req(secondActor, "DELETE", "/x"), route({ userId: second.userId }))).status).toBe(409);
  });

  it("two owners demoting each other at the same moment leave one owner", async () => {
    const solo = await soloOrganisation("race");
    const second = await makeMember(solo.orgId, "owner");
    const secondActor = { userId: second.userId, organisationId: solo.orgId };
    const results = await Promise.all([
      one.PATCH(await req(solo.owner, "PATCH", "/x", { role: "pilot" }), route({ userId: second.userId })),
      one.PATCH(await req(secondActor, "PATCH", "/x", { role: "pilot" }), route({ userId: solo.owner.userId })),
    ]);
    // whichever ran second was no longer an owner (401/403) or found the last owner (409): never both 200
    expect(results.map((r) => r.status).filter((s) => s === 200)).toHaveLength(1);
    const owners = await db().$count(memberships, and(eq(memberships.organisationId, solo.orgId), eq(memberships.role, "owner")));
    expect(owners).toBe(1);
  });
});

describe("removing a member", () => {
  it("ends their access at once, clears their open assignments and keeps the flights they flew", async () => {
    const pilot = await makeMember(orgId, "pilot");
    const job = await makeJob(orgId, { pilotId: pilot.userId, reviewerId: actors.reviewer!.userId });
    const flight = await makeFlight(orgId, { jobId: job.id, pilotId: pilot.userId });
    expect((await clientsApi.GET(await req(pilot, "GET", "/api/clients"))).status).toBe(200);

    expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), route({ userId: pilot.userId }))).status).toBe(200);
    expect((await clientsApi.GET(await req(pilot, "GET", "/api/clients"))).status).toBe(401);
    const [j] = await db().select().from(jobs).where(eq(jobs.id, job.id));
    expect(j.pilotId).toBeNull();
    expect(j.reviewerId).toBe(actors.reviewer!.userId);
    const [f] = await db().select({ pilotId: flights.pilotId }).from(flights).where(eq(flights.id, flight.id));
    expect(f.pilotId).toBe(pilot.userId);
    // the account itself stays: it may belong to other organisations
    expect(await db().$count(users, eq(users.id, pilot.userId))).toBe(1);
  });
});

describe("bad input", () => {
  it("bad role bodies are 400/422 with the shared body and change nothing", async () => {
    const target = await makeMember(orgId, "pilot");
    const at = route({ userId: target.userId });
    const cases: [unknown, number][] = [
      ["{role:", 400],
      [{ role: "admin" }, 422],
      [{ role: 1 }, 422],
      [{}, 422],
      [{ role: "owner", organisationId: orgId }, 422],
    ];
    for (const [body, status] of cases) {
      const res = await one.PATCH(await req(actors.owner, "PATCH", "/x", body), at);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(typeof (await res.json()).error.message).toBe("string");
    }
    expect(await membershipRole(target.userId, orgId)).toBe("pilot");
  });

  it("unknown, malformed and other-organisation user ids answer 404", async () => {
    for (const userId of ["00000000-0000-4000-8000-000000000000", "nope", actors.other!.userId]) {
      expect((await one.PATCH(await req(actors.owner, "PATCH", "/x", { role: "pilot" }), route({ userId }))).status).toBe(404);
      expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), route({ userId }))).status).toBe(404);
    }
    expect(await membershipRole(actors.other!.userId, actors.other!.organisationId)).toBe("owner");
  });
});
