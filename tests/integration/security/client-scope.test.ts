// A client account sees only the work of the clients it is tied to. Customer A's job is tied to the
// demo client account, customer B's is not: every route the client role can reach answers 404 (or
// leaves B out of its list) for B's job, flight, recording, finding, still, report and media, and for
// A's report versions that are not approved. The crew still sees everything. Share links carry
// approved report versions only.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import * as clientsApi from "@/app/api/clients/route";
import * as clientApi from "@/app/api/clients/[id]/route";
import * as sitesApi from "@/app/api/sites/route";
import * as siteApi from "@/app/api/sites/[id]/route";
import * as jobsApi from "@/app/api/jobs/route";
import * as jobApi from "@/app/api/jobs/[id]/route";
import * as holdApi from "@/app/api/jobs/[id]/hold/route";
import * as flightsApi from "@/app/api/flights/route";
import * as flightApi from "@/app/api/flights/[id]/route";
import * as timelineApi from "@/app/api/flights/[id]/timeline/route";
import * as recordingsApi from "@/app/api/recordings/route";
import * as recordingApi from "@/app/api/recordings/[id]/route";
import * as tagsApi from "@/app/api/recordings/[id]/tags/route";
import * as traceApi from "@/app/api/recordings/[id]/trace/route";
import * as progressApi from "@/app/api/recordings/[id]/progress/route";
import * as deletionApi from "@/app/api/recordings/[id]/deletion/route";
import * as findingsApi from "@/app/api/findings/route";
import * as findingApi from "@/app/api/findings/[id]/route";
import * as historyApi from "@/app/api/findings/[id]/history/route";
import * as reportsApi from "@/app/api/reports/route";
import * as reportApi from "@/app/api/reports/[id]/route";
import * as downloadApi from "@/app/api/reports/[id]/download/route";
import * as membersApi from "@/app/api/members/route";
import * as viewsApi from "@/app/api/collector/views/route";
import * as rangeApi from "@/app/api/range-checks/route";
import * as recordingMedia from "@/app/api/media/recordings/[id]/[file]/route";
import * as stillMedia from "@/app/api/media/stills/[id]/route";
import * as shareLinksApi from "@/app/api/share-links/route";
import * as shareOptionsApi from "@/app/api/share-links/options/route";
import * as collectorApi from "@/app/api/collector/route";
import { closeRedis } from "@/lib/queue/redis";
import { DEMO_CLIENT_ACCOUNT_CLIENTS, DEMO_CLIENTS } from "@/db/seed/demo-scenario";
import { demoActors, demoOrganisationId, req, route, sessionCookie, type Actor, type DemoActorKey } from "@/tests/support/session";
import { clientOf, tieClientAccount } from "@/tests/support/client-scope";
import { makeReport, makeSharedJob } from "../sharing/share-fixtures";
import { makeMember } from "@/tests/support/factories";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let A: Awaited<ReturnType<typeof makeSharedJob>> & { clientId: string; siteId: string; draft: { id: string } };
let B: Awaited<ReturnType<typeof makeSharedJob>> & { clientId: string; siteId: string; draft: { id: string } };

