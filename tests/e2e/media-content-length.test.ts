// Media answers carry Content-Length under `next start` too (RFC 9110 section 8.6), for a whole file,
// a byte range and a HEAD: Next drops the header from route handlers' responses, and
// lib/http/content-length-carrier.ts puts it back. The private name it travels under never leaves.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/client";
import { closeRedis } from "@/lib/queue/redis";
import { actorByEmail, sessionCookie, demoOrganisationId } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeStoredRecording, type FixtureRecording } from "@/tests/integration/sharing/share-fixtures";
import { BASE } from "@/tests/support/browser";
import { DEMO_USERS } from "@/db/seed/demo-scenario";
import { LENGTH_CARRIER } from "@/lib/http/content-length-carrier";

let cookie: string;
let rec: FixtureRecording;
let playableBytes: number;

beforeAll(async () => {
  cookie = await sessionCookie(await actorByEmail(DEMO_USERS.find((u) => u.role === "owner")!.email));
  const orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId);
  rec = await makeStoredRecording(orgId, flight.jobId, flight.id, { name: "LENGTH.264" });
  playableBytes = Buffer.from(`mp4 bytes of ${rec.id} `.repeat(300)).length; // the fixture's playable file
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const media = (path: string, init: RequestInit = {}) => fetch(`${BASE}${path}`, { ...init, headers: { cookie, ...(init.headers as Record<string, string>) } });

describe("Content-Length on media under next start", () => {
  it("a whole file, a range and a HEAD of a rendition", async () => {
    const path = `/api/media/recordings/${rec.id}/playable.mp4`;
    const whole = await media(path);
    expect(whole.status).toBe(200);
    expect(whole.headers.get("content-length")).toBe(String(playableBytes));
    expect((await whole.arrayBuffer()).byteLength).toBe(playableBytes);
    const part = await media(path, { headers: { range: "bytes=100-599" } });
    expect(part.status).toBe(206);
    expect(part.headers.get("content-length")).toBe("500");
    expect(part.headers.get("content-range")).toBe(`bytes 100-599/${playableBytes}`);
    expect((await part.arrayBuffer()).byteLength).toBe(500);
    const head = await media(path, { method: "HEAD" });
    expect(head.status).toBe(200);
    expect(head.headers.get("content-length")).toBe(String(playableBytes));
    for (const r of [whole, part, head]) {
      expect(r.headers.get("transfer-encoding")).toBeNull();
      expect(r.headers.get(LENGTH_CARRIER)).toBeNull();
    }
  });

  it("the original's download", async () => {
    const res = await media(`/api/recordings/${rec.id}/original`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-length")).toBe(String(rec.originalBytes.length));
    expect(Buffer.from(await res.arrayBuffer()).equals(rec.originalBytes)).toBe(true);
    expect(res.headers.get(LENGTH_CARRIER)).toBeNull();
  });
});
