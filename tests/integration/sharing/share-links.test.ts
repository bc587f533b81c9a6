// Share links against the real Postgres and store: creation rights, the door page's answers
// (unknown, guessed, expired, revoked, passcode with limiting), scope, signed media with Range,
// revocation on the very next request, and what gets recorded.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, desc, eq } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import * as links from "@/app/api/share-links/route";
import * as oneLink from "@/app/api/share-links/[id]/route";
import * as options from "@/app/api/share-links/options/route";
import * as gate from "@/app/s/[token]/route";
import * as manifestRoute from "@/app/api/s/[token]/manifest/route";
import * as mediaRoute from "@/app/api/s/media/[grant]/route";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { closeRedis } from "@/lib/queue/redis";
import { env } from "@/lib/config/env";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";
import { signMediaGrant, type MediaGrantKind } from "@/lib/sharing/media-grant";
import { resolveShareLink } from "@/lib/sharing/resolve-share-link";
import { recordShareOpen } from "@/lib/sharing/record-share-access";
import type { ShareView } from "@/lib/sharing/build-share-view";
import { readMailbox } from "@/lib/mail/read-mailbox";
import { makeSharedJob, makeStoredRecording, sha256 } from "./share-fixtures";
import { tokensSeen } from "./tokens-seen";
import { execFileSync } from "node:child_process";
import { TEST_ENV } from "@/tests/support/test-env";
import { PEER_HEADER } from "@/lib/http/client-address";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let job: Awaited<ReturnType<typeof makeSharedJob>>;
let otherJob: Awaited<ReturnType<typeof makeSharedJob>>;

const tokenOf = (url: string) => new URL(url).pathname.split("/")[2];
const grantOf = (path: string) => path.split("/").pop()!;

async function share(body: Record<string, unknown>, who: DemoActorKey = "owner") {
  const res = await links.POST(await req(actors[who], "POST", "/api/share-links", { label: "Tower findings for the client", ...body }));
  const json = await res.json();
  if (res.status === 201) tokensSeen.push(tokenOf(json.url));
  return { res, json };
}
async function shareOk(body: Record<string, unknown>) {
  const { res, json } = await share(body);
  expect(res.status, JSON.stringify(json)).toBe(201);
  return { id: json.id as string, token: tokenOf(json.url), url: json.url as string };
}
// each request comes from an address of its own unless it names one, so the token-guessing limit
// (tests/integration/security/attempt-limits.test.ts) stays out of these tests
let addressSeq = 0;
const freshAddress = () => `2001:db8::${(++addressSeq).toString(16)}`;
const withAddress = (headers: HeadersInit | undefined) => {
  const h = new Headers(headers);
  if (!h.has(PEER_HEADER)) h.set(PEER_HEADER, freshAddress());
  return h;
};
const door = (token: string, init: RequestInit = {}) =>
  (init.method === "POST" ? gate.POST : gate.GET)(new Request(`http://localhost/s/${token}`, { ...init, headers: withAddress(init.headers) }), route({ token }));
const postPasscode = (token: string, passcode: string, address = "192.0.2.99") =>
  door(token, { method: "POST", body: new URLSearchParams({ passcode }), headers: { "content-type": "application/x-www-form-urlencoded", "user-agent": "vitest-client", [PEER_HEADER]: address } });
const manifest = async (token: string, cookie?: string) => manifestRoute.GET(new Request(`http://localhost/api/s/${token}/manifest`, { headers: withAddress(cookie ? { cookie } : {}) }), route({ token }));
const media = (path: string, headers: Record<string, string> = {}, method = "GET") =>
  (method === "HEAD" ? mediaRoute.HEAD : mediaRoute.GET)(new Request(`http://localhost${path}`, { method, headers }), route({ grant: grantOf(path) }));
async function viewOf(token: string, cookie?: string): Promise<ShareView> {
  const res = await manifest(token, cookie);
  expect(res.status).toBe(200);
  return res.json();
}
/** A grant signed with the real key: proves the scope check holds even for a validly signed address. */
const forged = (linkId: string, kind: MediaGrantKind, resourceId: string, expiresAt = Math.floor(Date.now() / 1000) + 300) =>
  `/api/s/media/${signMediaGrant({ linkId, kind, resourceId, expiresAt }, env().MEDIA_SIGNING_KEY)}`;

