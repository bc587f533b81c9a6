// Findings through the API against the real Postgres: marking at a frame or over a range, refusing
// what does not fit the recording with nothing saved half-way, history of every edit, recorded deletion.
import { clientOf, tieClientAccount } from "@/tests/support/client-scope";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import * as list from "@/app/api/findings/route";
import * as one from "@/app/api/findings/[id]/route";
import * as history from "@/app/api/findings/[id]/history/route";
import * as categories from "@/app/api/finding-categories/route";
import * as category from "@/app/api/finding-categories/[id]/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { timeOfFrame } from "@/lib/timecode/time-of-frame";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeProcessedRecording, type ProcessedRecording } from "@/tests/support/media/make-processed-recording";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let rec: ProcessedRecording;
let frameCount: number;
let otherOrgCategoryId: string;

const post = async (who: Actor, body: unknown) => list.POST(await req(who, "POST", "/api/findings", body));
const counts = async () => ({
  findings: await db().$count(s.findings),
  revisions: await db().$count(s.findingRevisions),
  stills: await db().$count(s.stills),
  custody: await db().$count(s.custodyEvents),
});

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId);
  rec = await makeProcessedRecording(orgId, flight, { seconds: 2, fps: 30 });
  // the demo client account may see this job (its client is tied to it)
  await tieClientAccount(actors.client!, await clientOf({ flightId: flight.id }));
  frameCount = rec.recording.facts!.frameCount!;
  const [c] = await db().insert(s.findingCategories).values({ organisationId: actors.other!.organisationId, name: "Theirs" }).returning();
  otherOrgCategoryId = c.id;
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

describe("marking a finding", () => {
  it("at a frame: 201, seconds from the exact rate, first revision, pending still, custody event", async () => {
    const [cat] = await db().select().from(s.findingCategories).where(eq(s.findingCategories.organisationId, orgId)).limit(1);
    const res = await post(actors.reviewer, { recordingId: rec.recording.id, startFrame: 37, severity: "major", categoryId: cat.id, note: "Crack at the weld", box: { x: 0.1, y: 0.2, w: 0.3, h: 0.25 } });
    expect(res.status).toBe(201);
    const f = await res.json();
    expect(f).toMatchObject({ startFrame: 37, endFrame: null, severity: "major", categoryName: cat.name, note: "Crack at the weld", version: 1, recordingSha256: rec.recording.sha256 });
    expect(f.startSec).toBe(timeOfFrame(37, { num: 30, den: 1 }));
    expect(f.still).toMatchObject({ state: "pending", frameNumber: 37 });
    const revs = await db().select().from(s.findingRevisions).where(eq(s.findingRevisions.findingId, f.id));
    expect(revs.map((r) => [r.version, r.action])).toEqual([[1, "created"]]);
    expect(revs[0].snapshot).toMatchObject({ severity: "major", nbiRating: 4, startFrame: 37 });
    const [ev] = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, f.id), eq(s.custodyEvents.eventType, "finding_created")));
    expect(ev.originalSha256).toBe(rec.recording.sha256);
  });

  it("over a range, or at a time (rounded to the frame on screen)", async () => {
    const range = await (await post(actors.owner, { recordingId: rec.recording.id, startFrame: 10, endFrame: 20, severity: "minor" })).json();
    expect([range.startFrame, range.endFrame, range.endSec]).toEqual([10, 20, timeOfFrame(20, { num: 30, den: 1 })]);
    // 1.01 s at 30 fps lies inside frame 30 (1.000..1.033 s)
    const timed = await (await post(actors.reviewer, { recordingId: rec.recording.id, startSec: 1.01, severity: "note" })).json();
    expect(timed.startFrame).toBe(30);
  });

  const matrix: [DemoActorKey, number][] = [
    ["owner", 201],
    ["reviewer", 201],
    ["pilot", 403],
    ["client", 403],
    ["other", 404],
    ["anonymous", 401],
  ];
  it.each(matrix)("%s marking a finding: %i", async (who, status) => {
    const res = await post(actors[who], { recordingId: rec.recording.id, startFrame: 5, severity: "minor" });
    expect(res.status).toBe(status);
  });

  it("HTML in a note is stored as the text typed, not interpreted", async () => {
    const note = `<img src=x onerror="alert(1)"><script>alert('x')</script> & "quotes"`;
    const f = await (await post(actors.reviewer, { recordingId: rec.recording.id, startFrame: 1, severity: "note", note })).json();
    const [row] = await db().select({ note: s.findings.note }).from(s.findings).where(eq(s.findings.id, f.id));
    expect(row.note).toBe(note);
    const back = await (await one.GET(await req(actors.reviewer, "GET", "/x"), route({ id: f.id }))).json();
    expect(back.note).toBe(note);
  });
});

