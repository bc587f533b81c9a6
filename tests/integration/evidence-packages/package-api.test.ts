// The evidence-package API end to end: who may ask for and download a package, the refusals decided
// before anything is queued (an empty job, deleted recordings, another organisation's job, a package
// larger than the free disk), a job under legal hold packaged all the same, the build run by the real
// worker with its progress, the download resumed with Range after a cut (RFC 9110 14), one custody event
// per download, and the download through a share link that carries the package.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import * as packagesApi from "@/app/api/evidence-packages/route";
import * as packageApi from "@/app/api/evidence-packages/[id]/route";
import * as downloadApi from "@/app/api/evidence-packages/[id]/download/route";
import * as shareApi from "@/app/api/evidence-packages/[id]/share/route";
import * as sharePackage from "@/app/api/s/[token]/package/route";
import { closeQueues } from "@/lib/queue/jobs";
import { closeRedis } from "@/lib/queue/redis";
import { startWorker, type RunningWorker } from "@/worker/start-worker";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";
import { resolveShareLink } from "@/lib/sharing/resolve-share-link";
import { buildShareView } from "@/lib/sharing/build-share-view";
import { makeFlight, makeJob } from "@/tests/support/factories";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { waitJobs } from "@/tests/support/wait-jobs";
import { makeStoredRecording } from "../sharing/share-fixtures";
import { jobWithEvidence } from "./package-fixture";

const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let worker: RunningWorker;
let job: Awaited<ReturnType<typeof jobWithEvidence>>;

const ask = async (who: DemoActorKey, body: unknown) => packagesApi.POST(await req(actors[who], "POST", "/api/evidence-packages", body));
const statusOf = async (who: DemoActorKey, id: string) => packageApi.GET(await req(actors[who], "GET", `/api/evidence-packages/${id}`), route({ id }));
const download = async (who: DemoActorKey, id: string, headers: Record<string, string> = {}, method = "GET") =>
  downloadApi.GET(await req(actors[who], method, `/api/evidence-packages/${id}/download`, undefined, headers), route({ id }));
const downloadEvents = (packageId: string) =>
  db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, packageId), eq(s.custodyEvents.eventType, "download")));
const bytesOf = async (res: Response) => Buffer.from(await res.arrayBuffer());