function expectShareHeaders(res: Response) {
  expect(res.headers.get("referrer-policy")).toBe("no-referrer");
  expect(res.headers.get("cache-control")).toBe("no-store");
  expect(res.headers.get("x-robots-tag")).toContain("noindex");
}

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  job = await makeSharedJob(orgId);
  otherJob = await makeSharedJob(orgId);
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("creating a link", () => {
  it("owner creates; token stored only as its SHA-256; the share is a custody event", async () => {
    const { res, json } = await share({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id });
    expect(res.status).toBe(201);
    const token = tokenOf(json.url);
    expect(json.url).toBe(`${env().APP_URL}/s/${token}`);
    expect(Object.keys(json).sort()).toEqual(["expiresAt", "id", "mailError", "mailed", "url"]);
    const [row] = await db().select().from(s.shareLinks).where(eq(s.shareLinks.id, json.id));
    expect(row.tokenHash).toBe(sha256(token)); // Node crypto as the reference
    expect(JSON.stringify(row)).not.toContain(token);
    const [ev] = await db().select().from(s.custodyEvents).where(and(eq(s.custodyEvents.evidenceId, json.id), eq(s.custodyEvents.eventType, "share")));
    expect(ev.actorRole).toBe("owner");
    expect(ev.jobId).toBe(job.jobId);
    expect(JSON.stringify(ev)).not.toContain(token);
  });

  const roles: [DemoActorKey, number][] = [
    ["pilot", 403],
    ["reviewer", 403],
    ["client", 403],
    ["anonymous", 401],
    ["other", 404], // the job belongs to another organisation: not found, not forbidden
  ];
  it.each(roles)("%s -> %i, nothing created", async (who, status) => {
    const before = await db().$count(s.shareLinks);
    const { res } = await share({ jobId: job.jobId, scope: "job" }, who);
    expect(res.status).toBe(status);
    expect(await db().$count(s.shareLinks)).toBe(before);
  });

  it.each([
    ["recording scope without a recording", { scope: "recording" }, "recordingId"],
    ["findings scope without findings", { scope: "findings", findingIds: [] }, "findingIds"],
    ["report scope without a report", { scope: "report" }, "reportId"],
    ["a recording of another job", { scope: "recording", recordingId: "OTHER_REC" }, "recordingId"],
    ["a finding of another job", { scope: "findings", findingIds: ["OTHER_FINDING"] }, "findingIds"],
    ["a report of another job", { scope: "report", reportId: "OTHER_REPORT" }, "reportId"],
    ["a short passcode", { scope: "job", passcode: "12345" }, "passcode"],
    ["a bad recipient", { scope: "job", recipientEmails: ["not-an-address"] }, "recipientEmails.0"],
    ["expiry beyond 90 days", { scope: "job", expiresInDays: 91 }, "expiresInDays"],
  ])("refuses %s with 422 on the field", async (_label, body, field) => {
    const swap = (v: unknown) =>
      v === "OTHER_REC" ? otherJob.recA.id : v === "OTHER_FINDING" ? otherJob.fA.finding.id : v === "OTHER_REPORT" ? otherJob.report.id : v;
    const resolved = Object.fromEntries(Object.entries(body).map(([k, v]) => [k, Array.isArray(v) ? v.map(swap) : swap(v)]));
    const { res, json } = await share({ jobId: job.jobId, ...resolved });
    expect(res.status).toBe(422);
    expect(Object.keys(json.error.fields)).toContain(field);
  });

  it("options list what the job can share, and only that job's", async () => {
    const res = await options.GET(await req(actors.owner, "GET", `/api/share-links/options?jobId=${job.jobId}`));
    const body = await res.json();
    expect(body.recordings.map((r: { id: string }) => r.id).sort()).toEqual([job.recA.id, job.recB.id].sort());
    expect(body.findings.map((f: { id: string }) => f.id).sort()).toEqual([job.fA.finding.id, job.fB.finding.id].sort());
    expect(body.reports.map((r: { id: string }) => r.id)).toEqual([job.report.id]);
  });

  it("mails the recipients the link and its expiry, in text and HTML", async () => {
    const to = `recipient-${Date.now()}@client.example`;
    const { res, json } = await share({ jobId: job.jobId, scope: "job", recipientEmails: [to], label: "Valve tower evidence" });
    expect(res.status).toBe(201);
    expect(json.mailed).toEqual([to]);
    let mail;
    for (let i = 0; i < 50 && !mail; i++) {
      [mail] = await readMailbox({ to });
      if (!mail) await new Promise((r) => setTimeout(r, 100));
    }
    expect(mail).toBeTruthy();
    expect(mail!.subject).toContain("Valve tower evidence");
    expect(mail!.text).toContain(json.url);
    expect(mail!.html).toContain(json.url);
    expect(mail!.text).toContain(new Date(json.expiresAt).toISOString().slice(0, 10));
    // the job has an approved report, so the whole-job link offers it
    expect(mail!.text).toContain("download the report");
  });

  it("promises no report when the link carries none (a recording without an attached report)", async () => {
    const to = `recipient-norep-${Date.now()}@client.example`;
    const { json } = await share({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id, recipientEmails: [to], label: "One clip" });
    expect(json.mailed).toEqual([to]);
    let mail;
    for (let i = 0; i < 50 && !mail; i++) {
      [mail] = await readMailbox({ to });
      if (!mail) await new Promise((r) => setTimeout(r, 100));
    }
    expect(mail!.text).toContain("You can watch the recording");
    expect(mail!.text).not.toContain("report");
  });
});

