// The media route against RFC 9110 range semantics and against authorization on every request.
// Byte-level oracle: the stored file read directly with node:fs, and its SHA-256 from node:crypto.
import { clientOf, tieClientAccount } from "@/tests/support/client-scope";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { readdir } from "node:fs/promises";
import { createHash } from "node:crypto";
import * as recordingFile from "@/app/api/media/recordings/[id]/[file]/route";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { env } from "@/lib/config/env";
import { signMediaGrant } from "@/lib/sharing/media-grant";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";
import { closeRedis } from "@/lib/queue/redis";
import { storedBytes, storeKind } from "@/tests/support/stored-files";
import { statKey } from "@/lib/storage/store";
import { demoActors, demoOrganisationId, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeProcessedRecording, type ProcessedRecording } from "@/tests/support/media/make-processed-recording";

let actors: Record<DemoActorKey, Actor>;
let rec: ProcessedRecording;
let playable: Buffer;
let playableKey: string;
const onS3 = storeKind() === "s3";

const params = (id: string, file: string) => ({ params: Promise.resolve({ id, file }) });
async function media(actor: Actor, file: string, headers: Record<string, string> = {}, method = "GET", id = rec.recording.id, query = "") {
  const url = `/api/media/recordings/${id}/${file}${query}`;
  return recordingFile[method === "HEAD" ? "HEAD" : "GET"](await req(actor, method, url, undefined, headers), params(id, file));
}
const bytes = async (res: Response) => Buffer.from(await res.arrayBuffer());
const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");

