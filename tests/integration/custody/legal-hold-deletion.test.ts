// Retention: a legal hold on a job blocks deletion of its recordings' files; an owner's deletion
// (no hold) removes the files but keeps the custody trail and records itself; refused attempts are
// recorded too.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import * as hold from "@/app/api/jobs/[id]/hold/route";
import * as deletion from "@/app/api/recordings/[id]/deletion/route";
import * as trail from "@/app/api/custody/route";
import { clientOf, tieClientAccount } from "@/tests/support/client-scope";
import { storedExists } from "@/tests/support/stored-files";
import { verifyOrganisationChain } from "@/lib/custody/verify-organisation-chain";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { closeRedis } from "@/lib/queue/redis";
import { makeSharedJob } from "../sharing/share-fixtures";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let job: Awaited<ReturnType<typeof makeSharedJob>>;

const exists = storedExists;
const setHold = async (who: DemoActorKey, body: unknown, jobId = job.jobId) => hold.PUT(await req(actors[who], "PUT", `/api/jobs/${jobId}/hold`, body), route({ id: jobId }));
const del = async (who: DemoActorKey, recordingId: string, body: unknown = {}) =>
  deletion.POST(await req(actors[who], "POST", `/api/recordings/${recordingId}/deletion`, body, { "user-agent": "vitest-owner" }), route({ id: recordingId }));
const eventsOf = (evidenceId: string, eventType: string) =>
  db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, evidenceId), eq(s.custodyEvents.eventType, eventType)));

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  job = await makeSharedJob(orgId);
  // the demo client account sees this job (a client account of another customer gets 404: client-scope.test.ts)
  await tieClientAccount(actors.client!, await clientOf({ jobId: job.jobId }));
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("legal hold", () => {
  it.each([
    ["pilot", 403],
    ["reviewer", 403],
    ["client", 403],
    ["anonymous", 401],
    ["other", 404],
  ] as [DemoActorKey, number][])("%s cannot set a hold (%i)", async (who, status) => {
    expect((await setHold(who, { hold: true, reason: "Claim 2026-114" })).status).toBe(status);
  });

  it("needs a reason to be set", async () => {
    const res = await setHold("owner", { hold: true });
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.reason).toBeTruthy();
  });

  it("owner sets it; the hold is a custody event; everyone in the organisation can read it", async () => {
    const res = await setHold("owner", { hold: true, reason: "Insurance claim 2026-114" });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ legalHold: true, legalHoldReason: "Insurance claim 2026-114" });
    expect(await eventsOf(job.jobId, "hold_set")).toHaveLength(1);
    const read = await hold.GET(await req(actors.pilot, "GET", "/x"), route({ id: job.jobId }));
    expect(await read.json()).toMatchObject({ legalHold: true });
    // setting the same hold again records nothing new
    await setHold("owner", { hold: true, reason: "Insurance claim 2026-114" });
    expect(await eventsOf(job.jobId, "hold_set")).toHaveLength(1);
  });

  it("blocks the owner's deletion: 423, files untouched, the refusal recorded", async () => {
    const res = await del("owner", job.recA.id, { reason: "tidy up" });
    expect(res.status).toBe(423);
    expect((await res.json()).error.message).toContain("legal hold");
    expect(await exists(job.recA.originalKey)).toBe(true);
    expect(await exists(job.recA.renditionKeys.playable)).toBe(true);
    const [rec] = await db().select().from(s.recordings).where(eq(s.recordings.id, job.recA.id));
    expect(rec.deletedAt).toBeNull();
    const refused = await eventsOf(job.recA.id, "deletion_refused");
    expect(refused).toHaveLength(1);
    expect(refused[0]).toMatchObject({ actorRole: "owner", originalSha256: job.recA.sha256, jobId: job.jobId, userAgent: "vitest-owner" });
    expect(refused[0].details).toMatchObject({ refusedBecause: "legal_hold" });
  });
});

