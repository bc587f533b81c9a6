// Recordings lists per flight and per job, tags, and the original download, through the route
// handlers against the real Postgres. Downloads are checked byte for byte against the source file
// (sha256sum), the Content-Disposition with jshttp's content-disposition parser (vendored by next),
// and Repr-Digest against Node crypto's base64 digest of the bytes received (RFC 9530 section 3).
import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import contentDisposition from "next/dist/compiled/content-disposition";
import * as list from "@/app/api/recordings/route";
import * as one from "@/app/api/recordings/[id]/route";
import * as original from "@/app/api/recordings/[id]/original/route";
import * as tagsRoute from "@/app/api/recordings/[id]/tags/route";
import { db, closeDb } from "@/db/client";
import { custodyEvents, recordings } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { storedBytes, writeStoredBytes } from "@/tests/support/stored-files";
import { demoActors, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { startUploadServer } from "@/tests/support/upload-server";
import { makeMp4, makeRawH264, sha256sum } from "@/tests/support/media/make-upload-fixtures";
import { cookieOf, metadataFor, tusUpload, type Target } from "./upload-helpers";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let a: Target; // flight A of job J
let b: Target; // flight B of job J
let other: Target;
let raw: { id: string; sha: string; file: string };
let mp4: { id: string; sha: string; file: string };
let otherOrgRecordingId: string;
let close: () => Promise<void>;

beforeAll(async () => {
  actors = await demoActors();
  orgId = actors.pilot!.organisationId;
  const fa = await makeFlight(orgId);
  a = { jobId: fa.jobId, flightId: fa.id };
  const fb = await makeFlight(orgId, { jobId: fa.jobId, flownOn: "2026-03-15" });
  b = { jobId: fb.jobId, flightId: fb.id };
  const fo = await makeFlight(actors.other!.organisationId);
  other = { jobId: fo.jobId, flightId: fo.id };

  const server = await startUploadServer();
  close = server.close;
  const pilot = await cookieOf(actors.pilot);
  const up = async (file: string, t: Target, name: string, headers = pilot) => {
    const r = await tusUpload({ endpoint: server.url, source: file, metadata: metadataFor(t, name, { lastModified: "1773480000000" }), headers });
    return { id: r.headers["Cairn-Recording-Id"], sha: await sha256sum(file), file };
  };
  const rawFile = await makeRawH264({ seconds: 1, pattern: "yuvtestsrc" });
  raw = await up(rawFile, a, "Überflug Süd 1.264");
  mp4 = await up(await makeMp4(), b, "CAM_0001.MP4");
  otherOrgRecordingId = (await up(await makeRawH264({ seconds: 1, pattern: "rgbtestsrc" }), other, "theirs.264", await cookieOf(actors.other))).id;
  // a recording the worker has started on, to see state and progress in the list
  await db().update(recordings).set({ state: "processing", progress: 42, durationSec: 1.0 }).where(eq(recordings.id, mp4.id));
});
afterAll(async () => {
  await close();
  await closeQueues();
  await closeDb();
  await closeRedis();
});

type Item = { id: string; originalName: string; state: string; progress: number; tags: string[]; sizeBytes: number; kind: string; sha256: string; durationSec: number | null; flownOn: string };
async function listOf(actor: Actor, query: string): Promise<{ items: Item[]; total: number }> {
  const res = await list.GET(await req(actor, "GET", `/api/recordings?${query}`));
  expect(res.status).toBe(200);
  return res.json();
}

describe("recordings lists", () => {
  it("per flight: only that flight's recordings, with name, size, kind, hash, state and progress", async () => {
    const { items, total } = await listOf(actors.pilot, `flightId=${a.flightId}`);
    expect(total).toBe(1);
    expect(items[0]).toMatchObject({ id: raw.id, originalName: "Überflug Süd 1.264", kind: "raw_h264", sha256: raw.sha, state: "waiting", progress: 0, tags: [] });
    const mp4Row = (await listOf(actors.pilot, `flightId=${b.flightId}`)).items[0];
    expect(mp4Row).toMatchObject({ id: mp4.id, kind: "mp4", state: "processing", progress: 42, durationSec: 1, flownOn: "2026-03-15" });
  });

  it("per job: the recordings of all its flights", async () => {
    const { items } = await listOf(actors.pilot, `jobId=${a.jobId}&sort=name`);
    expect(items.map((i) => i.id)).toEqual([mp4.id, raw.id]); // "CAM_0001.MP4" < "Überflug…" by lower-case name
  });

  it("filters by state, kind, tag and text, and sorts by size", async () => {
    expect((await listOf(actors.pilot, `jobId=${a.jobId}&state=processing`)).items.map((i) => i.id)).toEqual([mp4.id]);
    expect((await listOf(actors.pilot, `jobId=${a.jobId}&kind=raw_h264`)).items.map((i) => i.id)).toEqual([raw.id]);
    expect((await listOf(actors.pilot, `jobId=${a.jobId}&q=s%C3%BCd`)).items.map((i) => i.id)).toEqual([raw.id]);
    expect((await listOf(actors.pilot, `jobId=${a.jobId}&q=${raw.sha}`)).items.map((i) => i.id)).toEqual([raw.id]);
    const bySize = (await listOf(actors.pilot, `jobId=${a.jobId}&sort=size&dir=desc`)).items;
    expect(bySize[0].sizeBytes).toBeGreaterThanOrEqual(bySize[1].sizeBytes);
  });

  it("another organisation's flight lists nothing; its recording answers 404", async () => {
    expect((await listOf(actors.pilot, `flightId=${other.flightId}`)).total).toBe(0);
    expect((await one.GET(await req(actors.pilot, "GET", "/x"), route({ id: otherOrgRecordingId }))).status).toBe(404);
  });

  it("bad parameters are 422; no session is 401; a client account may read", async () => {
    expect((await list.GET(await req(actors.pilot, "GET", "/api/recordings?flightId=nope"))).status).toBe(422);
    expect((await list.GET(await req(actors.pilot, "GET", "/api/recordings?sort=hash"))).status).toBe(422);
    expect((await list.GET(await req(null, "GET", `/api/recordings?flightId=${a.flightId}`))).status).toBe(401);
    expect((await list.GET(await req(actors.client, "GET", `/api/recordings?flightId=${a.flightId}`))).status).toBe(200);
  });

  it("one recording, by id", async () => {
    const res = await one.GET(await req(actors.reviewer, "GET", "/x"), route({ id: raw.id }));
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ id: raw.id, sha256: raw.sha, jobId: a.jobId, flightId: a.flightId });
  });
});