async function builtPackage(body: unknown) {
  const res = await ask("owner", body);
  expect(res.status).toBe(201);
  const made = await res.json();
  await waitJobs({ names: ["build-evidence-package"], timeoutMs: 60_000 });
  return (await (await statusOf("owner", made.id)).json()) as { id: string; state: string; sha256: string; sizeBytes: number; progress: number };
}

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  job = await jobWithEvidence(orgId, actors.owner!.userId);
  worker = await startWorker({ only: ["build-evidence-package"], log: () => {} });
}, 30_000);
afterAll(async () => {
  await worker?.stop();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("asking for a package", () => {
  it.each([
    ["anonymous", 401],
    ["client", 403],
    ["pilot", 403],
    ["other", 404],
  ] as [DemoActorKey, number][])("%s cannot (%i), and no row is written", async (who, status) => {
    const before = await db().$count(s.evidencePackages, eq(s.evidencePackages.jobId, job.jobId));
    expect((await ask(who, { jobId: job.jobId })).status).toBe(status);
    expect(await db().$count(s.evidencePackages, eq(s.evidencePackages.jobId, job.jobId))).toBe(before);
  });

  it("refuses an empty job with a clear reason (422)", async () => {
    const empty = await makeJob(orgId);
    const res = await ask("owner", { jobId: empty.id });
    expect(res.status).toBe(422);
    expect((await res.json()).error.message).toMatch(/Nothing to package/);
    expect(await db().$count(s.evidencePackages, eq(s.evidencePackages.jobId, empty.id))).toBe(0);
  });

  it("refuses chosen recordings that are deleted or being deleted (409), naming them", async () => {
    const flight = await makeFlight(orgId);
    const kept = await makeStoredRecording(orgId, flight.jobId, flight.id, { name: "kept.264" });
    const gone = await makeStoredRecording(orgId, flight.jobId, flight.id, { name: "being-deleted.264" });
    await db().update(s.recordings).set({ deletedAt: new Date() }).where(eq(s.recordings.id, gone.id));
    const res = await ask("owner", { jobId: flight.jobId, recordingIds: [kept.id, gone.id] });
    expect(res.status).toBe(409);
    expect((await res.json()).error.message).toContain("being-deleted.264");
  });

  it("refuses a recording of another job (404) and malformed input (422)", async () => {
    const other = await makeFlight(orgId);
    const elsewhere = await makeStoredRecording(orgId, other.jobId, other.id);
    expect((await ask("owner", { jobId: job.jobId, recordingIds: [elsewhere.id] })).status).toBe(404);
    expect((await ask("owner", { jobId: job.jobId, recordingIds: [] })).status).toBe(422);
    expect((await ask("owner", { jobId: job.jobId, purpose: "a\u0000b" })).status).toBe(422);
    expect((await ask("owner", { jobId: job.jobId, extra: 1 })).status).toBe(422);
  });

  it("refuses a package larger than the free disk before starting, with the figures (409)", async () => {
    // the real free space (fs.statfs), with a reserve larger than any disk: nothing fits
    process.env.EVIDENCE_PACKAGE_DISK_RESERVE_BYTES = String(2 ** 52);
    try {
      const before = await db().$count(s.evidencePackages);
      const res = await ask("owner", { jobId: job.jobId });
      expect(res.status).toBe(409);
      const { message } = (await res.json()).error;
      expect(message).toMatch(/needs about [\d.]+ kB but the store's disk has [\d.]+ [kMGT]?B free/);
      expect(await db().$count(s.evidencePackages)).toBe(before);
    } finally {
      delete process.env.EVIDENCE_PACKAGE_DISK_RESERVE_BYTES;
    }
  });
});

describe("a built package", () => {
  let pkg: { id: string; state: string; sha256: string; sizeBytes: number; progress: number };
  let whole: Buffer;

  beforeAll(async () => {
    pkg = await builtPackage({ jobId: job.jobId, purpose: "For the loss adjuster" });
  }, 90_000);

  it("was built by the worker in the background, to 100 %", () => {
    expect(pkg.state).toBe("ready");
    expect(pkg.progress).toBe(100);
  });

  it("is listed for the crew, not for a client account", async () => {
    const res = await packagesApi.GET(await req(actors.pilot, "GET", `/api/evidence-packages?jobId=${job.jobId}`));
    expect(res.status).toBe(200);
    expect((await res.json()).items.map((p: { id: string }) => p.id)).toContain(pkg.id);
    expect((await statusOf("client", pkg.id)).status).toBe(403);
  });

  it("downloads whole with its SHA-256 as ETag and one custody event", async () => {
    const res = await download("reviewer", pkg.id);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/zip");
    expect(res.headers.get("accept-ranges")).toBe("bytes");
    whole = await bytesOf(res);
    expect(sha256(whole)).toBe(pkg.sha256);
    expect(whole.length).toBe(pkg.sizeBytes);
    expect(res.headers.get("etag")).toBe(`"${pkg.sha256.slice(0, 32)}"`);
    expect(res.headers.get("x-cairn-package-sha256")).toBe(pkg.sha256);
    const events = await downloadEvents(pkg.id);
    expect(events).toHaveLength(1);
    expect(events[0].outputSha256).toBe(pkg.sha256);
  });

  it("a download cut mid-way resumes with Range to the same bytes, still one download in the log", async () => {
    const cut = Math.floor(whole.length / 3);
    const first = await download("owner", pkg.id, { range: `bytes=0-${cut - 1}` });
    expect(first.status).toBe(206);
    const head = await bytesOf(first);
    const etag = first.headers.get("etag")!;
    const rest = await download("owner", pkg.id, { range: `bytes=${cut}-`, "if-range": etag });
    expect(rest.status).toBe(206);
    expect(rest.headers.get("content-range")).toBe(`bytes ${cut}-${whole.length - 1}/${whole.length}`);
    const joined = Buffer.concat([head, await bytesOf(rest)]);
    expect(sha256(joined)).toBe(pkg.sha256);
    // RFC 9110 14.1.2: a range past the end is not satisfiable
    expect((await download("owner", pkg.id, { range: `bytes=${whole.length}-` })).status).toBe(416);
    // the reviewer's whole download and the owner's first part: two downloads, the resumed part none
    expect(await downloadEvents(pkg.id)).toHaveLength(2);
  });

  it("HEAD tells the size without a body or a log entry", async () => {
    const res = await download("pilot", pkg.id, {}, "HEAD");
    expect(res.status).toBe(200);
    expect(await downloadEvents(pkg.id)).toHaveLength(2);
  });

  it("is kept for a set time: past it, 410", async () => {
    await db().update(s.evidencePackages).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(s.evidencePackages.id, pkg.id));
    try {
      expect((await download("owner", pkg.id)).status).toBe(410);
      expect((await (await statusOf("owner", pkg.id)).json()).state).toBe("expired");
    } finally {
      await db().update(s.evidencePackages).set({ expiresAt: new Date(Date.now() + 86_400_000) }).where(eq(s.evidencePackages.id, pkg.id));
    }
  });

  it("downloads through a share link that carries it, and only then", async () => {
    const token = generateShareToken();
    const [link] = await db()
      .insert(s.shareLinks)
      .values({ organisationId: orgId, jobId: job.jobId, scope: "job", tokenHash: hashShareToken(token), label: "Adjuster", expiresAt: new Date(Date.now() + 86_400_000) })
      .returning();
    const viaLink = async (headers: Record<string, string> = {}) =>
      sharePackage.GET(new Request(`http://localhost/api/s/${token}/package`, { headers: { "x-forwarded-for": "203.0.113.9", ...headers } }), { params: Promise.resolve({ token }) });
    expect((await viaLink()).status).toBe(404);

    const attach = async (who: DemoActorKey, body: unknown) => shareApi.PUT(await req(actors[who], "PUT", `/api/evidence-packages/${pkg.id}/share`, body), route({ id: pkg.id }));
    expect((await attach("reviewer", { shareLinkId: link.id })).status).toBe(403);
    expect((await attach("other", { shareLinkId: link.id })).status).toBe(404);
    expect((await attach("owner", { shareLinkId: link.id })).status).toBe(200);

    // the share page offers it, with its SHA-256
    const resolved = await resolveShareLink(token);
    expect(resolved.kind).toBe("open");
    const view = await buildShareView((resolved as { link: Parameters<typeof buildShareView>[0] }).link);
    expect(view.evidencePackage).toMatchObject({ sha256: pkg.sha256, sizeBytes: pkg.sizeBytes });

    const res = await viaLink();
    expect(res.status).toBe(200);
    expect(res.headers.get("referrer-policy")).toBe("no-referrer");
    expect(sha256(await bytesOf(res))).toBe(pkg.sha256);
    const resumed = await viaLink({ range: "bytes=100-" });
    expect(resumed.status).toBe(206);
    const events = await downloadEvents(pkg.id);
    expect(events.filter((e) => e.actorShareLinkId === link.id)).toHaveLength(1);
    const linkEvents = await db().select().from(s.shareLinkEvents).where(eq(s.shareLinkEvents.shareLinkId, link.id));
    expect(linkEvents.filter((e) => e.kind === "download")).toHaveLength(1);

    await db().update(s.shareLinks).set({ revokedAt: new Date() }).where(eq(s.shareLinks.id, link.id));
    expect((await viaLink()).status).toBe(410);
  });
});

describe("a job under legal hold", () => {
  it("may be packaged: packaging removes nothing", async () => {
    const held = await jobWithEvidence(orgId, actors.owner!.userId);
    await db().update(s.jobs).set({ legalHold: true, legalHoldReason: "Claim 2026-207" }).where(eq(s.jobs.id, held.jobId));
    const pkg = await builtPackage({ jobId: held.jobId, flightId: held.flightId });
    expect(pkg.state).toBe("ready");
  }, 90_000);
});
