// Text input at every boundary: a NUL character or an unpaired UTF-16 surrogate in any text field
// (JSON body or query string) is a 422 that names the field, nothing is written, and nothing about
// the request (least of all a bound query parameter) reaches the log. The unpaired surrogate is not
// a Unicode scalar value and has no UTF-8 encoding (RFC 3629 section 3; Unicode 15, section 3.9 D76).
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import * as clients from "@/app/api/clients/route";
import * as client from "@/app/api/clients/[id]/route";
import * as sites from "@/app/api/sites/route";
import * as site from "@/app/api/sites/[id]/route";
import * as jobs from "@/app/api/jobs/route";
import * as job from "@/app/api/jobs/[id]/route";
import * as hold from "@/app/api/jobs/[id]/hold/route";
import * as flights from "@/app/api/flights/route";
import * as flight from "@/app/api/flights/[id]/route";
import * as findings from "@/app/api/findings/route";
import * as finding from "@/app/api/findings/[id]/route";
import * as categories from "@/app/api/finding-categories/route";
import * as category from "@/app/api/finding-categories/[id]/route";
import * as shareLinks from "@/app/api/share-links/route";
import * as deletion from "@/app/api/recordings/[id]/deletion/route";
import * as tags from "@/app/api/recordings/[id]/tags/route";
import * as recordings from "@/app/api/recordings/route";
import * as rangeChecks from "@/app/api/range-checks/route";
import * as rangeCheck from "@/app/api/range-checks/[id]/route";
import * as invitations from "@/app/api/invitations/route";
import * as accept from "@/app/api/invitations/accept/route";
import * as members from "@/app/api/members/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { errorResponse } from "@/lib/api/errors";
import { demoActors, demoOrganisationId, req, route, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeSharedJob } from "@/tests/integration/sharing/share-fixtures";
import { changedTables, dbFingerprint } from "@/tests/support/db-fingerprint";
import { sql } from "drizzle-orm";

type Handler = (r: Request, c: ReturnType<typeof route>) => Promise<Response>;
type Case = { label: string; handler: Handler; method: string; url: string; params?: Record<string, string>; body?: (bad: string) => unknown; query?: string; field: string; as?: DemoActorKey };

const BAD = { NUL: "before\u0000after", "unpaired surrogate": "before\ud800after" } as const;

let actors: Record<DemoActorKey, Actor>;
let orgId: string;
let fx: Awaited<ReturnType<typeof makeSharedJob>>;
let siteId: string;
let clientId: string;
let categoryId: string;
let rangeCheckId: string;
const logged: string[] = [];

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
  fx = await makeSharedJob(orgId);
  const [j] = await db().select({ siteId: s.jobs.siteId }).from(s.jobs).where(sql`${s.jobs.id} = ${fx.jobId}`);
  siteId = j.siteId;
  const [st] = await db().select({ clientId: s.sites.clientId }).from(s.sites).where(sql`${s.sites.id} = ${siteId}`);
  clientId = st.clientId;
  const [c] = await db().insert(s.findingCategories).values({ organisationId: orgId, name: `Text rule ${Date.now()}` }).returning();
  categoryId = c.id;
  const rc = await rangeChecks.POST(await req(actors.owner, "POST", "/api/range-checks", rangeBody({})));
  expect(rc.status, await rc.clone().text()).toBe(201);
  rangeCheckId = (await rc.json()).id;
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
  await closeRedis();
});

// every console line while a request runs
beforeEach(() => {
  logged.length = 0;
  for (const m of ["error", "warn", "log", "info", "debug"] as const) {
    vi.spyOn(console, m).mockImplementation((...args: unknown[]) => {
      logged.push(args.map((a) => (a instanceof Error ? `${a.stack}\n${JSON.stringify(a, Object.getOwnPropertyNames(a))}` : typeof a === "string" ? a : JSON.stringify(a))).join(" "));
    });
  }
});
afterEach(() => vi.restoreAllMocks());

const rangeBody = (over: Record<string, unknown>) => ({
  flightId: fx.flightId,
  event: "first_degradation",
  positionBy: "distance",
  groundDistance: 1926,
  bearingDeg: 214,
  heightAgl: 400,
  units: "ft",
  ...over,
});