beforeAll(async () => {
  actors = await demoActors();
  const orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId);
  rec = await makeProcessedRecording(orgId, flight, { seconds: 2 });
  // the demo client account may see this job (its client is tied to it)
  await tieClientAccount(actors.client!, await clientOf({ flightId: flight.id }));
  const row = rec.renditions.find((r) => r.kind === "playable")!;
  playableKey = row.storageKey;
  playable = await storedBytes(row.storageKey);
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("RFC 9110 range requests on the playable rendition", () => {
  it("no Range: 200 with the whole file, Accept-Ranges advertised", async () => {
    const res = await media(actors.reviewer, "playable.mp4");
    expect(res.status).toBe(200);
    expect(res.headers.get("accept-ranges")).toBe("bytes"); // RFC 9110 14.3
    expect(res.headers.get("content-length")).toBe(String(playable.length));
    const body = await bytes(res);
    expect(sha256(body)).toBe(rec.renditions.find((r) => r.kind === "playable")!.sha256);
  });

  const L = () => playable.length;
  const cases: [string, (len: number) => string, (len: number) => [number, number]][] = [
    // RFC 9110 14.1.2 examples: "bytes=0-499" the first 500 bytes
    ["first bytes", () => "bytes=0-499", () => [0, 499]],
    // "bytes=-500" the final 500 bytes (suffix-range)
    ["suffix", () => "bytes=-500", (len) => [len - 500, len - 1]],
    // "bytes=9500-" from 9500 to the end (open end)
    ["open end", () => "bytes=100-", (len) => [100, len - 1]],
    // a last-pos at or past the end is clamped to length - 1
    ["clamped end", (len) => `bytes=200-${len + 100000}`, (len) => [200, len - 1]],
    // Safari's probe
    ["two-byte probe", () => "bytes=0-1", () => [0, 1]],
  ];
  it.each(cases)("%s: 206 with Content-Range FIRST-LAST/LENGTH and exactly those bytes", async (_n, header, expected) => {
    const [first, last] = expected(L());
    const res = await media(actors.reviewer, "playable.mp4", { range: header(L()) });
    expect(res.status).toBe(206);
    expect(res.headers.get("content-range")).toBe(`bytes ${first}-${last}/${L()}`);
    expect(res.headers.get("content-length")).toBe(String(last - first + 1));
    expect((await bytes(res)).equals(playable.subarray(first, last + 1))).toBe(true);
  });

  it("unsatisfiable range: 416 with Content-Range bytes */LENGTH", async () => {
    // RFC 9110 15.5.17 and 14.4: first-pos at or past the length cannot be satisfied
    const res = await media(actors.reviewer, "playable.mp4", { range: `bytes=${L()}-` });
    expect(res.status).toBe(416);
    expect(res.headers.get("content-range")).toBe(`bytes */${L()}`);
    expect((await bytes(res)).length).toBe(0);
  });

  it("headers: exact type, nosniff, never cached by shared caches", async () => {
    const res = await media(actors.reviewer, "playable.mp4", { range: "bytes=0-9" });
    expect(res.headers.get("content-type")).toBe("video/mp4");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    const cc = res.headers.get("cache-control")!;
    expect(cc).toContain("private"); // RFC 9111 5.2.2.7: a shared cache must not store it
    expect(cc).toContain("no-store");
    await res.arrayBuffer();
  });

  it("HEAD answers the length without a body; a stale If-Range gets the whole file", async () => {
    const head = await media(actors.reviewer, "playable.mp4", { range: "bytes=0-9" }, "HEAD");
    expect(head.status).toBe(200); // Range applies to GET only (RFC 9110 14.2)
    expect(head.headers.get("content-length")).toBe(String(L()));
    expect(head.body).toBeNull();
    // RFC 9110 13.1.5: If-Range with a validator that does not match means "send the whole thing"
    const stale = await media(actors.reviewer, "playable.mp4", { range: "bytes=0-9", "if-range": '"not-the-current-etag"' });
    expect(stale.status).toBe(200);
    expect((await bytes(stale)).length).toBe(L());
    const etag = head.headers.get("etag")!;
    const fresh = await media(actors.reviewer, "playable.mp4", { range: "bytes=0-9", "if-range": etag });
    expect(fresh.status).toBe(206);
    await fresh.arrayBuffer();
  });
});

describe("other derived files", () => {
  it("the WebVTT track is text/vtt and its relative sprite URL resolves through the media route", async () => {
    const res = await media(actors.reviewer, "thumbnails.vtt");
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/vtt; charset=utf-8");
    const vtt = await res.text();
    expect(vtt.startsWith("WEBVTT")).toBe(true); // W3C WebVTT: the file starts with WEBVTT
    const cue = vtt.split("\n").find((l) => l.includes("#xywh="))!;
    // URL resolution as a browser does it (WHATWG URL), against the track's own URL
    const trackUrl = `http://localhost/api/media/recordings/${rec.recording.id}/thumbnails.vtt`;
    const sprite = new URL(cue.trim(), trackUrl);
    const m = /^\/api\/media\/recordings\/([^/]+)\/([^/]+)$/.exec(sprite.pathname)!;
    expect(m[1]).toBe(rec.recording.id);
    const img = await media(actors.reviewer, m[2]);
    expect(img.status).toBe(200);
    expect(img.headers.get("content-type")).toBe("image/jpeg");
    const jpeg = await bytes(img);
    expect([jpeg[0], jpeg[1]]).toEqual([0xff, 0xd8]); // JPEG SOI marker (ITU-T T.81)
  });

  it("the poster is image/jpeg; unknown names and path tricks are 404", async () => {
    expect((await media(actors.reviewer, "poster.jpg")).headers.get("content-type")).toBe("image/jpeg");
    expect((await media(actors.reviewer, "original")).status).toBe(404);
    expect((await media(actors.reviewer, "..%2F..%2Foriginals")).status).toBe(404);
    expect((await media(actors.reviewer, "playable.mp4", {}, "GET", "not-a-uuid")).status).toBe(404);
  });
});

describe("authorization on every request", () => {
  const matrix: [DemoActorKey, number][] = [
    ["owner", 206],
    ["pilot", 206],
    ["reviewer", 206],
    ["client", 206], // a client account tied to the job's client may read its recordings
    ["other", 404], // another organisation: not found, not forbidden
    ["anonymous", 401],
  ];
  it.each(matrix)("%s asking for a range: %i", async (who, status) => {
    const res = await media(actors[who], "playable.mp4", { range: "bytes=0-99" });
    expect(res.status).toBe(status);
    if (status !== 206) {
      expect((await res.json()).error.code).toBe(status === 401 ? "unauthenticated" : "not_found");
      expect(res.headers.get("content-range")).toBeNull();
    } else await res.arrayBuffer();
  });

  it("each range request of one playback is checked, not only the first", async () => {
    const first = await media(actors.reviewer, "playable.mp4", { range: "bytes=0-99" });
    expect(first.status).toBe(206);
    await first.arrayBuffer();
    // same URL, next range, but without the session (as a copied URL would be opened)
    const next = await media(null, "playable.mp4", { range: "bytes=100-199" });
    expect(next.status).toBe(401);
    const forged = await media(null, "playable.mp4", { range: "bytes=100-199", cookie: "next-auth.session-token=forged" });
    expect(forged.status).toBe(401);
  });

  it("a share link's signed grant opens nothing here (shared media has its own route, /api/s/media): the session alone decides", async () => {
    const [link] = await db()
      .insert(s.shareLinks)
      .values({
        organisationId: rec.recording.organisationId,
        jobId: rec.recording.jobId,
        scope: "recording",
        recordingId: rec.recording.id,
        tokenHash: hashShareToken(generateShareToken()),
        label: "media route test",
        expiresAt: new Date(Date.now() + 3600_000),
      })
      .returning();
    const grant = signMediaGrant({ linkId: link.id, kind: "playable", resourceId: rec.recording.id, expiresAt: Math.floor(Date.now() / 1000) + 300 }, env().MEDIA_SIGNING_KEY);
    const anonymous = await media(null, "playable.mp4", { range: "bytes=0-9" }, "GET", rec.recording.id, `?token=${grant}`);
    expect(anonymous.status).toBe(401);
    const member = await media(actors.reviewer, "playable.mp4", { range: "bytes=0-9" }, "GET", rec.recording.id, "?token=not-a-signed-grant");
    expect(member.status).toBe(206);
    await member.arrayBuffer();
  });
});

describe("aborted streams", () => {
  it("a client abort mid-stream closes the file and logs nothing", async () => {
    const openFds = async () => (await readdir("/proc/self/fd")).length;
    const errors = vi.spyOn(console, "error");
    // on the S3 store the "file" is an HTTP response from the bucket, and the SDK keeps idle
    // connections open for reuse: one request first, so that pool is part of the count
    if (onS3) await statKey(playableKey);
    const before = await openFds();
    const ac = new AbortController();
    const url = `/api/media/recordings/${rec.recording.id}/playable.mp4`;
    const base = await req(actors.reviewer, "GET", url);
    const request = new Request(base, { signal: ac.signal });
    const res = await recordingFile.GET(request, params(rec.recording.id, "playable.mp4"));
    const reader = res.body!.getReader();
    const { value } = await reader.read();
    expect(value!.length).toBeGreaterThan(0);
    if (!onS3) expect(await openFds()).toBeGreaterThan(before); // the file is open while streaming (on S3 a pooled connection carries it)
    ac.abort();
    await reader.cancel();
    await new Promise((r) => setTimeout(r, 50));
    // the aborted response's connection is closed, never returned to the pool half-read
    if (onS3) expect(await openFds()).toBeLessThanOrEqual(before);
    else expect(await openFds()).toBe(before);
    expect(errors).not.toHaveBeenCalled();
    errors.mockRestore();
  });
});
