// The custody list (GET /api/custody): newest first by default, keyset pages of a bounded size that
// neither skip nor repeat an event (also when events are appended between pages), filters by kind of
// event, person and date, plain names for derived files; bad parameters are 422, another organisation
// gets 404, a client account 403. Also GET /api/custody/filters. Real PostgreSQL.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import * as list from "@/app/api/custody/route";
import * as filters from "@/app/api/custody/filters/route";
import { recordCustodyEvent, type CustodyInput } from "@/lib/custody/record-custody-event";
import { demoActors, demoOrganisationId, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight, makeRecording } from "@/tests/support/factories";
import { makeStoredRecording } from "../sharing/share-fixtures";
import { closeRedis } from "@/lib/queue/redis";

type Item = { id: string; seq: number; eventType: string; actorUserId: string | null; fileKind: string | null; recordingName: string | null; recordingId: string | null; jobTitle: string | null };
type Answer = { items: Item[]; total: number; nextCursor: string | null };

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let jobId: string;
let jobTitle: string;
let recordingId: string;

const get = async (who: DemoActorKey, qs: string) => list.GET(await req(actors[who], "GET", `/api/custody?${qs}`));
const json = async (who: DemoActorKey, qs: string) => {
  const res = await get(who, qs);
  expect(res.status, `${qs}: ${res.status}`).toBe(200);
  return (await res.json()) as Answer;
};
/** Every page of a query, following nextCursor. */
async function allPages(qs: string): Promise<{ pages: Item[][]; total: number }> {
  const pages: Item[][] = [];
  let cursor: string | null = null;
  let total = 0;
  do {
    const a = await json("owner", `${qs}${cursor ? `&cursor=${cursor}` : ""}`);
    pages.push(a.items);
    total = a.total;
    cursor = a.nextCursor;
  } while (cursor && pages.length < 50);
  return { pages, total };
}

