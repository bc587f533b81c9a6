// Media answers declare their length: Content-Length on 200 (the whole file), on 206 (the range's
// length) and on HEAD, for the workspace's media route and the share link's, as RFC 9110 sections
// 8.6, 9.3.2 and 15.3.7 describe. The handlers are called directly: `next start` 16.4 drops
// Content-Length from route-handler answers on the wire (next/dist/server/send-response.js).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as media from "@/app/api/media/recordings/[id]/[file]/route";
import * as shareMedia from "@/app/api/s/media/[grant]/route";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { env } from "@/lib/config/env";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { signMediaGrant } from "@/lib/sharing/media-grant";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeSharedJob } from "@/tests/integration/sharing/share-fixtures";

let actors: Record<DemoActorKey, Actor>;
let job: Awaited<ReturnType<typeof makeSharedJob>>;
let grant: string;

beforeAll(async () => {
  actors = await demoActors();
  const orgId = await demoOrganisationId();
  job = await makeSharedJob(orgId);
  const [link] = await db()
    .insert(s.shareLinks)
    .values({ organisationId: orgId, jobId: job.jobId, scope: "job", tokenHash: hashShareToken(generateShareToken()), label: "Length", expiresAt: new Date(Date.now() + 86_400_000) })
    .returning();
  grant = signMediaGrant({ linkId: link.id, kind: "playable", resourceId: job.recA.id, expiresAt: Math.floor(Date.now() / 1000) + 600 }, env().MEDIA_SIGNING_KEY);
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

async function lengths(send: (method: string, range?: string) => Promise<Response>) {
  const full = await send("GET");
  const bytes = Buffer.from(await full.arrayBuffer());
  const part = await send("GET", "bytes=5-14");
  const head = await send("HEAD");
  return { full, bytes, part, partBytes: Buffer.from(await part.arrayBuffer()), head };
}

describe("Content-Length on media answers", () => {
  it("workspace media: 200 whole length, 206 range length, HEAD whole length", async () => {
    const send = async (method: string, range?: string) =>
      media[method as "GET" | "HEAD"](await req(actors.reviewer, method, `/api/media/recordings/${job.recA.id}/playable.mp4`, undefined, range ? { range } : {}), route({ id: job.recA.id, file: "playable.mp4" }));
    const r = await lengths(send);
    expect(r.full.status).toBe(200);
    expect(r.full.headers.get("content-length")).toBe(String(r.bytes.length));
    expect(r.part.status).toBe(206);
    expect(r.part.headers.get("content-length")).toBe("10");
    expect(r.partBytes.equals(r.bytes.subarray(5, 15))).toBe(true);
    expect(r.head.headers.get("content-length")).toBe(String(r.bytes.length));
  });

  it("share media: the same, with Referrer-Policy: no-referrer", async () => {
    const send = async (method: string, range?: string) =>
      shareMedia[method as "GET" | "HEAD"](new Request(`http://localhost/api/s/media/${grant}`, { method, headers: range ? { range } : {} }), { params: Promise.resolve({ grant }) });
    const r = await lengths(send);
    expect(r.full.status).toBe(200);
    expect(r.full.headers.get("content-length")).toBe(String(r.bytes.length));
    expect(r.full.headers.get("referrer-policy")).toBe("no-referrer");
    expect(r.part.status).toBe(206);
    expect(r.part.headers.get("content-length")).toBe("10");
    expect(r.partBytes.equals(r.bytes.subarray(5, 15))).toBe(true);
    expect(r.head.headers.get("content-length")).toBe(String(r.bytes.length));
  });
});
