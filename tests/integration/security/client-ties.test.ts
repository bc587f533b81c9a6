// Tying a client account to clients: named in the invitation (copied to the membership when it is
// accepted) or set later by an owner. The new account then sees those clients' jobs only.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import * as invitationsApi from "@/app/api/invitations/route";
import * as acceptApi from "@/app/api/invitations/accept/route";
import * as tiesApi from "@/app/api/members/[userId]/clients/route";
import * as jobsApi from "@/app/api/jobs/route";
import { closeDb } from "@/db/client";
import { closeRedis } from "@/lib/queue/redis";
import { readMailbox } from "@/lib/mail/read-mailbox";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeClient, makeJob, makeSite, makeMember } from "@/tests/support/factories";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let a: { clientId: string; jobId: string };
let b: { clientId: string; jobId: string };

async function customer() {
  const client = await makeClient(orgId);
  const job = await makeJob(orgId, { siteId: (await makeSite(orgId, { clientId: client.id })).id });
  return { clientId: client.id, jobId: job.id };
}
beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  a = await customer();
  b = await customer();
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const jobIdsOf = async (actor: Actor) => ((await (await jobsApi.GET(await req(actor, "GET", "/api/jobs?pageSize=200"))).json()).items as { id: string }[]).map((j) => j.id);

describe("client ties", () => {
  it("an invitation names the clients; the accepted account sees their jobs only", async () => {
    const email = `client-${randomUUID().slice(0, 8)}@test.example`;
    const res = await invitationsApi.POST(await req(actors.owner, "POST", "/api/invitations", { email, role: "client", clientIds: [a.clientId] }));
    expect(res.status).toBe(201);
    const [mail] = await readMailbox({ to: email, limit: 1 });
    const token = mail.text.match(/\/invite\/([A-Za-z0-9_-]+)/)![1];
    const accepted = await acceptApi.POST(await req(null, "POST", "/api/invitations/accept", { token, name: "Invited Client", password: "a long enough password" }));
    expect(accepted.status).toBe(200);
    const { actorByEmail } = await import("@/tests/support/session");
    const actor = await actorByEmail(email);
    const ids = await jobIdsOf(actor);
    expect(ids).toEqual([a.jobId]);
  });

  it("an invitation naming another organisation's client is 422 on clientIds, and none is sent", async () => {
    const theirs = await makeClient(actors.other!.organisationId);
    const email = `client-${randomUUID().slice(0, 8)}@test.example`;
    const res = await invitationsApi.POST(await req(actors.owner, "POST", "/api/invitations", { email, role: "client", clientIds: [theirs.id] }));
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.clientIds).toBeDefined();
    expect(await readMailbox({ to: email })).toEqual([]);
  });

  it("an owner changes the ties; the next request sees the new set; the crew cannot be tied; others may not", async () => {
    const m = await makeMember(orgId, "client");
    const actor = { userId: m.userId, organisationId: orgId };
    expect(await jobIdsOf(actor)).toEqual([]);
    const set = async (who: Actor, body: unknown, userId = m.userId) => tiesApi.PUT(await req(who, "PUT", "/x", body), route({ userId }));
    expect((await set(actors.owner, { clientIds: [b.clientId] })).status).toBe(200);
    expect(await jobIdsOf(actor)).toEqual([b.jobId]);
    expect((await set(actors.owner, { clientIds: [a.clientId, b.clientId] })).status).toBe(200);
    expect((await jobIdsOf(actor)).sort()).toEqual([a.jobId, b.jobId].sort());
    const got = await (await tiesApi.GET(await req(actors.owner, "GET", "/x"), route({ userId: m.userId }))).json();
    expect(got.clientIds.sort()).toEqual([a.clientId, b.clientId].sort());
    expect((await set(actors.owner, { clientIds: [] })).status).toBe(200);
    expect(await jobIdsOf(actor)).toEqual([]);
    expect((await set(actors.owner, { clientIds: ["not-a-uuid"] })).status).toBe(422);
    expect((await set(actors.owner, { clientIds: [randomUUID()] })).status).toBe(422);
    expect((await set(actors.owner, { clientIds: [a.clientId] }, actors.pilot!.userId)).status).toBe(409);
    expect((await set(actors.owner, { clientIds: [a.clientId] }, randomUUID())).status).toBe(404);
    for (const who of ["pilot", "reviewer", "client"] as const) expect((await set(actors[who], { clientIds: [a.clientId] })).status).toBe(403);
    expect((await set(actors.other, { clientIds: [a.clientId] })).status).toBe(404);
    expect((await set(null, { clientIds: [a.clientId] })).status).toBe(401);
    expect(await jobIdsOf(actor)).toEqual([]);
  });
});