const VIEWS = 60;
const DOWNLOADS = 5;
const SHARE_OPENS = 2;
const KINDS = ["playable", "poster", "sprite", "thumbnails_vtt"] as const;
const EVENTS = 1 + 1 + KINDS.length + VIEWS + DOWNLOADS + SHARE_OPENS;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId);
  jobId = flight.jobId;
  [{ title: jobTitle }] = await db().select({ title: s.jobs.title }).from(s.jobs).where(eq(s.jobs.id, jobId));
  const rec = await makeStoredRecording(orgId, jobId, flight.id, { name: "north-face-pass.264" });
  recordingId = rec.id;
  const base = { organisationId: orgId, jobId };
  const ev = (e: Omit<CustodyInput, "organisationId" | "jobId">) => recordCustodyEvent({ ...base, ...e });
  await ev({ eventType: "upload", evidenceType: "recording", evidenceId: recordingId, actor: { userId: actors.pilot!.userId, role: "pilot" } });
  await ev({ eventType: "processing", evidenceType: "recording", evidenceId: recordingId, purpose: "derive playable video, stills, thumbnails and signal trace" });
  for (const kind of KINDS) await ev({ eventType: "derived", evidenceType: "rendition", evidenceId: randomUUID(), purpose: kind, details: { recordingId, kind } });
  for (let i = 0; i < VIEWS; i++) await ev({ eventType: "view", evidenceType: "recording", evidenceId: recordingId, actor: { userId: actors.reviewer!.userId, role: "reviewer" } });
  for (let i = 0; i < DOWNLOADS; i++) await ev({ eventType: "download", evidenceType: "recording", evidenceId: recordingId, actor: { userId: actors.owner!.userId, role: "owner" } });
  for (let i = 0; i < SHARE_OPENS; i++) await ev({ eventType: "share_open", evidenceType: "share_link", evidenceId: randomUUID(), actor: { shareLinkId: randomUUID() } });
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("custody list: order and keyset pages", () => {
  it("lists a job's trail newest first by default, in pages of the asked size that together hold every event once", async () => {
    const { pages, total } = await allPages(`jobId=${jobId}&pageSize=25`);
    // the count is checked against the table itself
    const [{ n }] = await db().select({ n: count() }).from(s.custodyEvents).where(and(eq(s.custodyEvents.organisationId, orgId), eq(s.custodyEvents.jobId, jobId)));
    expect(total).toBe(n);
    expect(total).toBe(EVENTS);
    expect(pages.map((p) => p.length)).toEqual([25, 25, EVENTS - 50]);
    const seqs = pages.flat().map((e) => e.seq);
    expect(new Set(seqs).size).toBe(EVENTS);
    for (let i = 1; i < seqs.length; i++) expect(seqs[i]).toBeLessThan(seqs[i - 1]);
    expect(pages.flat()[0].eventType).toBe("share_open");
  });

  it("oldest first is chain order, the exact reverse", async () => {
    const newest = (await allPages(`jobId=${jobId}&pageSize=200`)).pages.flat().map((e) => e.id);
    const oldest = (await allPages(`jobId=${jobId}&order=oldest&pageSize=30`)).pages.flat().map((e) => e.id);
    expect(oldest).toEqual([...newest].reverse());
    expect((await json("owner", `jobId=${jobId}&order=oldest&pageSize=1`)).items[0].eventType).toBe("upload");
  });

  it("a page opened by a cursor is the same after new events were appended (no shift, no repeat)", async () => {
    const first = await json("owner", `recordingId=${recordingId}&pageSize=10`);
    const second = await json("owner", `recordingId=${recordingId}&pageSize=10&cursor=${first.nextCursor}`);
    for (let i = 0; i < 3; i++) await recordCustodyEvent({ organisationId: orgId, jobId, eventType: "view", evidenceType: "recording", evidenceId: recordingId, actor: { userId: actors.owner!.userId, role: "owner" } });
    const again = await json("owner", `recordingId=${recordingId}&pageSize=10&cursor=${first.nextCursor}`);
    expect(again.items.map((e) => e.id)).toEqual(second.items.map((e) => e.id));
    expect(again.total).toBe(second.total + 3);
    // the new events head the first page
    const head = await json("owner", `recordingId=${recordingId}&pageSize=3`);
    expect(head.items.every((e) => e.actorUserId === actors.owner!.userId && e.eventType === "view")).toBe(true);
  });

  it("gives plain names: the derived file's kind, the recording's file name, the job's title", async () => {
    const a = await json("owner", `jobId=${jobId}&eventType=derived`);
    expect(a.total).toBe(KINDS.length);
    expect(a.items.map((e) => e.fileKind).sort()).toEqual([...KINDS].sort());
    for (const e of a.items) {
      expect(e.recordingName).toBe("north-face-pass.264");
      expect(e.recordingId).toBe(recordingId);
      expect(e.jobTitle).toBe(jobTitle);
    }
  });
});

describe("custody list: the recording an event names", () => {
  it("a details recordingId that is no UUID, or names another organisation's recording, names nothing (and errs nowhere)", async () => {
    const other = actors.other!.organisationId!;
    const theirFlight = await makeFlight(other);
    const theirs = await makeRecording(other, theirFlight, { originalName: "their-secret-pass.264" });
    const flight = await makeFlight(orgId);
    const mark = (details: Record<string, unknown>) =>
      recordCustodyEvent({ organisationId: orgId, jobId: flight.jobId, eventType: "derived", evidenceType: "rendition", evidenceId: randomUUID(), purpose: "poster", details: { kind: "poster", ...details } });
    await mark({ recordingId: "not-a-uuid'; select 1 --" });
    await mark({ recordingId: 42 });
    await mark({ recordingId: theirs.id });
    const a = await json("owner", `jobId=${flight.jobId}`);
    expect(a.items).toHaveLength(3);
    const byName = a.items.map((e) => [e.recordingId, e.recordingName]);
    // the string that is no UUID and the number are never cast; the foreign recording's id is kept as the
    // event's own record says, but its name is not read across organisations
    expect(byName).toEqual([
      [theirs.id, null],
      [null, null],
      [null, null],
    ]);
  });
});

