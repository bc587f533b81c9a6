// Retention on a clock the test controls (every call gets its `now`): the period that applies (job over
// client over organisation), the disposal date, the "due for disposal" list, reminders sent once per
// lead, a legal hold that blocks disposal (and is recorded), and a disposal that removes the files but
// leaves the custody trail with the SHA-256 of everything destroyed and who confirmed it.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { execFileSync } from "node:child_process";
import { and, eq, inArray } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import * as retentionApi from "@/app/api/retention/route";
import * as disposalApi from "@/app/api/retention/jobs/[id]/disposal/route";
import * as finalPackageApi from "@/app/api/retention/jobs/[id]/final-package/route";
import * as packagesApi from "@/app/api/evidence-packages/route";
import { disposalDate } from "@/lib/retention/retention-period";
import { listDisposals, FINAL_PACKAGE_PURPOSE } from "@/lib/retention/list-disposals";
import { sendDisposalReminders } from "@/lib/retention/send-disposal-reminders";
import { disposeJob } from "@/lib/retention/dispose-job";
import { readMailbox } from "@/lib/mail/read-mailbox";
import { storedExists } from "@/tests/support/stored-files";
import { verifyOrganisationChain } from "@/lib/custody/verify-organisation-chain";
import { closeQueues } from "@/lib/queue/jobs";
import { closeRedis } from "@/lib/queue/redis";
import { buildEvidencePackage } from "@/worker/handlers/build-evidence-package";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { jobWithEvidence, buildPackage } from "../evidence-packages/package-fixture";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let owner: { organisationId: string; userId: string; role: "owner" };
const facts = { clientAddress: "198.51.100.7", userAgent: "vitest" };
const exists = storedExists;
const at = (iso: string) => new Date(iso);

// The reference for date arithmetic: Python's datetime (date + timedelta), outside Cairn's code.
const pythonDatePlus = (ymd: string, days: number) =>
  execFileSync("python3", ["-c", `import datetime,sys; print(datetime.date.fromisoformat(sys.argv[1]) + datetime.timedelta(days=int(sys.argv[2])))`, ymd, String(days)]).toString().trim();

const CLOSED_AT = "2026-01-10T15:00:00.000Z";

