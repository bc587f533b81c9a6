// The start page's numbers (GET /api/attention, lib/attention/list-attention.ts): which groups each
// role gets, what lands in each group and what does not, the address each item is handled at, a client
// account limited to its own clients' work, and nothing of another organisation. Real PostgreSQL.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, count, eq, inArray, isNull } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import * as attention from "@/app/api/attention/route";
import { listAttention, type Attention, type AttentionKind } from "@/lib/attention/list-attention";
import type { Member } from "@/lib/auth/load-member";
import { demoActors, demoOrganisationId, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { clientOf, tieClientAccount, untieClientAccount } from "@/tests/support/client-scope";
import { makeReport, makeStoredRecording } from "../sharing/share-fixtures";
import { closeRedis } from "@/lib/queue/redis";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let jobId: string;
let clientId: string;
let emptyFlightId: string;
let failedId: string;
let processingId: string;
let findingId: string;
const soonLabel = `Expiring soon ${randomUUID().slice(0, 6)}`;
const laterLabel = `Expiring later ${randomUUID().slice(0, 6)}`;
const revokedLabel = `Revoked ${randomUUID().slice(0, 6)}`;
const HOUR_MS = 3_600_000;

const call = async (who: DemoActorKey) => attention.GET(await req(actors[who], "GET", "/api/attention"));
const groupsOf = async (who: DemoActorKey) => {
  const res = await call(who);
  expect(res.status).toBe(200);
  return (await res.json()) as Attention;
};
const member = (who: DemoActorKey, role: Member["role"], clientIds: string[] | null = null): Member => ({
  userId: actors[who]!.userId,
  organisationId: actors[who]!.organisationId,
  role,
  clientIds,
  email: "",
  name: "",
  organisationName: "",
  preferredUnits: "m",
  sessionId: randomUUID(),
});
const group = (a: Attention, kind: AttentionKind) => a.groups.find((g) => g.kind === kind);
const ids = (a: Attention, kind: AttentionKind) => group(a, kind)?.items.map((i) => i.id) ?? [];

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  // a job with: a flight never uploaded to; a flight with a failed recording; one with a recording still processing
  const empty = await makeFlight(orgId, { flownOn: new Date().toISOString().slice(0, 10) });
  emptyFlightId = empty.id;
  jobId = empty.jobId;
  clientId = await clientOf({ jobId });
  const f2 = await makeFlight(orgId, { jobId });
  const f3 = await makeFlight(orgId, { jobId });
  const failed = await makeStoredRecording(orgId, jobId, f2.id, { name: "failed-pass.264" });
  failedId = failed.id;
  await db().update(s.recordings).set({ state: "failed", failureReason: "no video track", updatedAt: new Date() }).where(eq(s.recordings.id, failedId));
  const proc = await makeStoredRecording(orgId, jobId, f3.id, { name: "busy-pass.264" });
  processingId = proc.id;
  await db().update(s.recordings).set({ state: "processing", progress: 42, createdAt: new Date(Date.now() + 1000) }).where(eq(s.recordings.id, processingId));
  const [finding] = await db()
    .insert(s.findings)
    .values({ organisationId: orgId, jobId, recordingId: processingId, startFrame: 30, startSec: 1, severity: "major", note: "Spalled concrete at the base" })
    .returning();
  findingId = finding.id;
  const now = Date.now();
  await db()
    .insert(s.shareLinks)
    .values([
      { organisationId: orgId, jobId, scope: "job", tokenHash: randomUUID(), label: soonLabel, expiresAt: new Date(now + 30 * HOUR_MS) },
      { organisationId: orgId, jobId, scope: "job", tokenHash: randomUUID(), label: laterLabel, expiresAt: new Date(now + 30 * 24 * HOUR_MS) },
      { organisationId: orgId, jobId, scope: "job", tokenHash: randomUUID(), label: revokedLabel, expiresAt: new Date(now + 2 * HOUR_MS), revokedAt: new Date() },
    ]);
});
afterAll(async () => {
  await untieClientAccount(actors.client!, clientId);
  await closeDb();
  await closeRedis();
});

describe("the groups each role gets", () => {
  it.each([
    ["owner", ["recordings_processing", "recordings_failed", "findings_unreported", "reports_awaiting_approval", "shares_expiring", "flights_without_recording"]],
    ["pilot", ["recordings_processing", "recordings_failed", "flights_without_recording"]],
    ["reviewer", ["recordings_processing", "recordings_failed", "findings_unreported"]],
    ["client", ["recordings_processing", "recordings_failed"]],
  ] as [DemoActorKey, AttentionKind[]][])("%s", async (who, kinds) => {
    const a = await groupsOf(who);
    expect(a.groups.map((g) => g.kind).sort()).toEqual([...kinds].sort());
    for (const g of a.groups) expect(g.items.length).toBeLessThanOrEqual(Math.min(5, g.count));
  });

  it("nobody signed in gets 401", async () => {
    expect((await call("anonymous")).status).toBe(401);
  });
});