describe("custody list: filters", () => {
  it("by kind of event, one or several", async () => {
    expect((await json("owner", `jobId=${jobId}&eventType=download`)).total).toBe(DOWNLOADS);
    const both = await json("owner", `jobId=${jobId}&eventType=download,share_open&pageSize=200`);
    expect(both.total).toBe(DOWNLOADS + SHARE_OPENS);
    expect(new Set(both.items.map((e) => e.eventType))).toEqual(new Set(["download", "share_open"]));
  });

  it("by person, by Cairn itself, by a client through a share link", async () => {
    const reviewer = await json("owner", `jobId=${jobId}&actor=${actors.reviewer!.userId}&pageSize=200`);
    expect(reviewer.total).toBe(VIEWS);
    expect(reviewer.items.every((e) => e.actorUserId === actors.reviewer!.userId)).toBe(true);
    expect((await json("owner", `jobId=${jobId}&actor=system`)).total).toBe(1 + KINDS.length);
    expect((await json("owner", `jobId=${jobId}&actor=share`)).total).toBe(SHARE_OPENS);
    // filters combine
    expect((await json("owner", `jobId=${jobId}&actor=${actors.reviewer!.userId}&eventType=download`)).total).toBe(0);
  });

  it("by UTC date, both days included", async () => {
    const today = new Date().toISOString().slice(0, 10);
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    const all = (await json("owner", `jobId=${jobId}`)).total;
    expect((await json("owner", `jobId=${jobId}&from=${today}&to=${today}`)).total).toBe(all);
    expect((await json("owner", `jobId=${jobId}&from=${tomorrow}`)).total).toBe(0);
    expect((await json("owner", `jobId=${jobId}&to=${yesterday}`)).total).toBe(0);
  });

  it("the organisation's whole log filters too, and holds this job's events", async () => {
    const a = await json("owner", `actor=${actors.reviewer!.userId}&eventType=view&pageSize=5`);
    expect(a.items).toHaveLength(5);
    expect(a.items.every((e) => e.eventType === "view")).toBe(true);
  });
});

describe("custody list: refusals", () => {
  it.each([
    ["pageSize=201", "pageSize"],
    ["pageSize=0", "pageSize"],
    ["cursor=abc", "cursor"],
    ["cursor=0", "cursor"],
    ["cursor=99999999999999999999", "cursor"],
    ["eventType=nonsense", "eventType"],
    ["eventType=view%00", "eventType"],
    ["actor=someone", "actor"],
    ["from=2026-02-30", "from"],
    ["from=2026-03-14&to=2026-03-01", "to"],
    ["order=sideways", "order"],
    ["recordingId=not-an-id", "recordingId"],
  ])("%s is a 422 naming the field", async (qs, field) => {
    const res = await get("owner", `jobId=${jobId}&${qs}`);
    expect(res.status).toBe(422);
    const named = Object.keys((await res.json()).error.fields ?? {});
    expect(named.some((k) => k === field || k.startsWith(`${field}.`)), named.join()).toBe(true);
  });

  it("another organisation gets 404 for the job and the recording, and its own log holds none of these events", async () => {
    expect((await get("other", `jobId=${jobId}`)).status).toBe(404);
    expect((await get("other", `recordingId=${recordingId}`)).status).toBe(404);
    const theirs = await json("other", `pageSize=200`);
    expect(theirs.items.some((e) => e.jobTitle === jobTitle)).toBe(false);
    expect((await json("other", `actor=${actors.reviewer!.userId}`)).total).toBe(0);
  });

  it("a client account gets 403, nobody signed in 401", async () => {
    expect((await get("client", `jobId=${jobId}`)).status).toBe(403);
    expect((await get("anonymous", `jobId=${jobId}`)).status).toBe(401);
  });
});

describe("custody filter choices", () => {
  const choices = async (who: DemoActorKey, qs = "") => filters.GET(await req(actors[who], "GET", `/api/custody/filters${qs}`));

  it("names the organisation's people and a job's recordings", async () => {
    const res = await choices("reviewer", `?jobId=${jobId}`);
    expect(res.status).toBe(200);
    const body = (await res.json()) as { people: { userId: string; name: string }[]; recordings: { id: string; name: string }[] };
    expect(body.people.map((p) => p.userId)).toEqual(expect.arrayContaining([actors.owner!.userId, actors.pilot!.userId, actors.reviewer!.userId]));
    expect(body.people.map((p) => p.userId)).not.toContain(actors.other!.userId);
    expect(body.recordings).toEqual([expect.objectContaining({ id: recordingId, name: "north-face-pass.264" })]);
  });

  it("refuses another organisation's job (404), a client account (403), a bad id (422)", async () => {
    expect((await choices("other", `?jobId=${jobId}`)).status).toBe(404);
    expect((await choices("client", `?jobId=${jobId}`)).status).toBe(403);
    expect((await choices("owner", `?jobId=nope`)).status).toBe(422);
  });
});