function cases(): Case[] {
  const id = (v: string) => ({ id: v });
  return [
    { label: "POST /api/clients name", handler: clients.POST, method: "POST", url: "/api/clients", body: (b) => ({ name: b }), field: "name" },
    { label: "POST /api/clients contactName", handler: clients.POST, method: "POST", url: "/api/clients", body: (b) => ({ name: "Fine", contactName: b }), field: "contactName" },
    { label: "POST /api/clients notes", handler: clients.POST, method: "POST", url: "/api/clients", body: (b) => ({ name: "Fine", notes: b }), field: "notes" },
    { label: "PATCH /api/clients/:id name", handler: client.PATCH, method: "PATCH", url: "/api/clients/x", params: id(clientId), body: (b) => ({ name: b }), field: "name" },
    { label: "POST /api/sites address", handler: sites.POST, method: "POST", url: "/api/sites", body: (b) => ({ clientId, name: "Fine", address: b }), field: "address" },
    { label: "PATCH /api/sites/:id launchNotes", handler: site.PATCH, method: "PATCH", url: "/api/sites/x", params: id(siteId), body: (b) => ({ launchNotes: b }), field: "launchNotes" },
    { label: "POST /api/jobs title", handler: jobs.POST, method: "POST", url: "/api/jobs", body: (b) => ({ siteId, title: b }), field: "title" },
    { label: "PATCH /api/jobs/:id scope", handler: job.PATCH, method: "PATCH", url: "/api/jobs/x", params: id(fx.jobId), body: (b) => ({ scope: b }), field: "scope" },
    { label: "PUT /api/jobs/:id/hold reason", handler: hold.PUT, method: "PUT", url: "/api/jobs/x/hold", params: id(fx.jobId), body: (b) => ({ hold: true, reason: b }), field: "reason" },
    { label: "POST /api/flights aircraft", handler: flights.POST, method: "POST", url: "/api/flights", body: (b) => ({ jobId: fx.jobId, flownOn: "2026-03-14", aircraft: b }), field: "aircraft" },
    { label: "PATCH /api/flights/:id notes", handler: flight.PATCH, method: "PATCH", url: "/api/flights/x", params: id(fx.flightId), body: (b) => ({ notes: b }), field: "notes" },
    { label: "POST /api/findings note", handler: findings.POST, method: "POST", url: "/api/findings", body: (b) => ({ recordingId: fx.recA.id, startFrame: 3, severity: "minor", note: b }), field: "note" },
    { label: "PATCH /api/findings/:id note", handler: finding.PATCH, method: "PATCH", url: "/api/findings/x", params: id(fx.fA.finding.id), body: (b) => ({ note: b, version: fx.fA.finding.version }), field: "note" },
    { label: "DELETE /api/findings/:id reason", handler: finding.DELETE, method: "DELETE", url: "/api/findings/x", params: id(fx.fB.finding.id), body: (b) => ({ reason: b }), field: "reason" },
    { label: "POST /api/finding-categories name", handler: categories.POST, method: "POST", url: "/api/finding-categories", body: (b) => ({ name: b }), field: "name" },
    { label: "PATCH /api/finding-categories/:id name", handler: category.PATCH, method: "PATCH", url: "/api/finding-categories/x", params: id(categoryId), body: (b) => ({ name: b }), field: "name" },
    { label: "POST /api/share-links label", handler: shareLinks.POST, method: "POST", url: "/api/share-links", body: (b) => ({ jobId: fx.jobId, scope: "job", label: b, sendMail: false }), field: "label" },
    { label: "POST /api/share-links passcode", handler: shareLinks.POST, method: "POST", url: "/api/share-links", body: (b) => ({ jobId: fx.jobId, scope: "job", label: "Fine", passcode: `123456${b}`, sendMail: false }), field: "passcode" },
    { label: "POST /api/recordings/:id/deletion reason", handler: deletion.POST, method: "POST", url: "/api/recordings/x/deletion", params: id(fx.recB.id), body: (b) => ({ reason: b }), field: "reason" },
    { label: "POST /api/recordings/:id/tags name", handler: tags.POST, method: "POST", url: "/api/recordings/x/tags", params: id(fx.recA.id), body: (b) => ({ name: b }), field: "name" },
    { label: "DELETE /api/recordings/:id/tags ?name", handler: tags.DELETE, method: "DELETE", url: "/api/recordings/x/tags", params: id(fx.recA.id), query: "name", field: "name" },
    { label: "POST /api/range-checks notes", handler: rangeChecks.POST, method: "POST", url: "/api/range-checks", body: (b) => rangeBody({ notes: b }), field: "notes" },
    { label: "POST /api/range-checks antennaOrientation", handler: rangeChecks.POST, method: "POST", url: "/api/range-checks", body: (b) => rangeBody({ antennaOrientation: b }), field: "antennaOrientation" },
    { label: "POST /api/range-checks latitude (text)", handler: rangeChecks.POST, method: "POST", url: "/api/range-checks", body: (b) => rangeBody({ positionBy: "coordinates", latitude: `54.4${b}`, longitude: "-2.6", groundDistance: null, bearingDeg: null }), field: "latitude" },
    { label: "PATCH /api/range-checks/:id firmware", handler: rangeCheck.PATCH, method: "PATCH", url: "/api/range-checks/x", params: id(""), body: (b) => ({ firmware: b }), field: "firmware" },
    { label: "POST /api/invitations email", handler: invitations.POST, method: "POST", url: "/api/invitations", body: (b) => ({ email: `a${b}@example.test`, role: "pilot" }), field: "email" },
    { label: "POST /api/invitations/accept name", handler: accept.POST, method: "POST", url: "/api/invitations/accept", body: (b) => ({ token: "A".repeat(43), name: b, password: "a long enough password" }), field: "name" },
    { label: "GET /api/clients ?q", handler: clients.GET, method: "GET", url: "/api/clients", query: "q", field: "q" },
    { label: "GET /api/jobs ?q", handler: jobs.GET, method: "GET", url: "/api/jobs", query: "q", field: "q" },
    { label: "GET /api/sites ?q", handler: sites.GET, method: "GET", url: "/api/sites", query: "q", field: "q" },
    { label: "GET /api/flights ?q", handler: flights.GET, method: "GET", url: "/api/flights", query: "q", field: "q" },
    { label: "GET /api/members ?q", handler: members.GET, method: "GET", url: "/api/members", query: "q", field: "q" },
    { label: "GET /api/recordings ?tag", handler: recordings.GET, method: "GET", url: "/api/recordings", query: "tag", field: "tag" },
    { label: "GET /api/clients ?sort", handler: clients.GET, method: "GET", url: "/api/clients", query: "sort", field: "sort" },
  ];
}