async function customer(tie: boolean) {
  const job = await makeSharedJob(orgId);
  const clientId = await clientOf({ jobId: job.jobId });
  const [j] = await db().select({ siteId: s.jobs.siteId }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
  await db().update(s.clients).set({ contactEmail: `contact-${clientId.slice(0, 8)}@customer.example` }).where(eq(s.clients.id, clientId));
  const { report: draft } = await makeReport(orgId, job.jobId, { state: "ready" }); // built, not approved
  if (tie) await tieClientAccount(actors.client!, clientId);
  return { ...job, clientId, siteId: j.siteId, draft };
}

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  A = await customer(true);
  B = await customer(false);
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const as = (who: DemoActorKey, url = "/x", headers: Record<string, string> = {}) => req(actors[who], "GET", url, undefined, headers);
const json = async (res: Response) => ({ status: res.status, body: await res.json() });
const one = (id: string) => route({ id });

/** Every read of one customer's records the client role can reach, with its status. */
async function readsOf(who: DemoActorKey, c: typeof A) {
  const rec = c.recA.id;
  return {
    client: (await clientApi.GET(await as(who), one(c.clientId))).status,
    site: (await siteApi.GET(await as(who), one(c.siteId))).status,
    job: (await jobApi.GET(await as(who), one(c.jobId))).status,
    hold: (await holdApi.GET(await as(who), one(c.jobId))).status,
    flight: (await flightApi.GET(await as(who), one(c.flightId))).status,
    timeline: (await timelineApi.GET(await as(who), one(c.flightId))).status,
    recording: (await recordingApi.GET(await as(who), one(rec))).status,
    tags: (await tagsApi.GET(await as(who), one(rec))).status,
    trace: (await traceApi.GET(await as(who), one(rec))).status,
    progress: (await progressApi.GET(await as(who), one(rec))).status,
    finding: (await findingApi.GET(await as(who), one(c.fA.finding.id))).status,
    history: (await historyApi.GET(await as(who), one(c.fA.finding.id))).status,
    approvedReport: (await reportApi.GET(await as(who), one(c.report.id))).status,
    draftReport: (await reportApi.GET(await as(who), one(c.draft.id))).status,
    approvedPdf: (await downloadApi.GET(await as(who), { params: Promise.resolve({ id: c.report.id }) })).status,
    draftPdf: (await downloadApi.GET(await as(who), { params: Promise.resolve({ id: c.draft.id }) })).status,
    playableRange: (await recordingMedia.GET(await as(who, "/x", { range: "bytes=0-99" }), { params: Promise.resolve({ id: rec, file: "playable.mp4" }) })).status,
    still: (await stillMedia.GET(await as(who), { params: Promise.resolve({ id: c.fA.stillId }) })).status,
  };
}

describe("a client account of customer A", () => {
  it("reads A's job and everything on it, approved reports only", async () => {
    expect(await readsOf("client", A)).toEqual({
      client: 200, site: 200, job: 200, hold: 200, flight: 200, timeline: 200, recording: 200, tags: 200, trace: 200, progress: 200,
      finding: 200, history: 200, approvedReport: 200, draftReport: 404, approvedPdf: 200, draftPdf: 404, playableRange: 206, still: 200,
    });
  });

  it("gets 404 for every record of customer B, media included (never 206)", async () => {
    const reads = await readsOf("client", B);
    expect(Object.entries(reads).filter(([, status]) => status !== 404)).toEqual([]);
  });

  it("the crew sees both customers, drafts included", async () => {
    for (const c of [A, B]) {
      const reads = await readsOf("reviewer", c);
      expect(Object.entries(reads).filter(([, status]) => status !== 200 && status !== 206)).toEqual([]);
    }
  });

  it("lists leave B out: clients (and their contact e-mails), sites, jobs, flights, recordings, findings, reports", async () => {
    const ids = async (res: Response) => ((await res.json()).items as { id: string }[]).map((i) => i.id);
    const clients = await json(await clientsApi.GET(await as("client", "/api/clients?pageSize=200")));
    expect(clients.body.items.map((c: { id: string }) => c.id)).toContain(A.clientId);
    expect(clients.body.items.map((c: { id: string }) => c.id)).not.toContain(B.clientId);
    expect(JSON.stringify(clients.body)).not.toContain(`contact-${B.clientId.slice(0, 8)}`);
    const sites = await ids(await sitesApi.GET(await as("client", "/api/sites?pageSize=200")));
    expect(sites).toContain(A.siteId);
    expect(sites).not.toContain(B.siteId);
    const jobs = await ids(await jobsApi.GET(await as("client", "/api/jobs?pageSize=200")));
    expect(jobs).toContain(A.jobId);
    expect(jobs).not.toContain(B.jobId);
    // asking for B by filter gives nothing either
    expect(await ids(await jobsApi.GET(await as("client", `/api/jobs?clientId=${B.clientId}`)))).toEqual([]);
    const flights = await ids(await flightsApi.GET(await as("client", "/api/flights?pageSize=200")));
    expect(flights).toContain(A.flightId);
    expect(flights).not.toContain(B.flightId);
    const recs = await ids(await recordingsApi.GET(await as("client", "/api/recordings?pageSize=200")));
    expect(recs).toEqual(expect.arrayContaining([A.recA.id, A.recB.id]));
    expect(recs).not.toContain(B.recA.id);
    expect(await ids(await recordingsApi.GET(await as("client", `/api/recordings?jobId=${B.jobId}`)))).toEqual([]);
    expect(await ids(await findingsApi.GET(await as("client", `/api/findings?jobId=${B.jobId}`)))).toEqual([]);
    expect((await ids(await findingsApi.GET(await as("client", `/api/findings?jobId=${A.jobId}`)))).length).toBe(2);
    expect(await ids(await reportsApi.GET(await as("client", `/api/reports?jobId=${B.jobId}`)))).toEqual([]);
    // of A's two versions, only the approved one
    expect(await ids(await reportsApi.GET(await as("client", `/api/reports?jobId=${A.jobId}`)))).toEqual([A.report.id]);
    expect((await ids(await reportsApi.GET(await as("reviewer", `/api/reports?jobId=${A.jobId}`)))).sort()).toEqual([A.report.id, A.draft.id].sort());
  });

  it("sees the crew on the members list, never other client accounts", async () => {
    const other = await makeMember(orgId, "client", { name: "Another customer's person" });
    const body = (await json(await membersApi.GET(await as("client", "/api/members?pageSize=200")))).body;
    expect(body.items.map((m: { role: string }) => m.role)).not.toContain("client");
    expect(body.items.length).toBeGreaterThanOrEqual(3);
    expect(JSON.stringify(body)).not.toContain(other.name);
    expect((await json(await membersApi.GET(await as("client", "/api/members?role=client")))).body.items).toEqual([]);
    expect((await json(await membersApi.GET(await as("owner", "/api/members?role=client&pageSize=200")))).body.items.length).toBeGreaterThanOrEqual(2);
  });

  it("cannot ask to delete B's recording (404, and nothing recorded about it)", async () => {
    const before = await db().$count(s.custodyEvents, eq(s.custodyEvents.evidenceId, B.recA.id));
    const res = await deletionApi.POST(await req(actors.client, "POST", "/x", {}), one(B.recA.id));
    expect(res.status).toBe(404);
    expect(await db().$count(s.custodyEvents, eq(s.custodyEvents.evidenceId, B.recA.id))).toBe(before);
  });

  it("the range tools and who watched what are the crew's: 403", async () => {
    expect((await viewsApi.GET(await as("client", `/api/collector/views?recordingId=${A.recA.id}`))).status).toBe(403);
    expect((await rangeApi.GET(await as("client", `/api/range-checks?flightId=${A.flightId}`))).status).toBe(403);
  });

  it("counts its playback views of A's recordings only; a beacon naming B's recording is ignored", async () => {
    const t0 = Date.UTC(2026, 2, 14, 9, 0, 0);
    const beacon = async (recordingId: string, viewKey: string) =>
      collectorApi.POST(
        new Request("http://localhost/api/collector?via=localhost", {
          method: "POST",
          headers: { "content-type": "text/plain", cookie: await sessionCookie(actors.client!) },
          body: JSON.stringify({ metadata: { transmission_timestamp: t0 + 1000 }, events: [{ e: "hb", xid: viewKey, vid: recordingId, xst: t0, uti: t0 + 1000, xwati: 1000, xtitofifr: 300, xreco: 0, xredu: 0, ake: "cairn-local" }] }),
        }),
      );
    const key = `scope-${randomUUID().slice(0, 8)}`;
    expect(await (await beacon(A.recA.id, `${key}-a`)).json()).toEqual({ stored: 1, ignored: 0 });
    expect(await (await beacon(B.recA.id, `${key}-b`)).json()).toEqual({ stored: 0, ignored: 1 });
    expect(await db().$count(s.playbackViews, eq(s.playbackViews.recordingId, B.recA.id))).toBe(0);
  });

  it("a client account tied to no client sees nothing", async () => {
    const m = await makeMember(orgId, "client");
    const actor = { userId: m.userId, organisationId: orgId };
    const list = await json(await jobsApi.GET(await req(actor, "GET", "/api/jobs?pageSize=200")));
    expect(list).toMatchObject({ status: 200, body: { items: [], total: 0 } });
    expect((await json(await clientsApi.GET(await req(actor, "GET", "/api/clients")))).body.items).toEqual([]);
    expect((await recordingApi.GET(await req(actor, "GET", "/x"), one(A.recA.id))).status).toBe(404);
    expect((await recordingMedia.GET(await req(actor, "GET", "/x", undefined, { range: "bytes=0-9" }), { params: Promise.resolve({ id: A.recA.id, file: "playable.mp4" }) })).status).toBe(404);
  });

  it("the seeded demo client account is tied to the demo job's client only", async () => {
    const [water] = await db().select({ id: s.clients.id }).from(s.clients).where(eq(s.clients.name, DEMO_CLIENTS.find((c) => c.key === DEMO_CLIENT_ACCOUNT_CLIENTS[0])!.name));
    const tied = await db().select({ clientId: s.membershipClients.clientId }).from(s.membershipClients);
    expect(tied.map((t) => t.clientId)).toContain(water.id);
    const titles = ((await (await jobsApi.GET(await as("client", "/api/jobs?pageSize=200"))).json()).items as { title: string }[]).map((j) => j.title);
    expect(titles).toContain("Valve tower annual inspection");
    expect(titles).not.toContain("Storm damage claim, terrace roofs");
    expect(titles).not.toContain("Array B panel survey");
  });
});

describe("share links carry approved report versions only", () => {
  it("refuses a version that is not approved with 422 on reportId, and offers only approved ones", async () => {
    const before = await db().$count(s.shareLinks);
    for (const scope of ["report", "findings", "recording"] as const) {
      const body = { label: "draft attempt", jobId: A.jobId, scope, reportId: A.draft.id, recordingId: A.recA.id, findingIds: [A.fA.finding.id] };
      const res = await json(await shareLinksApi.POST(await req(actors.owner, "POST", "/api/share-links", body)));
      expect(res.status).toBe(422);
      expect(res.body.error.fields.reportId[0]).toMatch(/not approved/);
    }
    expect(await db().$count(s.shareLinks)).toBe(before);
    const ok = await shareLinksApi.POST(await req(actors.owner, "POST", "/api/share-links", { label: "approved", jobId: A.jobId, scope: "report", reportId: A.report.id }));
    expect(ok.status).toBe(201);
    const options = (await json(await shareOptionsApi.GET(await as("owner", `/api/share-links/options?jobId=${A.jobId}`)))).body;
    expect(options.reports.map((r: { id: string }) => r.id)).toEqual([A.report.id]);
  });

  it("an unknown report id is 422 too, not 500", async () => {
    const res = await shareLinksApi.POST(await req(actors.owner, "POST", "/api/share-links", { label: "x", jobId: A.jobId, scope: "report", reportId: randomUUID() }));
    expect(res.status).toBe(422);
  });
});