async function closedJobWithEvidence(opts: { clientDays?: number | null; jobDays?: number | null } = {}) {
  const job = await jobWithEvidence(orgId, owner.userId);
  const [j] = await db().select({ siteId: s.jobs.siteId, title: s.jobs.title }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
  const [site] = await db().select({ clientId: s.sites.clientId }).from(s.sites).where(eq(s.sites.id, j.siteId));
  if (opts.clientDays !== undefined) await db().update(s.clients).set({ retentionDays: opts.clientDays }).where(eq(s.clients.id, site.clientId));
  // closing sets closed_at through the trigger (migration 0008) unless the test names the moment
  await db().update(s.jobs).set({ status: "closed", closedAt: at(CLOSED_AT), retentionDays: opts.jobDays ?? null }).where(eq(s.jobs.id, job.jobId));
  return { ...job, title: j.title, clientId: site.clientId };
}

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  owner = { ...actors.owner!, role: "owner" };
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("closing a job", () => {
  it("sets closed_at when the status becomes closed and clears it when reopened (database trigger)", async () => {
    const job = await jobWithEvidence(orgId, owner.userId);
    await db().update(s.jobs).set({ status: "closed" }).where(eq(s.jobs.id, job.jobId));
    const [closed] = await db().select({ closedAt: s.jobs.closedAt }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
    expect(closed.closedAt).toBeInstanceOf(Date);
    await db().update(s.jobs).set({ status: "review" }).where(eq(s.jobs.id, job.jobId));
    const [open] = await db().select({ closedAt: s.jobs.closedAt }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
    expect(open.closedAt).toBeNull();
  });
});

describe("the disposal date", () => {
  it.each([
    ["2026-01-10T15:00:00Z", 30],
    ["2026-01-10T23:59:59Z", 365],
    ["2028-02-29T08:00:00Z", 365], // leap day
    ["2027-12-31T00:00:00Z", 2557], // seven years, two leap days inside
  ])("closed %s + %i days is the date Python's datetime gives", (closed, days) => {
    expect(disposalDate(new Date(closed), days)).toBe(pythonDatePlus(closed.slice(0, 10), days));
  });

  it("follows the job's own period over the client's over the organisation's", async () => {
    const [org] = await db().select({ days: s.organisations.retentionDays }).from(s.organisations).where(eq(s.organisations.id, orgId));
    const put = async (body: unknown) => retentionApi.PUT(await req(actors.owner, "PUT", "/api/retention", body));
    try {
      expect((await put({ target: "organisation", days: 3650 })).status).toBe(200);
      const job = await closedJobWithEvidence({ clientDays: null });
      const find = async () => (await listDisposals({ organisationId: orgId }, at("2026-01-11T00:00:00Z"))).find((i) => i.jobId === job.jobId)!;
      expect(await find()).toMatchObject({ source: "organisation", retentionDays: 3650, disposalDate: pythonDatePlus("2026-01-10", 3650) });
      expect((await put({ target: "client", id: job.clientId, days: 400 })).status).toBe(200);
      expect(await find()).toMatchObject({ source: "client", retentionDays: 400, disposalDate: pythonDatePlus("2026-01-10", 400) });
      expect((await put({ target: "job", id: job.jobId, days: 90 })).status).toBe(200);
      expect(await find()).toMatchObject({ source: "job", retentionDays: 90, disposalDate: "2026-04-10", daysLeft: 89, due: false });
      // bad input and other people
      expect((await put({ target: "job", id: job.jobId, days: 0 })).status).toBe(422);
      expect((await put({ target: "job", id: job.jobId, days: 1.5 })).status).toBe(422);
      expect((await retentionApi.PUT(await req(actors.pilot, "PUT", "/api/retention", { target: "organisation", days: 1 }))).status).toBe(403);
      expect((await retentionApi.PUT(await req(actors.other, "PUT", "/api/retention", { target: "job", id: job.jobId, days: 1 }))).status).toBe(404);
    } finally {
      await db().update(s.organisations).set({ retentionDays: org.days }).where(eq(s.organisations.id, orgId));
    }
  });
});

describe("the due-for-disposal list and its reminders", () => {
  let job: Awaited<ReturnType<typeof closedJobWithEvidence>>;
  let held: Awaited<ReturnType<typeof closedJobWithEvidence>>;
  const remindersOf = (jobId: string) => db().select().from(s.disposalReminders).where(eq(s.disposalReminders.jobId, jobId));
  const mailsAbout = async (title: string) => (await readMailbox({ to: "owner@kestrelmoor.example", limit: 500 })).filter((m) => m.subject.endsWith(title));

  beforeAll(async () => {
    job = await closedJobWithEvidence({ clientDays: 30 }); // due 2026-02-09
    held = await closedJobWithEvidence({ clientDays: 30 });
    await db().update(s.jobs).set({ legalHold: true, legalHoldReason: "Claim 2026-311" }).where(eq(s.jobs.id, held.jobId));
  });

  it("lists a job as upcoming, then due", async () => {
    const before = (await listDisposals({ organisationId: orgId, horizonDays: 60 }, at("2026-01-20T12:00:00Z"))).find((i) => i.jobId === job.jobId)!;
    expect(before).toMatchObject({ disposalDate: "2026-02-09", daysLeft: 20, due: false });
    expect((await listDisposals({ organisationId: orgId, horizonDays: 10 }, at("2026-01-20T12:00:00Z"))).some((i) => i.jobId === job.jobId)).toBe(false);
    const due = (await listDisposals({ organisationId: orgId }, at("2026-02-09T00:00:00Z"))).find((i) => i.jobId === job.jobId)!;
    expect(due).toMatchObject({ daysLeft: 0, due: true });
    expect((await listDisposals({ organisationId: orgId }, at("2026-02-09T00:00:00Z"))).find((i) => i.jobId === held.jobId)).toMatchObject({ legalHold: true, due: true });
  });

  it("reminds the owners 30 and 7 days ahead and on the day, each once", async () => {
    const sentFor = async (now: string) => (await sendDisposalReminders(at(now), { organisationId: orgId })).filter((r) => r.jobId === job.jobId);
    expect(await sentFor("2026-01-05T09:00:00Z")).toEqual([]); // 35 days ahead: nothing yet
    expect(await sentFor("2026-01-10T16:00:00Z")).toEqual([{ jobId: job.jobId, leadDays: 30, to: ["owner@kestrelmoor.example"] }]);
    expect(await sentFor("2026-01-10T17:00:00Z")).toEqual([]); // the same reminder again: not sent
    expect(await sentFor("2026-01-20T09:00:00Z")).toEqual([]);
    expect((await sentFor("2026-02-03T09:00:00Z")).map((r) => r.leadDays)).toEqual([7]);
    expect(await sentFor("2026-02-04T09:00:00Z")).toEqual([]);
    expect((await sentFor("2026-02-09T09:00:00Z")).map((r) => r.leadDays)).toEqual([0]);
    expect(await sentFor("2026-02-12T09:00:00Z")).toEqual([]);
    expect((await remindersOf(job.jobId)).map((r) => r.leadDays).sort((a, b) => a - b)).toEqual([0, 7, 30]);
    const mails = await mailsAbout(job.title);
    expect(mails).toHaveLength(3);
    expect(mails.map((m) => m.subject).sort()).toEqual([`Disposal in 30 days: ${job.title}`, `Disposal in 6 days: ${job.title}`, `Due for disposal: ${job.title}`].sort());
    expect(mails.find((m) => m.subject.startsWith("Due"))!.text).toContain("Nothing is destroyed until an owner confirms");
  });

  it("sends no reminder for a job under legal hold", async () => {
    for (const now of ["2026-01-10T16:00:00Z", "2026-02-03T09:00:00Z", "2026-02-09T09:00:00Z"]) await sendDisposalReminders(at(now), { organisationId: orgId });
    expect(await remindersOf(held.jobId)).toEqual([]);
    expect(await mailsAbout(held.title)).toEqual([]);
  });
});

describe("disposal", () => {
  let job: Awaited<ReturnType<typeof closedJobWithEvidence>>;
  let ordinaryPackage: { id: string; storageKey: string | null; sha256: string | null };
  let finalPackage: { id: string; storageKey: string | null; sha256: string | null };
  const due = at("2026-02-09T10:00:00Z");
  const dispose = async (who: DemoActorKey, body: unknown, jobId = job.jobId) => disposalApi.POST(await req(actors[who], "POST", `/api/retention/jobs/${jobId}/disposal`, body), route({ id: jobId }));

  beforeAll(async () => {
    job = await closedJobWithEvidence({ clientDays: 30 });
    ({ row: ordinaryPackage } = await buildPackage(owner, { jobId: job.jobId }));
    const res = await finalPackageApi.POST(await req(actors.owner, "POST", `/api/retention/jobs/${job.jobId}/final-package`, {}), route({ id: job.jobId }));
    expect(res.status).toBe(201);
    const made = await res.json();
    expect(await buildEvidencePackage({ packageId: made.id })).toBe("built");
    [finalPackage] = await db().select().from(s.evidencePackages).where(eq(s.evidencePackages.id, made.id));
  }, 60_000);

  it("the final package's purpose cannot be claimed through the ordinary package route", async () => {
    const res = await packagesApi.POST(await req(actors.owner, "POST", "/api/evidence-packages", { jobId: job.jobId, purpose: FINAL_PACKAGE_PURPOSE }));
    expect(res.status).toBe(422);
  });

  it("is only an owner's, and needs the job's exact title", async () => {
    expect((await dispose("anonymous", { confirmTitle: job.title })).status).toBe(401);
    for (const who of ["client", "pilot", "reviewer"] as const) expect((await dispose(who, { confirmTitle: job.title })).status).toBe(403);
    expect((await dispose("other", { confirmTitle: job.title })).status).toBe(404);
    expect((await dispose("owner", { confirmTitle: `${job.title} ` + "x" })).status).toBe(422);
    expect((await dispose("owner", {})).status).toBe(422);
    expect(await exists(job.recA.originalKey)).toBe(true);
  });

  it("is refused before the disposal date", async () => {
    await expect(disposeJob(owner, job.jobId, { confirmTitle: job.title }, facts, at("2026-02-08T23:59:00Z"))).rejects.toMatchObject({ code: "conflict", message: expect.stringContaining("kept until 2026-02-09") });
    expect(await exists(job.recA.originalKey)).toBe(true);
  });

  it("is refused under legal hold, and the refusal is on record; nothing is removed", async () => {
    await db().update(s.jobs).set({ legalHold: true, legalHoldReason: "Regulator's request 44" }).where(eq(s.jobs.id, job.jobId));
    try {
      await expect(disposeJob(owner, job.jobId, { confirmTitle: job.title }, facts, due)).rejects.toMatchObject({ code: "locked" });
      expect((await dispose("owner", { confirmTitle: job.title })).status).toBe(423);
      const refusals = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, job.jobId), eq(s.custodyEvents.eventType, "disposal_refused")));
      expect(refusals).toHaveLength(2);
      expect(refusals[0].purpose).toContain("Regulator's request 44");
      for (const key of [job.recA.originalKey, job.recB.originalKey, ordinaryPackage.storageKey!]) expect(await exists(key)).toBe(true);
      const [row] = await db().select({ disposedAt: s.jobs.disposedAt }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
      expect(row.disposedAt).toBeNull();
    } finally {
      await db().update(s.jobs).set({ legalHold: false, legalHoldReason: null }).where(eq(s.jobs.id, job.jobId));
    }
  });

  it("removes the files, keeps the final package and the whole trail with the SHA-256 of everything destroyed", async () => {
    const keys = [job.recA.originalKey, job.recB.originalKey, ...Object.values(job.recA.renditionKeys), ...Object.values(job.recB.renditionKeys), job.report.storageKey!, ordinaryPackage.storageKey!];
    for (const k of keys) expect(await exists(k)).toBe(true);
    const result = await disposeJob(owner, job.jobId, { confirmTitle: job.title }, facts, due);
    for (const k of keys) expect(await exists(k), k).toBe(false);
    expect(await exists(finalPackage.storageKey!)).toBe(true);
    expect(result.keptFinalPackages).toEqual([finalPackage.id]);

    const recs = await db().select({ deletedAt: s.recordings.deletedAt, deletedBy: s.recordings.deletedBy }).from(s.recordings).where(inArray(s.recordings.id, [job.recA.id, job.recB.id]));
    expect(recs.every((r) => r.deletedAt?.getTime() === due.getTime() && r.deletedBy === owner.userId)).toBe(true);
    const [jobRow] = await db().select({ disposedAt: s.jobs.disposedAt, disposedBy: s.jobs.disposedBy }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
    expect(jobRow).toEqual({ disposedAt: due, disposedBy: owner.userId });

    const perRecording = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, job.recA.id), eq(s.custodyEvents.eventType, "disposal")));
    expect(perRecording).toHaveLength(1);
    expect(perRecording[0].originalSha256).toBe(job.recA.sha256);
    const files = (perRecording[0].details as { files: { kind: string; sha256: string }[] }).files;
    expect(files.find((f) => f.kind === "original")!.sha256).toBe(job.recA.sha256);
    expect(files.filter((f) => f.kind === "rendition")).toHaveLength(4);
    expect(files.every((f) => /^[0-9a-f]{64}$/.test(f.sha256))).toBe(true);

    const [jobEvent] = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, job.jobId), eq(s.custodyEvents.eventType, "disposal")));
    const details = jobEvent.details as { files: { kind: string; evidenceId: string; sha256: string }[]; confirmedBy: { userId: string; email: string }; disposalDate: string };
    expect(details.confirmedBy).toMatchObject({ userId: owner.userId, email: "owner@kestrelmoor.example" });
    expect(details.disposalDate).toBe("2026-02-09");
    expect(details.files.find((f) => f.kind === "report")!.sha256).toBe(job.report.sha256);
    expect(details.files.find((f) => f.kind === "evidence_package")).toMatchObject({ evidenceId: ordinaryPackage.id, sha256: ordinaryPackage.sha256 });
    expect(details.files.some((f) => f.evidenceId === finalPackage.id)).toBe(false);
    // the trail before the disposal is all still there, and the chain still verifies
    const uploads = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, job.recA.id), eq(s.custodyEvents.eventType, "upload")));
    expect(uploads).toHaveLength(1);
    expect((await verifyOrganisationChain(orgId)).ok).toBe(true);
  });

  it("is not repeated, drops the job from the list, and the job can no longer be packaged", async () => {
    await expect(disposeJob(owner, job.jobId, { confirmTitle: job.title }, facts, due)).rejects.toMatchObject({ code: "gone" });
    expect((await listDisposals({ organisationId: orgId }, due)).some((i) => i.jobId === job.jobId)).toBe(false);
    const res = await packagesApi.POST(await req(actors.owner, "POST", "/api/evidence-packages", { jobId: job.jobId }));
    expect(res.status).toBe(410);
  });
});