describe("what lands in each group, and where it is handled", () => {
  it("failed and processing recordings, with their state in words and the recording's page", async () => {
    const a = await listAttention(member("owner", "owner"), { limit: 1000 });
    const failed = group(a, "recordings_failed")!.items.find((i) => i.id === failedId)!;
    expect(failed).toMatchObject({ title: "failed-pass.264", detail: "Failed: no video track", href: `/recordings/${failedId}` });
    const busy = group(a, "recordings_processing")!.items.find((i) => i.id === processingId)!;
    expect(busy).toMatchObject({ title: "busy-pass.264", detail: "Processing 42 %", href: `/recordings/${processingId}` });
    expect(ids(a, "recordings_processing")).not.toContain(failedId);
    // the counts agree with the table
    const [{ n }] = await db().select({ n: count() }).from(s.recordings).where(and(eq(s.recordings.organisationId, orgId), eq(s.recordings.state, "failed"), isNull(s.recordings.deletedAt)));
    expect(group(a, "recordings_failed")!.count).toBe(n);
  });

  it("a flight with no recording leads to the upload for that flight; flights with recordings are not listed", async () => {
    const a = await listAttention(member("pilot", "pilot"), { limit: 1000 });
    const item = group(a, "flights_without_recording")!.items.find((i) => i.id === emptyFlightId)!;
    expect(item.href).toBe(`/upload?jobId=${jobId}&flightId=${emptyFlightId}`);
    const [withRecordings] = await db().select({ id: s.recordings.flightId }).from(s.recordings).where(eq(s.recordings.id, failedId));
    expect(ids(a, "flights_without_recording")).not.toContain(withRecordings.id);
  });

  it("a share link expiring within 7 days is listed; a later or revoked one is not", async () => {
    const a = await listAttention(member("owner", "owner"), { limit: 1000 });
    const titles = group(a, "shares_expiring")!.items.map((i) => i.title);
    expect(titles).toContain(soonLabel);
    expect(titles).not.toContain(laterLabel);
    expect(titles).not.toContain(revokedLabel);
    const soon = group(a, "shares_expiring")!.items.find((i) => i.title === soonLabel)!;
    expect(soon.href).toBe(`/custody/jobs/${jobId}#share-links`);
    expect(soon.detail).toMatch(/^Expires in (29|30) h$/);
  });

  it("a finding is 'not in a report' until a report version is made after it; then the ready report waits for approval", async () => {
    let a = await listAttention(member("reviewer", "reviewer"), { limit: 1000 });
    expect(group(a, "findings_unreported")!.items.find((i) => i.id === jobId)).toMatchObject({ detail: "1 finding not yet in a report", href: `/jobs/${jobId}#reports` });
    const before = group(a, "findings_unreported")!.count;

    const { report } = await makeReport(orgId, jobId, { state: "ready" });
    a = await listAttention(member("owner", "owner"), { limit: 1000 });
    expect(ids(a, "findings_unreported")).not.toContain(jobId);
    expect(group(a, "findings_unreported")!.count).toBe(before - 1);
    expect(group(a, "reports_awaiting_approval")!.items.find((i) => i.id === report.id)).toMatchObject({ href: `/jobs/${jobId}#reports`, detail: "Built, waiting for approval" });

    // editing the finding afterwards puts it back: the report no longer holds what it says now
    await db().update(s.findings).set({ note: "Spalled concrete at the base, rebar visible", updatedAt: new Date(Date.now() + 1000) }).where(eq(s.findings.id, findingId));
    a = await listAttention(member("owner", "owner"), { limit: 1000 });
    expect(ids(a, "findings_unreported")).toContain(jobId);

    // approving the report takes it off the approval list
    await db().update(s.reports).set({ state: "approved", approvedAt: new Date() }).where(eq(s.reports.id, report.id));
    a = await listAttention(member("owner", "owner"), { limit: 1000 });
    expect(ids(a, "reports_awaiting_approval")).not.toContain(report.id);
  });
});

describe("scope", () => {
  it("a client account sees its own clients' recordings only", async () => {
    await untieClientAccount(actors.client!, clientId);
    const [{ clientIds }] = [{ clientIds: (await db().select({ c: s.membershipClients.clientId }).from(s.membershipClients).innerJoin(s.memberships, eq(s.memberships.id, s.membershipClients.membershipId)).where(eq(s.memberships.userId, actors.client!.userId))).map((r) => r.c) }];
    let a = await listAttention(member("client", "client", clientIds), { limit: 1000 });
    expect(ids(a, "recordings_failed")).not.toContain(failedId);
    expect(ids(a, "recordings_processing")).not.toContain(processingId);
    // through the API as well: the newest failed recording would head the list if it were in scope
    expect(ids(await groupsOf("client"), "recordings_failed")).not.toContain(failedId);

    await tieClientAccount(actors.client!, clientId);
    a = await listAttention(member("client", "client", [...clientIds, clientId]), { limit: 1000 });
    expect(ids(a, "recordings_failed")).toContain(failedId);
    expect(ids(await groupsOf("client"), "recordings_failed")).toContain(failedId);
    // its counts are those of its clients' jobs only
    const scopedJobs = (await db().select({ id: s.jobs.id }).from(s.jobs).innerJoin(s.sites, eq(s.sites.id, s.jobs.siteId)).where(inArray(s.sites.clientId, [...clientIds, clientId]))).map((j) => j.id);
    const [{ n }] = await db()
      .select({ n: count() })
      .from(s.recordings)
      .where(and(eq(s.recordings.organisationId, orgId), eq(s.recordings.state, "failed"), isNull(s.recordings.deletedAt), inArray(s.recordings.jobId, scopedJobs)));
    expect(group(a, "recordings_failed")!.count).toBe(n);
  });

  it("another organisation sees none of it", async () => {
    const a = await groupsOf("other");
    const all = await listAttention(member("other", "owner"), { limit: 1000 });
    for (const g of [...a.groups, ...all.groups]) {
      for (const i of g.items) {
        expect([failedId, processingId, emptyFlightId, jobId]).not.toContain(i.id);
        expect([soonLabel, laterLabel]).not.toContain(i.title);
      }
    }
  });
});