describe("bad input: a clear 4xx and nothing saved half-way", () => {
  const base = () => ({ recordingId: rec.recording.id, severity: "minor" });
  const cases: [string, () => unknown, number, string][] = [
    ["a frame past the end", () => ({ ...base(), startFrame: frameCount }), 422, "startFrame"],
    ["a time past the end", () => ({ ...base(), startSec: 2.5 }), 422, "startSec"],
    ["a negative time", () => ({ ...base(), startSec: -0.5 }), 422, "startSec"],
    ["a negative frame", () => ({ ...base(), startFrame: -1 }), 422, "startFrame"],
    ["a fractional frame", () => ({ ...base(), startFrame: 2.5 }), 422, "startFrame"],
    ["a severity not in the list", () => ({ ...base(), startFrame: 3, severity: "catastrophic" }), 422, "severity"],
    ["a range longer than the recording", () => ({ ...base(), startFrame: 0, endFrame: frameCount + 30 }), 422, "endFrame"],
    ["a range ending at a time past the end", () => ({ ...base(), startFrame: 0, endSec: 60 }), 422, "endSec"],
    ["a range ending before it starts", () => ({ ...base(), startFrame: 20, endFrame: 10 }), 422, "endFrame"],
    ["no moment at all", () => base(), 422, "startFrame"],
    ["a box outside the frame", () => ({ ...base(), startFrame: 3, box: { x: 0.8, y: 0.1, w: 0.5, h: 0.1 } }), 422, "box"],
    ["latitude without longitude", () => ({ ...base(), startFrame: 3, latitude: 54.4 }), 422, "longitude"],
    ["a category of another organisation", () => ({ ...base(), startFrame: 3, categoryId: otherOrgCategoryId }), 422, "categoryId"],
    ["an over-long note", () => ({ ...base(), startFrame: 3, note: "x".repeat(4001) }), 422, "note"],
    ["an unknown field", () => ({ ...base(), startFrame: 3, deletedAt: "2026-01-01" }), 422, "_"],
    ["malformed JSON", () => "{severity:", 400, ""],
  ];
  it.each(cases)("%s -> %i", async (_label, body, status, field) => {
    const before = await counts();
    const res = await post(actors.reviewer, body());
    expect(res.status).toBe(status);
    const json = await res.json();
    expect(typeof json.error.message).toBe("string");
    if (field) expect(Object.keys(json.error.fields ?? {}).some((k) => k === field || k.startsWith(`${field}.`))).toBe(true);
    expect(await counts()).toEqual(before);
  });

  it("a recording still processing cannot take findings yet (409)", async () => {
    const [r] = await db().update(s.recordings).set({ state: "processing" }).where(eq(s.recordings.id, rec.recording.id)).returning();
    try {
      const res = await post(actors.reviewer, { recordingId: r.id, startFrame: 1, severity: "minor" });
      expect(res.status).toBe(409);
    } finally {
      await db().update(s.recordings).set({ state: "ready" }).where(eq(s.recordings.id, rec.recording.id));
    }
  });
});