describe("the door page /s/:token", () => {
  it("an open link without passcode goes to the viewer, with the share headers", async () => {
    const { token } = await shareOk({ jobId: job.jobId, scope: "job" });
    const res = await door(token);
    expect(res.status).toBe(303);
    expect(res.headers.get("location")).toBe(`/s/${token}/view`);
    expectShareHeaders(res);
  });

  it("unknown, guessed and malformed tokens answer the same 404 page", async () => {
    const bodies = new Set<string>();
    const candidates = [...Array.from({ length: 10 }, () => generateShareToken()), "short", "A".repeat(44), "../../etc/passwd", "%00", "' OR 1=1 --"];
    for (const t of candidates) {
      const res = await door(t);
      expect(res.status).toBe(404);
      expectShareHeaders(res);
      bodies.add(await res.text());
      const m = await manifest(t);
      expect(m.status).toBe(404);
    }
    expect(bodies.size).toBe(1);
    expect([...bodies][0]).not.toContain("Kestrelmoor");
  });

  it("an expired link answers 410 with the expired page, and so does everything under it", async () => {
    const { id, token } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id });
    const view = await viewOf(token);
    await db().update(s.shareLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(s.shareLinks.id, id));
    const res = await door(token);
    expect(res.status).toBe(410);
    expectShareHeaders(res);
    expect(await res.text()).toContain("expired");
    expect((await manifest(token)).status).toBe(410);
    expect((await media(view.recordings[0].playableUrl!, { range: "bytes=0-99" })).status).toBe(410);
  });

  it("a token of another job opens that job's link only: nothing of this job is listed or served", async () => {
    const { id, token } = await shareOk({ jobId: otherJob.jobId, scope: "job" });
    const view = await viewOf(token);
    const listed = JSON.stringify(view);
    for (const foreign of [job.recA.id, job.recB.id, job.fA.finding.id, job.fB.finding.id, job.report.id]) expect(listed).not.toContain(foreign);
    for (const [kind, resource] of [["playable", job.recA.id], ["still", job.fA.stillId], ["report", job.report.id]] as const) {
      expect((await media(forged(id, kind, resource))).status).toBe(404);
    }
  });
});

