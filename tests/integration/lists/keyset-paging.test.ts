// Keyset paging of every list endpoint (lib/api/keyset.ts), through the route handlers against the real
// PostgreSQL: walking the pages by `nextCursor` yields exactly the rows of one big page, in the same
// order, for the default order and for sorts on nullable columns in both directions (ties included);
// a garbled, forged or foreign cursor is a 422 naming `cursor`, never a 500, and shows nothing.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as recordingsRoute from "@/app/api/recordings/route";
import * as jobsRoute from "@/app/api/jobs/route";
import * as flightsRoute from "@/app/api/flights/route";
import * as clientsRoute from "@/app/api/clients/route";
import * as sitesRoute from "@/app/api/sites/route";
import * as findingsRoute from "@/app/api/findings/route";
import * as shareLinksRoute from "@/app/api/share-links/route";
import * as rangeChecksRoute from "@/app/api/range-checks/route";
import * as viewsRoute from "@/app/api/collector/views/route";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { encodeCursor } from "@/lib/api/keyset";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { demoActors, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeClient, makeFlight, makeJob, makeSite } from "@/tests/support/factories";

type Handler = (r: Request) => Promise<Response>;
type ListBody = { items: { id: string }[]; nextCursor: string | null; total?: number };

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let flight: { id: string; jobId: string };
let recordingIds: string[];
let clientId: string;
let siteId: string;

async function get(handler: Handler, url: string, actor: Actor = actors.owner): Promise<{ status: number; body: ListBody & { error?: { code: string; fields?: Record<string, string[]> } } }> {
  const res = await handler(await req(actor, "GET", url));
  return { status: res.status, body: await res.json() };
}

/** Every id, page by page through nextCursor, and the number of pages read. */
async function walk(handler: Handler, url: string, pageSize: number) {
  const ids: string[] = [];
  let cursor: string | null = null;
  let pages = 0;
  do {
    const { status, body } = await get(handler, `${url}&pageSize=${pageSize}${cursor ? `&cursor=${cursor}` : ""}`);
    expect(status).toBe(200);
    expect(body.items.length).toBeLessThanOrEqual(pageSize);
    ids.push(...body.items.map((i) => i.id));
    cursor = body.nextCursor;
    pages++;
    expect(pages).toBeLessThan(500);
  } while (cursor);
  return { ids, pages };
}

async function onePage(handler: Handler, url: string) {
  const { status, body } = await get(handler, `${url}&pageSize=200`);
  expect(status).toBe(200);
  expect(body.nextCursor).toBeNull();
  return body.items.map((i) => i.id);
}

beforeAll(async () => {
  actors = await demoActors();
  orgId = actors.owner!.organisationId;
  const client = await makeClient(orgId, { name: "Paging client" });
  clientId = client.id;
  const site = await makeSite(orgId, { clientId, name: "Paging site" });
  siteId = site.id;
  const job = await makeJob(orgId, { siteId, title: "Paging job" });
  const f = await makeFlight(orgId, { jobId: job.id });
  flight = { id: f.id, jobId: job.id };
  // 23 recordings: repeated names, sizes and sequence places, some without a duration or recorder
  // time (NULL sorts last both ways), all created in one statement so created_at ties too
  const rows = await db()
    .insert(s.recordings)
    .values(
      Array.from({ length: 23 }, (_, i) => ({
        organisationId: orgId,
        jobId: job.id,
        flightId: f.id,
        originalName: `PAGE_${i % 5}.264`,
        sizeBytes: 1000 + (i % 4),
        sha256: "0".repeat(64),
        sequenceIndex: i % 3,
        kind: (["raw_h264", "mp4", "mov"] as const)[i % 3],
        state: (["waiting", "ready", "failed", "processing"] as const)[i % 4],
        durationSec: i % 4 === 0 ? null : (i % 7) * 1.5,
        recorderModifiedAt: i % 2 ? new Date(Date.UTC(2026, 2, 14, 10, i % 6)) : null,
      })),
    )
    .returning({ id: s.recordings.id });
  recordingIds = rows.map((r) => r.id);
  for (let i = 0; i < 7; i++) await makeFlight(orgId, { jobId: job.id, flownOn: `2026-03-${10 + (i % 3)}` });
  for (let i = 0; i < 6; i++) await makeSite(orgId, { clientId, name: `Paging site ${i % 2}` });
  for (let i = 0; i < 5; i++) await makeClient(orgId, { name: `Paging client ${i % 2}` });
  for (let i = 0; i < 6; i++) await makeJob(orgId, { siteId, title: `Paging job ${i}`, dueDate: i % 2 ? `2026-04-0${i}` : null });
  // findings on two recordings, same start frame on several
  await db()
    .insert(s.findings)
    .values(
      Array.from({ length: 13 }, (_, i) => ({
        organisationId: orgId,
        jobId: job.id,
        recordingId: recordingIds[i % 2],
        startFrame: i % 4,
        startSec: (i % 4) / 25,
        severity: "minor" as const,
        note: `paging finding ${i}`,
      })),
    );
  // share links, range checks and playback views, some created in one statement (same created_at)
  await db()
    .insert(s.shareLinks)
    .values(
      Array.from({ length: 5 }, (_, i) => ({
        organisationId: orgId,
        jobId: job.id,
        scope: "job" as const,
        tokenHash: `paging-${randomUUID()}`,
        label: `Paging link ${i}`,
        expiresAt: new Date(Date.now() + 86_400_000),
      })),
    );
  await db()
    .insert(s.rangeChecks)
    .values(
      Array.from({ length: 5 }, (_, i) => ({
        organisationId: orgId,
        flightId: f.id,
        atSec: i % 3 ? i * 2 : null,
        event: "first_degradation" as const,
        groundDistanceM: 100 + i,
        heightAglM: 40,
        slantRangeM: 107 + i,
      })),
    );
  const started = new Date(Date.UTC(2026, 2, 14, 12));
  await db()
    .insert(s.playbackViews)
    .values(
      Array.from({ length: 5 }, (_, i) => ({
        organisationId: orgId,
        recordingId: recordingIds[0],
        viewKey: `paging-${randomUUID()}`,
        startedAt: i < 3 ? started : new Date(started.getTime() + i * 1000),
        lastBeaconAt: started,
        watchTimeMs: 1000 + i, // played: a view without watch time is not listed
      })),
    );
});