describe("deletion", () => {
  it("a non-owner is refused with 403 and the attempt is recorded", async () => {
    for (const who of ["pilot", "reviewer", "client"] as const) expect((await del(who, job.recB.id)).status).toBe(403);
    const refused = await eventsOf(job.recB.id, "deletion_refused");
    expect(refused.map((e) => e.actorRole).sort()).toEqual(["client", "pilot", "reviewer"]);
    expect(await exists(job.recB.originalKey)).toBe(true);
    expect((await del("anonymous", job.recB.id)).status).toBe(401);
    expect((await del("other", job.recB.id)).status).toBe(404);
  });

  it("is not released without a reason: 422 naming the reason, the hold stays, nothing is logged", async () => {
    for (const body of [{ hold: false }, { hold: false, reason: "" }, { hold: false, reason: "   " }, { hold: false, reason: null }]) {
      const res = await setHold("owner", body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect((await res.json()).error.fields.reason).toBeTruthy();
    }
    const [row] = await db().select({ legalHold: s.jobs.legalHold }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
    expect(row.legalHold).toBe(true);
    expect(await eventsOf(job.jobId, "hold_released")).toHaveLength(0);
  });

  it("after the hold is released, the owner deletes: files gone, row kept as deleted, trail kept, deletion recorded", async () => {
    expect((await setHold("owner", { hold: false, reason: "Claim settled" })).status).toBe(200);
    const released = await eventsOf(job.jobId, "hold_released");
    expect(released).toHaveLength(1);
    // the release's reason is in the custody log, beside who released it
    expect(released[0]).toMatchObject({ actorRole: "owner", purpose: "Legal hold released: Claim settled" });
    expect(released[0].details).toMatchObject({ releaseReason: "Claim settled", previousReason: "Insurance claim 2026-114" });

    const before = await (await trail.GET(await req(actors.owner, "GET", `/api/custody?recordingId=${job.recA.id}`))).json();
    const res = await del("owner", job.recA.id, { reason: "Duplicate pass, client agreed" });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.removed).toContain(job.recA.originalKey);
    for (const key of [job.recA.originalKey, ...Object.values(job.recA.renditionKeys)]) expect(await exists(key), key).toBe(false);
    // the other recording of the job is untouched
    expect(await exists(job.recB.originalKey)).toBe(true);

    const [rec] = await db().select().from(s.recordings).where(eq(s.recordings.id, job.recA.id));
    expect(rec.deletedAt).not.toBeNull();
    expect(rec.sha256).toBe(job.recA.sha256);

    const after = await (await trail.GET(await req(actors.owner, "GET", `/api/custody?recordingId=${job.recA.id}`))).json();
    const types = after.items.map((e: { eventType: string }) => e.eventType);
    expect(after.total).toBe(before.total + 1);
    // newest first: the deletion heads the trail
    expect(types[0]).toBe("deletion");
    expect(types).toContain("deletion_refused");
    const [deleted] = await eventsOf(job.recA.id, "deletion");
    expect(deleted).toMatchObject({ actorRole: "owner", originalSha256: job.recA.sha256, originalSize: job.recA.originalBytes.length, storageLocation: job.recA.originalKey });
    expect(deleted.purpose).toContain("Duplicate pass");
    expect((await verifyOrganisationChain(orgId)).ok).toBe(true);

    // deleting again: the recording is gone
    expect((await del("owner", job.recA.id)).status).toBe(404);
  });

  it("the trail of a job lists its hold, share and deletion events; another organisation sees none", async () => {
    const body = await (await trail.GET(await req(actors.reviewer, "GET", `/api/custody?jobId=${job.jobId}`))).json();
    const types = new Set(body.items.map((e: { eventType: string }) => e.eventType));
    for (const t of ["hold_set", "hold_released", "deletion_refused", "deletion"]) expect(types.has(t), t).toBe(true);
    expect((await trail.GET(await req(actors.other, "GET", `/api/custody?jobId=${job.jobId}`))).status).toBe(404);
    expect((await trail.GET(await req(actors.client, "GET", `/api/custody?jobId=${job.jobId}`))).status).toBe(403);
  });
});