describe("passcode", () => {
  it("asks, refuses wrong tries with 404; after five from one address that address waits (429, Retry-After), the recipient's elsewhere does not; then opens with a cookie", async () => {
    const { id, token } = await shareOk({ jobId: job.jobId, scope: "job", passcode: "kestrel-2026" });
    const [row] = await db().select().from(s.shareLinks).where(eq(s.shareLinks.id, id));
    expect(row.passcodeHash).toMatch(/^\$2[aby]\$1[0-9]\$/); // bcrypt, cost >= 10
    expect(row.passcodeHash).not.toContain("kestrel-2026");

    const ask = await door(token);
    expect(ask.status).toBe(200);
    expect(await ask.text()).toContain('name="passcode"');
    expect((await manifest(token)).status).toBe(404); // no viewer data before the passcode

    const stranger = "198.51.100.7";
    for (let i = 1; i <= 5; i++) {
      const res = await postPasscode(token, `wrong-${i}`, stranger);
      expect(res.status).toBe(404);
      expect(res.headers.get("set-cookie")).toBeNull();
    }
    const refusedWhileWaiting = await postPasscode(token, "kestrel-2026", stranger);
    expect(refusedWhileWaiting.status).toBe(429);
    expect(Number(refusedWhileWaiting.headers.get("retry-after"))).toBeGreaterThanOrEqual(29);
    expect(refusedWhileWaiting.headers.get("set-cookie")).toBeNull();
    expect(await refusedWhileWaiting.text()).toContain("Too many tries from here");
    const events = await db().select().from(s.shareLinkEvents).where(and(eq(s.shareLinkEvents.shareLinkId, id), eq(s.shareLinkEvents.kind, "passcode_refused")));
    expect(events.map((e) => e.detail).sort()).toEqual(["locked", "wrong", "wrong", "wrong", "wrong", "wrong"]);

    // the recipient, from their own address, is not kept out by the stranger's tries
    const opened = await postPasscode(token, "kestrel-2026", "203.0.113.20");
    expect(opened.status).toBe(303);
    expect(opened.headers.get("location")).toBe(`/s/${token}/view`);
    const cookie = opened.headers.get("set-cookie")!.split(";")[0];
    expect(opened.headers.get("set-cookie")).toMatch(/HttpOnly/);
    expect(cookie).not.toContain(token);
    expect((await door(token, { headers: { cookie } })).status).toBe(303);
    expect((await manifest(token, cookie)).status).toBe(200);

    // the cookie of one link opens no other link
    const second = await shareOk({ jobId: job.jobId, scope: "job", passcode: "kestrel-2026" });
    expect((await manifest(second.token, cookie)).status).toBe(404);
  });

  it("parallel guesses from one address cannot pass the limit: five are compared, the rest answered 429", async () => {
    const { id, token } = await shareOk({ jobId: job.jobId, scope: "job", passcode: "kestrel-2026" });
    const answers = await Promise.all(Array.from({ length: 20 }, (_, i) => postPasscode(token, `guess-${i}`, "198.51.100.8")));
    expect(answers.filter((r) => r.status === 404)).toHaveLength(5);
    expect(answers.filter((r) => r.status === 429)).toHaveLength(15);
    const events = await db().select().from(s.shareLinkEvents).where(eq(s.shareLinkEvents.shareLinkId, id));
    expect(events.filter((e) => e.detail === "wrong")).toHaveLength(5);
    expect(events.filter((e) => e.detail === "locked")).toHaveLength(15);
  });

  it("a passcode posted to an unknown token answers the unknown page", async () => {
    const res = await postPasscode(generateShareToken(), "anything-at-all");
    expect(res.status).toBe(404);
    expect(await res.text()).toContain("does not open anything");
  });
});