afterAll(async () => {
  await closeQueues();
  await closeRedis();
  await closeDb();
});

describe("walking by nextCursor gives one page's rows, in order, each once", () => {
  const recordingUrls = [
    "sort=sequence&dir=asc",
    "sort=name&dir=desc",
    "sort=size&dir=asc",
    "sort=duration&dir=asc",
    "sort=duration&dir=desc",
    "sort=recordedAt&dir=desc",
    "sort=state&dir=asc",
    "sort=kind&dir=desc",
    "sort=uploadedAt&dir=desc",
  ];
  for (const sort of recordingUrls) {
    it(`recordings, ${sort}`, async () => {
      const url = `/api/recordings?flightId=${flight.id}&${sort}`;
      const all = await onePage(recordingsRoute.GET, url);
      expect(new Set(all)).toEqual(new Set(recordingIds));
      const { ids, pages } = await walk(recordingsRoute.GET, url, 4);
      expect(ids).toEqual(all);
      expect(pages).toBe(6);
    });
  }

  it("recordings: the page's total counts the whole filtered list", async () => {
    const { body } = await get(recordingsRoute.GET, `/api/recordings?flightId=${flight.id}&pageSize=5`);
    expect(body.total).toBe(23);
    expect(body.items).toHaveLength(5);
  });

  const lists: [string, () => Handler, () => string][] = [
    ["jobs by due date", () => jobsRoute.GET, () => `/api/jobs?siteId=${siteId}`],
    ["jobs by title desc", () => jobsRoute.GET, () => `/api/jobs?siteId=${siteId}&sort=title&dir=desc`],
    ["flights", () => flightsRoute.GET, () => `/api/flights?jobId=${flight.jobId}`],
    ["flights by aircraft", () => flightsRoute.GET, () => `/api/flights?jobId=${flight.jobId}&sort=aircraft&dir=asc`],
    ["sites", () => sitesRoute.GET, () => `/api/sites?clientId=${clientId}`],
    ["sites by name desc", () => sitesRoute.GET, () => `/api/sites?clientId=${clientId}&sort=name&dir=desc`],
    ["clients", () => clientsRoute.GET, () => `/api/clients?q=Paging`],
    ["findings of a job", () => findingsRoute.GET, () => `/api/findings?jobId=${flight.jobId}`],
    ["range checks", () => rangeChecksRoute.GET, () => `/api/range-checks?flightId=${flight.id}`],
    ["share links", () => shareLinksRoute.GET, () => `/api/share-links?jobId=${flight.jobId}`],
    ["playback views", () => viewsRoute.GET, () => `/api/collector/views?recordingId=${recordingIds[0]}`],
  ];
  for (const [name, handler, url] of lists) {
    it(name, async () => {
      const all = await onePage(handler(), url());
      expect(all.length).toBeGreaterThanOrEqual(5);
      const { ids } = await walk(handler(), url(), 2);
      expect(ids).toEqual(all);
      expect(new Set(ids).size).toBe(ids.length);
    });
  }

  it("the findings list has 13 findings over 7 pages of 2", async () => {
    const { ids, pages } = await walk(findingsRoute.GET, `/api/findings?jobId=${flight.jobId}`, 2);
    expect(ids).toHaveLength(13);
    expect(pages).toBe(7);
  });
});

