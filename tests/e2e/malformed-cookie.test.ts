// A cookie that another app on the same host may set, with a value that is not valid percent-encoding
// (`theme=50%`), is ignored: an API route, a page and the media route answer as they would without
// it, signed in or not. Against the built app (next start), as a browser sends the header.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, closeDb } from "@/db/client";
import { closeRedis } from "@/lib/queue/redis";
import { actorByEmail, sessionCookie, demoOrganisationId } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { makeStoredRecording } from "@/tests/integration/sharing/share-fixtures";
import { BASE } from "@/tests/support/browser";
import { DEMO_USERS } from "@/db/seed/demo-scenario";

const STRAY = "theme=50%; ratio=%E0%A4%A; progress=100%25";
let signedIn: string;
let recordingId: string;

beforeAll(async () => {
  const owner = DEMO_USERS.find((u) => u.role === "owner")!;
  signedIn = `${STRAY}; ${await sessionCookie(await actorByEmail(owner.email))}`;
  const flight = await makeFlight(await demoOrganisationId());
  recordingId = (await makeStoredRecording(await demoOrganisationId(), flight.jobId, flight.id, { name: "COOKIE.264" })).id;
  void db;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const get = (path: string, cookie: string, headers: Record<string, string> = {}) => fetch(`${BASE}${path}`, { headers: { cookie, ...headers }, redirect: "manual" });

describe("a malformed cookie beside the session", () => {
  it("an API route answers the signed-in member", async () => {
    const res = await get("/api/recordings", signedIn);
    expect(res.status).toBe(200);
    expect((await res.json()).items.some((r: { id: string }) => r.id === recordingId)).toBe(true);
  });

  it("a page renders for the signed-in member", async () => {
    const res = await get("/jobs", signedIn);
    expect(res.status).toBe(200);
    expect(await res.text()).toContain("Jobs");
  });

  it("the media route serves a byte range", async () => {
    const res = await get(`/api/media/recordings/${recordingId}/playable.mp4`, signedIn, { range: "bytes=0-99" });
    expect(res.status).toBe(206);
    expect((await res.arrayBuffer()).byteLength).toBe(100);
  });

  it("without a session the same requests are refused as usual, not failed", async () => {
    expect((await get("/api/recordings", STRAY)).status).toBe(401);
    expect((await get(`/api/media/recordings/${recordingId}/playable.mp4`, STRAY, { range: "bytes=0-99" })).status).toBe(401);
    const page = await get("/jobs", STRAY);
    expect([302, 303, 307]).toContain(page.status);
    expect(page.headers.get("location")).toContain("/sign-in");
    expect((await get("/sign-in", STRAY)).status).toBe(200);
  });
});