describe("editing and deleting keep the history", () => {
  it("each edit is a new version; a stale edit is refused; moving asks for a new still", async () => {
    const f = await (await post(actors.reviewer, { recordingId: rec.recording.id, startFrame: 12, severity: "minor", note: "first" })).json();
    const patch = async (body: unknown, who: Actor = actors.reviewer) => one.PATCH(await req(who, "PATCH", "/x", body), route({ id: f.id }));
    const r1 = await patch({ severity: "severe", note: "worse than it looked", version: 1 });
    expect(r1.status).toBe(200);
    expect(await r1.json()).toMatchObject({ version: 2, severity: "severe", note: "worse than it looked", still: { frameNumber: 12 } });
    expect((await patch({ note: "lost update", version: 1 })).status).toBe(409);
    expect((await patch({ note: "a pilot edit" }, actors.pilot)).status).toBe(403);
    expect((await patch({ startFrame: frameCount + 1 })).status).toBe(422);
    const moved = await (await patch({ startFrame: 40 })).json();
    expect(moved).toMatchObject({ version: 3, startFrame: 40, still: { frameNumber: 40, state: "pending" } });
    const h = await (await history.GET(await req(actors.client, "GET", "/x"), route({ id: f.id }))).json();
    expect(h.items.map((i: { version: number; action: string }) => [i.version, i.action])).toEqual([[1, "created"], [2, "updated"], [3, "updated"]]);
    expect(h.items[0].snapshot.note).toBe("first");
    expect(h.items[1].snapshot.severity).toBe("severe");
    expect(h.items[0].editedByName).toBe("Cleo Marchbank");
  });

  it("deletion is recorded: gone from lists, kept in history and the custody log", async () => {
    const f = await (await post(actors.reviewer, { recordingId: rec.recording.id, startFrame: 50, severity: "moderate" })).json();
    const del = await one.DELETE(await req(actors.owner, "DELETE", "/x", { reason: "duplicate of another finding" }), route({ id: f.id }));
    expect(del.status).toBe(200);
    expect((await one.GET(await req(actors.owner, "GET", "/x"), route({ id: f.id }))).status).toBe(404);
    const listed = await (await list.GET(await req(actors.owner, "GET", `/api/findings?recordingId=${rec.recording.id}`))).json();
    expect(listed.items.map((i: { id: string }) => i.id)).not.toContain(f.id);
    const [row] = await db().select().from(s.findings).where(eq(s.findings.id, f.id));
    expect(row.deletedAt).not.toBeNull();
    const h = await (await history.GET(await req(actors.owner, "GET", "/x"), route({ id: f.id }))).json();
    expect(h.items.at(-1)).toMatchObject({ version: 2, action: "deleted", snapshot: { reason: "duplicate of another finding" } });
    const events = await db().select({ t: s.custodyEvents.eventType }).from(s.custodyEvents).where(eq(s.custodyEvents.evidenceId, f.id)).orderBy(s.custodyEvents.seq);
    expect(events.map((e) => e.t)).toEqual(["finding_created", "finding_deleted"]);
    expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), route({ id: f.id }))).status).toBe(404);
  });

  it("another organisation can neither read, edit nor delete a finding", async () => {
    const f = await (await post(actors.reviewer, { recordingId: rec.recording.id, startFrame: 2, severity: "minor" })).json();
    const other = actors.other;
    expect((await one.GET(await req(other, "GET", "/x"), route({ id: f.id }))).status).toBe(404);
    expect((await one.PATCH(await req(other, "PATCH", "/x", { note: "x" }), route({ id: f.id }))).status).toBe(404);
    expect((await one.DELETE(await req(other, "DELETE", "/x"), route({ id: f.id }))).status).toBe(404);
    expect((await history.GET(await req(other, "GET", "/x"), route({ id: f.id }))).status).toBe(404);
    const theirs = await (await list.GET(await req(other, "GET", `/api/findings?recordingId=${rec.recording.id}`))).json();
    expect(theirs.total).toBe(0);
  });
});

describe("finding categories", () => {
  it("create, refuse a duplicate name, rename, archive; the asset's own categories first", async () => {
    const create = async (body: unknown, who: Actor = actors.reviewer) => categories.POST(await req(who, "POST", "/api/finding-categories", body));
    const res = await create({ name: "Lightning protection defect", assetKind: "tower" });
    expect(res.status).toBe(201);
    const c = await res.json();
    expect((await create({ name: "Lightning protection defect" })).status).toBe(409);
    expect((await create({ name: "x" }, actors.pilot)).status).toBe(403);
    expect((await create({ name: "" })).status).toBe(422);
    const renamed = await category.PATCH(await req(actors.reviewer, "PATCH", "/x", { name: "Earthing defect" }), route({ id: c.id }));
    expect((await renamed.json()).name).toBe("Earthing defect");
    const towers = await (await categories.GET(await req(actors.reviewer, "GET", "/api/finding-categories?assetKind=tower"))).json();
    const kinds = towers.items.map((i: { assetKind: string | null }) => i.assetKind);
    expect(kinds).not.toContain("roof");
    expect(kinds.indexOf(null)).toBeGreaterThan(kinds.lastIndexOf("tower"));
    expect((await category.DELETE(await req(actors.reviewer, "DELETE", "/x"), route({ id: c.id }))).status).toBe(200);
    const after = await (await categories.GET(await req(actors.reviewer, "GET", "/api/finding-categories"))).json();
    expect(after.items.map((i: { id: string }) => i.id)).not.toContain(c.id);
    // an archived category is not offered for new findings
    const f = await post(actors.reviewer, { recordingId: rec.recording.id, startFrame: 3, severity: "minor", categoryId: c.id });
    expect(f.status).toBe(422);
    expect((await category.PATCH(await req(actors.other, "PATCH", "/x", { name: "mine" }), route({ id: c.id }))).status).toBe(404);
  });
});