describe("scope and signed media", () => {
  it("a recording link lists that recording and its findings only", async () => {
    const { token } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id });
    const view = await viewOf(token);
    expect(view.organisationName).toBe("Kestrelmoor Aerial Survey");
    expect(view.recordings.map((r) => r.id)).toEqual([job.recA.id]);
    expect(view.findings.map((f) => f.id)).toEqual([job.fA.finding.id]);
    expect(view.report).toBeNull(); // not attached
    expect(view.recordings[0].originalUrl).toBeNull(); // originals not allowed
    expect(JSON.stringify(view)).not.toContain(job.recB.id);
  });

  it("a recording link cannot fetch another recording's media, stills, sprites, thumbnails or original, nor an unattached report", async () => {
    const { id } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id, allowOriginals: true });
    const refused: [MediaGrantKind, string][] = [
      ["playable", job.recB.id],
      ["poster", job.recB.id],
      ["sprite", job.recB.id],
      ["thumbnails", job.recB.id],
      ["still", job.fB.stillId],
      ["original", job.recB.id],
      ["report", job.report.id],
      ["playable", otherJob.recA.id],
      ["original", otherJob.recA.id],
    ];
    for (const [kind, resource] of refused) {
      const res = await media(forged(id, kind, resource));
      expect(res.status, `${kind} ${resource}`).toBe(404);
      expectShareHeaders(res);
    }
    // the same kinds of its own recording are served
    for (const [kind, resource] of [["playable", job.recA.id], ["sprite", job.recA.id], ["still", job.fA.stillId], ["original", job.recA.id]] as const) {
      expect((await media(forged(id, kind, resource))).status, `${kind}`).toBe(200);
    }
  });

  it("originals only when allowed; served byte for byte with the SHA-256 the page shows", async () => {
    const denied = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id, allowOriginals: false });
    expect((await media(forged(denied.id, "original", job.recA.id))).status).toBe(404);

    const { token } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id, allowOriginals: true });
    const view = await viewOf(token);
    expect(view.recordings[0].sha256).toBe(job.recA.sha256);
    const res = await media(view.recordings[0].originalUrl!);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toContain("attachment");
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(bytes.equals(job.recA.originalBytes)).toBe(true);
    expect(sha256(bytes)).toBe(view.recordings[0].sha256);
  });

  it("Range requests follow RFC 9110: 206 with Content-Range, suffix ranges, 416 past the end", async () => {
    const { token } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id });
    const url = (await viewOf(token)).recordings[0].playableUrl!;
    const full = Buffer.from(await (await media(url)).arrayBuffer());
    const part = await media(url, { range: "bytes=0-99" });
    expect(part.status).toBe(206);
    expect(part.headers.get("content-range")).toBe(`bytes 0-99/${full.length}`);
    expect(part.headers.get("accept-ranges")).toBe("bytes");
    expect(Buffer.from(await part.arrayBuffer()).equals(full.subarray(0, 100))).toBe(true);
    const tail = await media(url, { range: "bytes=-10" });
    expect(tail.status).toBe(206);
    expect(Buffer.from(await tail.arrayBuffer()).equals(full.subarray(full.length - 10))).toBe(true);
    const beyond = await media(url, { range: `bytes=${full.length}-` });
    expect(beyond.status).toBe(416);
    expect(beyond.headers.get("content-range")).toBe(`bytes */${full.length}`);
    const head = await media(url, {}, "HEAD");
    expect(head.status).toBe(200);
    expect(head.headers.get("content-length")).toBe(String(full.length));
  });

  it("the thumbnail track is served with its sprite reference signed, and that sprite address works", async () => {
    const { token } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id });
    const view = await viewOf(token);
    const vtt = await (await media(view.recordings[0].thumbnailsUrl!)).text();
    const cue = vtt.split("\n").find((l) => l.includes("#xywh="))!;
    const spritePath = cue.slice(0, cue.indexOf("#"));
    expect(spritePath).toMatch(/^\/api\/s\/media\//);
    const sprite = await media(spritePath);
    expect(sprite.status).toBe(200);
    expect(await sprite.text()).toBe(`jpeg sprite ${job.recA.id}`);
  });

  it("signed addresses expire, and refuse any edit", async () => {
    const { id } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id });
    const expired = forged(id, "playable", job.recA.id, Math.floor(Date.now() / 1000) - 1);
    expect((await media(expired, { range: "bytes=0-9" })).status).toBe(410);
    const good = forged(id, "playable", job.recA.id);
    const tampered = good.replace(/.$/, (c) => (c === "A" ? "Q" : "A"));
    expect((await media(tampered)).status).toBe(404);
    const otherKey = `/api/s/media/${signMediaGrant({ linkId: id, kind: "playable", resourceId: job.recA.id, expiresAt: Math.floor(Date.now() / 1000) + 60 }, "not-the-key")}`;
    expect((await media(otherKey)).status).toBe(404);
  });

  it("revocation stops the page and every signed address on the very next (Range) request", async () => {
    const { id, token } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: job.recA.id, allowOriginals: true });
    const view = await viewOf(token);
    const url = view.recordings[0].playableUrl!;
    expect((await media(url, { range: "bytes=0-9" })).status).toBe(206);
    const revoke = await oneLink.DELETE(await req(actors.owner, "DELETE", `/api/share-links/${id}`), route({ id }));
    expect(revoke.status).toBe(200);
    const next = await media(url, { range: "bytes=10-19" });
    expect(next.status).toBe(410);
    expectShareHeaders(next);
    expect((await media(view.recordings[0].originalUrl!)).status).toBe(410);
    expect((await media(view.findings[0].stillUrl!)).status).toBe(410);
    const page = await door(token);
    expect(page.status).toBe(410);
    expect(await page.text()).toContain("revoked");
    expect((await manifest(token)).status).toBe(410);
    // revoking twice records one revoke event
    await oneLink.DELETE(await req(actors.owner, "DELETE", `/api/share-links/${id}`), route({ id }));
    expect(await db().$count(s.custodyEvents, and(eq(s.custodyEvents.evidenceId, id), eq(s.custodyEvents.eventType, "revoke")))).toBe(1);
    // only the link's own organisation can revoke
    const other = await shareOk({ jobId: job.jobId, scope: "job" });
    expect((await oneLink.DELETE(await req(actors.other, "DELETE", "/x"), route({ id: other.id }))).status).toBe(404);
    expect((await oneLink.DELETE(await req(actors.pilot, "DELETE", "/x"), route({ id: other.id }))).status).toBe(403);
    expect((await door(other.token)).status).toBe(303);
  });

  it("a deleted recording drops out of every link at once", async () => {
    const extra = await makeStoredRecording(orgId, job.jobId, job.flightId, { name: "to-be-deleted.264" });
    const { id } = await shareOk({ jobId: job.jobId, scope: "recording", recordingId: extra.id });
    const url = forged(id, "playable", extra.id);
    expect((await media(url)).status).toBe(200);
    await db().update(s.recordings).set({ deletedAt: new Date() }).where(eq(s.recordings.id, extra.id));
    expect((await media(url)).status).toBe(404);
  });
});