describe("tags", () => {
  const add = async (actor: Actor, id: string, body: unknown) => tagsRoute.POST(await req(actor, "POST", "/x", body), route({ id }));
  const remove = async (actor: Actor, id: string, name: string) => tagsRoute.DELETE(await req(actor, "DELETE", `/x?name=${encodeURIComponent(name)}`), route({ id }));

  it("add, match regardless of case, filter by, and remove", async () => {
    expect(await (await add(actors.pilot, raw.id, { name: "  north   face " })).json()).toEqual({ tags: ["north face"] });
    expect(await (await add(actors.reviewer, raw.id, { name: "North Face" })).json()).toEqual({ tags: ["north face"] });
    expect(await (await add(actors.pilot, raw.id, { name: "crack" })).json()).toEqual({ tags: ["crack", "north face"] });
    expect((await listOf(actors.pilot, `jobId=${a.jobId}&tag=CRACK`)).items.map((i) => i.id)).toEqual([raw.id]);
    expect((await listOf(actors.pilot, `flightId=${a.flightId}`)).items[0].tags).toEqual(["crack", "north face"]);
    expect(await (await remove(actors.pilot, raw.id, "Crack")).json()).toEqual({ tags: ["north face"] });
  });

  it("refusals: client role 403, another organisation's recording 404, bad names 422", async () => {
    expect((await add(actors.client, raw.id, { name: "x" })).status).toBe(403);
    expect((await add(actors.pilot, otherOrgRecordingId, { name: "x" })).status).toBe(404);
    expect((await add(actors.pilot, raw.id, { name: "   " })).status).toBe(422);
    expect((await add(actors.pilot, raw.id, { name: "a\u0000b" })).status).toBe(422);
    expect((await add(actors.pilot, raw.id, { name: "x".repeat(41) })).status).toBe(422);
    expect((await add(actors.pilot, raw.id, "{oops")).status).toBe(400);
  });
});