describe("a bad cursor is a 422 on `cursor`, never a 500", () => {
  const url = () => `/api/recordings?flightId=${flight.id}&pageSize=3`;
  const forged = (ordering: string, values: (string | null)[]) => encodeCursor(ordering, values);
  const cases: [string, () => string][] = [
    ["not base64url", () => "%%%"],
    ["base64url of no JSON", () => Buffer.from("hello").toString("base64url")],
    ["JSON of the wrong shape", () => Buffer.from(JSON.stringify({ a: 1 })).toString("base64url")],
    ["another ordering's cursor", () => forged("name:desc", ["page_1.264", recordingIds[0]])],
    ["too few values", () => forged("default", ["1", recordingIds[0]])],
    ["a word for a number", () => forged("default", ["one", "2026-03-14 10:00:00+00", recordingIds[0]])],
    ["an integer beyond int4", () => forged("default", ["2147483648", "2026-03-14 10:00:00+00", recordingIds[0]])],
    ["the 30th of February", () => forged("default", ["1", "2026-02-30 10:00:00+00", recordingIds[0]])],
    ["hour 25", () => forged("default", ["1", "2026-03-14 25:00:00+00", recordingIds[0]])],
    ["not a UUID", () => forged("default", ["1", "2026-03-14 10:00:00+00", "' or 1=1 --"])],
    ["NULL where the key cannot be NULL", () => forged("default", [null, "2026-03-14 10:00:00+00", recordingIds[0]])],
    ["a cursor longer than 4000 characters", () => "A".repeat(4001)],
  ];
  for (const [name, cursor] of cases) {
    it(name, async () => {
      const { status, body } = await get(recordingsRoute.GET, `${url()}&cursor=${encodeURIComponent(cursor())}`);
      expect(status).toBe(422);
      expect(body.error?.code).toBe("unprocessable");
      expect(Object.keys(body.error?.fields ?? {})).toContain("cursor");
    });
  }

  it("NUL and a lone surrogate in a text key are refused before PostgreSQL sees them", async () => {
    for (const bad of ["PAGE\u0000", "PAGE\ud800"]) {
      const { status } = await get(recordingsRoute.GET, `${url()}&sort=name&dir=asc&cursor=${forged("name:asc", [bad, recordingIds[0]])}`);
      expect(status).toBe(422);
    }
    // an enum value that is not in the enum
    const { status } = await get(recordingsRoute.GET, `${url()}&sort=state&dir=asc&cursor=${forged("state:asc", ["lost", recordingIds[0]])}`);
    expect(status).toBe(422);
  });

  it("a well-formed forged cursor only positions the list: another organisation sees none of these rows", async () => {
    const cursor = forged("default", ["-1", "1970-01-01 00:00:00+00", "00000000-0000-0000-0000-000000000000"]);
    const mine = await get(recordingsRoute.GET, `${url()}&cursor=${cursor}`);
    expect(mine.status).toBe(200);
    expect(mine.body.items).toHaveLength(3);
    const theirs = await get(recordingsRoute.GET, `/api/recordings?flightId=${flight.id}&pageSize=3&cursor=${cursor}`, actors.other);
    expect(theirs.status).toBe(200);
    expect(theirs.body.items).toEqual([]);
  });

  it("bad cursors on the other lists are 422 too", async () => {
    const junk = Buffer.from(JSON.stringify({ o: "default", v: ["x"] })).toString("base64url");
    for (const [handler, u] of [
      [jobsRoute.GET, `/api/jobs?cursor=${junk}`],
      [flightsRoute.GET, `/api/flights?cursor=${junk}`],
      [clientsRoute.GET, `/api/clients?cursor=${junk}`],
      [sitesRoute.GET, `/api/sites?cursor=${junk}`],
      [findingsRoute.GET, `/api/findings?jobId=${flight.jobId}&cursor=${junk}`],
      [shareLinksRoute.GET, `/api/share-links?jobId=${flight.jobId}&cursor=${junk}`],
      [rangeChecksRoute.GET, `/api/range-checks?cursor=${junk}`],
      [viewsRoute.GET, `/api/collector/views?recordingId=${recordingIds[0]}&cursor=${junk}`],
    ] as [Handler, string][]) {
      const { status } = await get(handler, u);
      expect(status, u).toBe(422);
    }
  });
});

describe("deleted rows and page sizes", () => {
  it("a recording deleted between two pages is simply absent; the walk goes on", async () => {
    const first = await get(recordingsRoute.GET, `/api/recordings?flightId=${flight.id}&pageSize=4`);
    const next = first.body.nextCursor!;
    const gone = (await onePage(recordingsRoute.GET, `/api/recordings?flightId=${flight.id}`))[5];
    await db().update(s.recordings).set({ deletedAt: new Date() }).where(eq(s.recordings.id, gone));
    const second = await get(recordingsRoute.GET, `/api/recordings?flightId=${flight.id}&pageSize=4&cursor=${next}`);
    expect(second.status).toBe(200);
    expect(second.body.items.map((i) => i.id)).not.toContain(gone);
    expect(second.body.items).toHaveLength(4);
    await db().update(s.recordings).set({ deletedAt: null }).where(eq(s.recordings.id, gone));
  });

  it("a page size over 200 is refused", async () => {
    const { status } = await get(recordingsRoute.GET, `/api/recordings?flightId=${flight.id}&pageSize=201`);
    expect(status).toBe(422);
  });
});

