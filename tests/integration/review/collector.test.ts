// The playback-analytics collector: beacons as mux-embed sends them (text/plain JSON, shortened keys),
// stored per view and viewer; refused without a session; never crossing organisations.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import * as collector from "@/app/api/collector/route";
import * as viewsApi from "@/app/api/collector/views/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { env } from "@/lib/config/env";
import { demoActors, demoOrganisationId, sessionCookie, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";
import { signMediaGrant, type MediaGrantKind } from "@/lib/sharing/media-grant";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";
import { makeStoredRecording } from "@/tests/integration/sharing/share-fixtures";

let actors: Record<DemoActorKey, Actor>;
let recordingId: string;
const t0 = Date.UTC(2026, 2, 14, 9, 0, 0);

async function beacon(actor: Actor, body: unknown, headers: Record<string, string> = {}) {
  const h: Record<string, string> = { "content-type": "text/plain", ...headers };
  if (actor) h.cookie = await sessionCookie(actor);
  return collector.POST(new Request("http://localhost/api/collector?via=localhost", { method: "POST", headers: h, body: typeof body === "string" ? body : JSON.stringify(body) }));
}
const events = (viewKey: string, watch: number, extra: Record<string, unknown> = {}) => ({
  metadata: { transmission_timestamp: t0 + watch },
  events: [{ e: "hb", xid: viewKey, vid: recordingId, xst: t0, uti: t0 + watch, xwati: watch, xtitofifr: 350, xreco: 0, xredu: 0, ake: "cairn-local", ...extra }],
});

beforeAll(async () => {
  actors = await demoActors();
  const orgId = await demoOrganisationId();
  const flight = await makeFlight(orgId);
  const [r] = await db()
    .insert(s.recordings)
    .values({ organisationId: orgId, jobId: flight.jobId, flightId: flight.id, originalName: "VIEWED.264", sizeBytes: 10, kind: "raw_h264", sha256: "0".repeat(64), state: "ready" })
    .returning();
  recordingId = r.id;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

describe("collector", () => {
  it("stores a view for the signed-in viewer and keeps the largest figures of later beacons", async () => {
    const first = await beacon(actors.reviewer, events("view-a", 4000));
    expect(first.status).toBe(200);
    expect(await first.json()).toEqual({ stored: 1, ignored: 0 });
    await beacon(actors.reviewer, events("view-a", 9000, { xreco: 2, xredu: 640 }));
    // an out-of-order older beacon does not lower anything
    await beacon(actors.reviewer, events("view-a", 2000));
    const [row] = await db().select().from(s.playbackViews).where(eq(s.playbackViews.viewKey, "view-a"));
    expect(row).toMatchObject({ recordingId, viewerUserId: actors.reviewer!.userId, watchTimeMs: 9000, startupTimeMs: 350, rebufferCount: 2, rebufferMs: 640 });
    expect(row.startedAt.getTime()).toBe(t0);
  });

  it("refuses beacons without a session, and malformed ones", async () => {
    expect((await beacon(null, events("view-b", 1000))).status).toBe(401);
    expect((await beacon(actors.reviewer, "{not json")).status).toBe(400);
    expect((await beacon(actors.reviewer, { events: "nope" })).status).toBe(400);
    expect(await db().$count(s.playbackViews, eq(s.playbackViews.viewKey, "view-b"))).toBe(0);
  });

  it("never records a view of another organisation's recording, nor lets a view id be taken over", async () => {
    const res = await beacon(actors.other, events("view-c", 1000));
    expect(await res.json()).toEqual({ stored: 0, ignored: 1 });
    // the owner replays the reviewer's view id: the reviewer's row stays as it was
    const hijack = await beacon(actors.owner, events("view-a", 999_000));
    expect(await hijack.json()).toEqual({ stored: 0, ignored: 1 });
    const [row] = await db().select().from(s.playbackViews).where(eq(s.playbackViews.viewKey, "view-a"));
    expect(row.watchTimeMs).toBe(9000);
    expect(row.viewerUserId).toBe(actors.reviewer!.userId);
  });

  it("answers CORS for the app's own origin only", async () => {
    const origin = new URL(env().APP_URL).origin;
    const ok = await collector.OPTIONS(new Request("http://localhost/api/collector", { method: "OPTIONS", headers: { origin, "access-control-request-method": "POST" } }));
    expect(ok.status).toBe(204);
    expect(ok.headers.get("access-control-allow-origin")).toBe(origin);
    expect(ok.headers.get("access-control-allow-credentials")).toBe("true");
    const evil = await collector.OPTIONS(new Request("http://localhost/api/collector", { method: "OPTIONS", headers: { origin: "https://elsewhere.example" } }));
    expect(evil.headers.get("access-control-allow-origin")).toBeNull();
  });

  it("lists a recording's views with the viewer's name, inside the organisation only", async () => {
    const req = async (actor: Actor) => {
      const h: Record<string, string> = {};
      if (actor) h.cookie = await sessionCookie(actor);
      return viewsApi.GET(new Request(`http://localhost/api/collector/views?recordingId=${recordingId}`, { headers: h }));
    };
    // opening the page without playing: mux-embed still reports the view, with 0 ms watched and no first frame
    await beacon(actors.pilot, events("view-opened-only", 0, { xtitofifr: undefined }));
    const body = await (await req(actors.pilot)).json();
    // a view of 0.0 s is no view: only the reviewer's 9 s one is listed
    expect(body.items).toHaveLength(1);
    expect(body.items[0]).toMatchObject({ viewerName: "Cleo Marchbank", watchTimeMs: 9000, rebufferCount: 2 });
    expect((await req(actors.other)).status).toBe(404);
    expect((await req(null)).status).toBe(401);
    // who watched what is the crew's business, not a client account's (views.read)
    expect((await req(actors.client)).status).toBe(403);
  });
});

describe("views from a shared page (no account)", () => {
  let shownId: string;
  let hiddenId: string;
  let linkId: string;
  const grant = (kind: MediaGrantKind, resourceId: string, expiresAt = Math.floor(Date.now() / 1000) + 600, link = linkId) =>
    signMediaGrant({ linkId: link, kind, resourceId, expiresAt }, env().MEDIA_SIGNING_KEY);
  // the shared page's player sends the playable address's grant as custom_1 ("c1" once shortened)
  const sharedEvents = (viewKey: string, recording: string, token: string) => ({
    metadata: { transmission_timestamp: t0 + 5000 },
    events: [{ e: "hb", xid: viewKey, vid: recording, xst: t0, uti: t0 + 5000, xwati: 5000, xtitofifr: 420, xreco: 1, xredu: 200, c1: token }],
  });
  const viewRow = async (viewKey: string) => (await db().select().from(s.playbackViews).where(eq(s.playbackViews.viewKey, viewKey)))[0];

  beforeAll(async () => {
    const orgId = await demoOrganisationId();
    const flight = await makeFlight(orgId);
    shownId = (await makeStoredRecording(orgId, flight.jobId, flight.id, { name: "SHOWN.264" })).id;
    hiddenId = (await makeStoredRecording(orgId, flight.jobId, flight.id, { name: "HIDDEN.264" })).id;
    const [link] = await db()
      .insert(s.shareLinks)
      .values({ organisationId: orgId, jobId: flight.jobId, scope: "recording", recordingId: shownId, tokenHash: hashShareToken(generateShareToken()), label: "for the client", expiresAt: new Date(Date.now() + 3600_000) })
      .returning();
    linkId = link.id;
  });

  it("counts a view for the share link named by a valid grant, and lists it under the link's label", async () => {
    const res = await beacon(null, sharedEvents("shared-1", shownId, grant("playable", shownId)));
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ stored: 1, ignored: 0 });
    expect(await viewRow("shared-1")).toMatchObject({ recordingId: shownId, shareLinkId: linkId, viewerUserId: null, watchTimeMs: 5000, startupTimeMs: 420, rebufferCount: 1 });
    const list = await viewsApi.GET(new Request(`http://localhost/api/collector/views?recordingId=${shownId}`, { headers: { cookie: await sessionCookie(actors.owner!) } }));
    expect((await list.json()).items).toEqual([expect.objectContaining({ viewerName: null, shareLinkLabel: "for the client", watchTimeMs: 5000 })]);
  });

  it("keeps counting a long view after its 10-minute grant expired, but not a replay hours later", async () => {
    const now = Math.floor(Date.now() / 1000);
    expect(await (await beacon(null, sharedEvents("shared-2", shownId, grant("playable", shownId, now - 3600)))).json()).toEqual({ stored: 1, ignored: 0 });
    expect(await (await beacon(null, sharedEvents("shared-3", shownId, grant("playable", shownId, now - 7 * 3600)))).json()).toEqual({ stored: 0, ignored: 1 });
  });

  it("adds later beacons of a shared view that carry no token (mux-embed sends custom_1 in a view's first event only)", async () => {
    // mux-embed 5.x leaves out unchanged fields after a view's first event, except the ones it
    // always sends (its list: view_id, video_id, viewer_time, event, ...); custom_1 is not among them
    expect(await (await beacon(null, sharedEvents("shared-4", shownId, grant("playable", shownId)))).json()).toEqual({ stored: 1, ignored: 0 });
    const later = { metadata: { transmission_timestamp: t0 + 12_000 }, events: [{ e: "pause", xid: "shared-4", vid: shownId, uti: t0 + 12_000, xwati: 11_500 }] };
    const res = await beacon(null, later);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ stored: 1, ignored: 0 });
    expect(await viewRow("shared-4")).toMatchObject({ shareLinkId: linkId, viewerUserId: null, watchTimeMs: 11_500 });
    // a view id nobody proved, without token or session, is still refused
    expect((await beacon(null, { ...later, events: [{ ...later.events[0], xid: "never-seen" }] })).status).toBe(401);
    // nor can a known shared view id move to another recording
    expect((await beacon(null, { ...later, events: [{ ...later.events[0], vid: hiddenId }] })).status).toBe(401);
  });

  it("ignores a forged, mismatched or out-of-scope grant, and a revoked link", async () => {
    const good = grant("playable", shownId);
    const forged = good.slice(0, -2) + (good.endsWith("AA") ? "BB" : "AA");
    const cases: [string, string, string][] = [
      ["forged signature", shownId, forged],
      ["grant for another kind of file", shownId, grant("poster", shownId)],
      ["grant for another recording than the beacon's", hiddenId, good],
      ["recording outside the link's scope", hiddenId, grant("playable", hiddenId)],
      ["not a grant at all", shownId, "hello"],
    ];
    for (const [what, recording, token] of cases) {
      const res = await beacon(null, sharedEvents(`bad-${what.replace(/\W+/g, "-")}`, recording, token));
      expect(await res.json(), what).toEqual({ stored: 0, ignored: 1 });
    }
    await db().update(s.shareLinks).set({ revokedAt: new Date() }).where(eq(s.shareLinks.id, linkId));
    expect(await (await beacon(null, sharedEvents("after-revoke", shownId, good))).json()).toEqual({ stored: 0, ignored: 1 });
    expect(await db().$count(s.playbackViews, eq(s.playbackViews.shareLinkId, linkId))).toBe(3); // shared-1, shared-2 and shared-4 only
    // and a revoked link's view takes no more beacons
    const after = { metadata: { transmission_timestamp: t0 + 20_000 }, events: [{ e: "pause", xid: "shared-4", vid: shownId, uti: t0 + 20_000, xwati: 19_000 }] };
    expect((await beacon(null, after)).status).toBe(401);
    expect((await viewRow("shared-4")).watchTimeMs).toBe(11_500);
  });
});