describe("original download", () => {
  const download = async (actor: Actor, id: string, method = "GET") => original.GET(await req(actor, method, `/api/recordings/${id}/original`), route({ id }));
  const downloads = (id: string) => db().$count(custodyEvents, and(eq(custodyEvents.evidenceId, id), eq(custodyEvents.eventType, "download")));

  it("sends the exact bytes as an attachment with a safe name, nosniff, and the SHA-256; one custody event", async () => {
    const before = await downloads(raw.id);
    const res = await download(actors.reviewer, raw.id);
    expect(res.status).toBe(200);
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(createHash("sha256").update(bytes).digest("hex")).toBe(raw.sha);
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("content-type")).toBe("application/octet-stream");
    expect(res.headers.get("content-length")).toBe(String(bytes.length));
    expect(res.headers.get("cairn-original-sha256")).toBe(raw.sha);
    expect(res.headers.get("repr-digest")).toBe(`sha-256=:${createHash("sha256").update(bytes).digest("base64")}:`);
    const cd = contentDisposition.parse(res.headers.get("content-disposition")!);
    expect(cd.type).toBe("attachment");
    expect(cd.parameters.filename).toBe("Überflug Süd 1.264"); // the parser prefers filename* (RFC 6266 4.3)
    expect(await downloads(raw.id)).toBe(before + 1);
    const [event] = await db()
      .select()
      .from(custodyEvents)
      .where(and(eq(custodyEvents.evidenceId, raw.id), eq(custodyEvents.eventType, "download")));
    expect(event).toMatchObject({ actorUserId: actors.reviewer!.userId, actorRole: "reviewer", originalSha256: raw.sha });
  });

  it("MP4 goes out as video/mp4; HEAD gives the headers without logging a download", async () => {
    const before = await downloads(mp4.id);
    const head = await download(actors.pilot, mp4.id, "HEAD");
    expect(head.status).toBe(200);
    expect(head.headers.get("content-type")).toBe("video/mp4");
    expect(head.headers.get("cairn-original-sha256")).toBe(mp4.sha);
    expect(await downloads(mp4.id)).toBe(before);
  });

  it("role and organisation: a client account 403, another organisation 404, no session 401", async () => {
    expect((await download(actors.client, raw.id)).status).toBe(403);
    expect((await download(actors.pilot, otherOrgRecordingId)).status).toBe(404);
    expect((await download(null, raw.id)).status).toBe(401);
    expect((await download(actors.pilot, "not-an-id")).status).toBe(404);
  });

  it("a stored original altered behind Cairn's back is not delivered as if intact", async () => {
    const file = await makeRawH264({ seconds: 1, pattern: "smptebars", width: 320, height: 240 });
    const server = await startUploadServer();
    const t = await tusUpload({ endpoint: server.url, source: file, metadata: metadataFor(a, "tampered.264"), headers: await cookieOf(actors.pilot) });
    await server.close();
    const id = t.headers["Cairn-Recording-Id"];
    const [row] = await db().select().from(recordings).where(eq(recordings.id, id));
    const bytes = await storedBytes(row.storageKey!);
    bytes[200] = 0xff; // one byte, same size
    await writeStoredBytes(row.storageKey!, bytes);
    const res = await download(actors.pilot, id);
    expect(res.status).toBe(200); // headers go out before the last byte is read...
    await expect(res.arrayBuffer()).rejects.toThrow(); // ...but the body ends in an error, never "complete"
  });
});