describe("what is recorded", () => {
  it("opens and downloads go to the link's events and the custody log; the job list counts them", async () => {
    const { id, token } = await shareOk({ jobId: job.jobId, scope: "findings", findingIds: [job.fA.finding.id], reportId: job.report.id, allowOriginals: true });
    const resolved = await resolveShareLink(token);
    if (resolved.kind !== "open") throw new Error("link should open");
    await recordShareOpen(resolved.link, { clientAddress: "192.0.2.44", userAgent: "vitest-client" });
    const view = await viewOf(token);
    expect(view.findings.map((f) => f.id)).toEqual([job.fA.finding.id]);
    expect(view.recordings.map((r) => r.id)).toEqual([job.recA.id]);

    const pdf = await media(view.report!.url, { [PEER_HEADER]: "192.0.2.44", "user-agent": "vitest-client" });
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get("content-type")).toBe("application/pdf");
    expect(Buffer.from(await pdf.arrayBuffer()).equals(job.pdf)).toBe(true);
    expect((await media(view.recordings[0].originalUrl!)).status).toBe(200);
    // a resumed download (not from the first byte) and playback are not counted as downloads
    expect((await media(view.recordings[0].originalUrl!, { range: "bytes=100-" })).status).toBe(206);
    expect((await media(view.recordings[0].playableUrl!)).status).toBe(200);

    const events = await db().select().from(s.shareLinkEvents).where(eq(s.shareLinkEvents.shareLinkId, id)).orderBy(s.shareLinkEvents.createdAt);
    expect(events.map((e) => e.kind)).toEqual(["open", "download", "download"]);
    expect(events[1].clientAddress).toBe("192.0.2.44");
    const custody = await db().select().from(s.custodyEvents).where(eq(s.custodyEvents.actorShareLinkId, id)).orderBy(desc(s.custodyEvents.seq));
    expect(custody.map((e) => e.eventType).sort()).toEqual(["download", "download", "share_open"]);
    const reportDownload = custody.find((e) => e.evidenceType === "report")!;
    expect(reportDownload.originalSha256).toBe(sha256(job.pdf));
    expect(reportDownload.userAgent).toBe("vitest-client");
    const originalDownload = custody.find((e) => e.evidenceType === "recording")!;
    expect(originalDownload.originalSha256).toBe(job.recA.sha256);
    expect(originalDownload.originalSize).toBe(job.recA.originalBytes.length);

    const list = await (await links.GET(await req(actors.owner, "GET", `/api/share-links?jobId=${job.jobId}`))).json();
    const mine = list.items.find((l: { id: string }) => l.id === id);
    expect(mine).toMatchObject({ opens: 1, downloads: 2, status: "active", hasPasscode: false });
    expect(mine).not.toHaveProperty("tokenHash");
    expect(mine).not.toHaveProperty("passcodeHash");
    const detail = await (await oneLink.GET(await req(actors.owner, "GET", "/x"), route({ id }))).json();
    expect(detail.events).toHaveLength(3);
    expect((await oneLink.GET(await req(actors.other, "GET", "/x"), route({ id }))).status).toBe(404);
  });

  it("the database holds only token hashes", async () => {
    const rows = await db().select({ h: s.shareLinks.tokenHash }).from(s.shareLinks);
    const hashes = new Set(rows.map((r) => r.h));
    for (const t of tokensSeen) expect(hashes.has(hashShareToken(t))).toBe(true);
  });

  it("no raw token appears anywhere in the database (pg_dump of this test database)", async () => {
    expect(tokensSeen.length).toBeGreaterThan(10);
    const dump = execFileSync("pg_dump", ["--data-only", "--no-owner", "--dbname", TEST_ENV.MIGRATION_DATABASE_URL], { maxBuffer: 1024 ** 3 }).toString("utf8");
    // the dump is of the right database: it holds every link's hash...
    for (const t of tokensSeen) expect(dump).toContain(hashShareToken(t));
    // ...and none of the tokens
    for (const t of tokensSeen) expect(dump.includes(t)).toBe(false);
  });
});