describe("NUL and unpaired surrogates in every text field", () => {
  for (const [what, bad] of Object.entries(BAD)) {
    it(`${what}: 422 naming the field, nothing written, nothing logged`, async () => {
      const failures: string[] = [];
      for (const c of cases()) {
        const params = c.params?.id === "" ? { id: rangeCheckId } : (c.params ?? {});
        // a URL cannot carry an unpaired surrogate: percent-decoding reads UTF-8 and turns the
        // surrogate's bytes (ED A0 80) into U+FFFD (WHATWG URL standard); send them anyway
        const inQuery = what === "NUL" ? encodeURIComponent(bad) : "before%ED%A0%80after";
        const url = c.query ? `${c.url}?${c.query}=${inQuery}` : c.url;
        const request = await req(actors[c.as ?? "owner"], c.method, url, c.body?.(bad));
        const before = await dbFingerprint();
        logged.length = 0;
        const res = await c.handler(request, route(params));
        const text = await res.text();
        const changed = changedTables(before, await dbFingerprint());
        let fields: Record<string, string[]> | undefined;
        try {
          fields = JSON.parse(text).error?.fields;
        } catch {
          fields = undefined;
        }
        if (c.query && what !== "NUL") {
          if (res.status >= 500) failures.push(`${c.label}: ${res.status} ${text.slice(0, 200)}`);
        } else if (res.status !== 422) failures.push(`${c.label}: ${res.status} ${text.slice(0, 200)}`);
        else if (!fields?.[c.field]) failures.push(`${c.label}: 422 without field ${c.field}: ${text.slice(0, 200)}`);
        if (changed.length) failures.push(`${c.label}: wrote to ${changed.join(", ")}`);
        if (logged.length) failures.push(`${c.label}: logged ${logged.join(" | ").slice(0, 300)}`);
      }
      expect(failures).toEqual([]);
    });
  }

  it("multi-line fields keep tabs and line breaks; single-line fields refuse them", async () => {
    const ok = await clients.POST(await req(actors.owner, "POST", "/api/clients", { name: "Multi-line notes", notes: "first line\n\tsecond line\r\nthird" }));
    expect(ok.status).toBe(201);
    expect((await ok.json()).notes).toBe("first line\n\tsecond line\r\nthird");
    const bad = await clients.POST(await req(actors.owner, "POST", "/api/clients", { name: "Two\nlines" }));
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.fields.name[0]).toMatch(/single line/);
    // characters outside the Basic Multilingual Plane are a surrogate pair, not a broken one
    const astral = await clients.POST(await req(actors.owner, "POST", "/api/clients", { name: "Tower \u{1F6F0} west" }));
    expect(astral.status).toBe(201);
  });
});

describe("database errors in the log", () => {
  it("are logged without their bound parameters (drizzle's and postgres.js's)", async () => {
    const secret = "token-hash-that-must-not-be-logged";
    let caught: unknown;
    try {
      // a NUL reaches PostgreSQL only through a path that skipped validation: this is such a path
      await db().execute(sql`select ${secret + "\u0000"}::text as v`);
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeDefined();
    logged.length = 0;
    const res = errorResponse(caught);
    expect(res.status).toBe(500);
    expect(logged.length).toBeGreaterThan(0);
    expect(logged.join("\n")).not.toContain(secret);
    expect(logged.join("\n")).toMatch(/withheld/);
  });
});
