// Property-based fuzz of the API with fast-check: arbitrary JSON bodies (right keys with wrong or
// hostile values, any JSON at all, bytes that are not JSON), arbitrary query strings, and arbitrary
// tus headers, sent as the owner from the app's own origin. The properties: never a 5xx; every
// refusal is a 4xx in the app's error shape; and a refused request writes nothing (fingerprint of
// every table, tests/support/db-fingerprint.ts). Run time is bounded by a fixed number of runs.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { closeDb } from "@/db/client";
import { env } from "@/lib/config/env";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { handleUploadRequest } from "@/lib/uploads/handle-upload-request";
import { demoActors, req, route, sessionCookie, type Actor, type DemoActorKey } from "@/tests/support/session";
import { changedTables, dbFingerprint } from "@/tests/support/db-fingerprint";
import { discoverRoutes, makeMatrixFixture, MATRIX } from "./authorization-matrix-rows";

// The fixture's ids (a real job, flight, recording...) are offered to the generators so that some
// bodies get past "not found" into the deeper checks.
type Fixture = Awaited<ReturnType<typeof makeMatrixFixture>>;
let actors: Record<DemoActorKey, Actor>;
let fx: Fixture;
const tally = { bodies: 0, queries: 0, tus: 0, accepted: 0 };

beforeAll(async () => {
  actors = await demoActors();
  fx = await makeMatrixFixture(actors.owner);
});
afterAll(async () => {
  console.log(`[fuzz] cases tried: ${tally.bodies} bodies, ${tally.queries} query strings, ${tally.tus} tus requests; ${tally.accepted} accepted (2xx)`);
  await closeQueues();
  await closeDb();
  await closeRedis();
});

// hostile text: control characters, unpaired surrogates, very long, SQL-ish, path-ish
const hostileString = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom("\u0000", "\ud800", "\udfff", "a\u0000b", "x\ud83d", "\u0007", "\u009b", "\u202e", "' OR 1=1 --", "../../etc/passwd", "%00", "\r\n", "NaN", "-1", "1e309", "true", "null", "{}", "[]", "") },
  { weight: 2, arbitrary: fc.string({ unit: "binary", maxLength: 40 }) },
  { weight: 1, arbitrary: fc.string({ minLength: 5000, maxLength: 6000 }) },
);
const anyJson = fc.jsonValue({ maxDepth: 3 });
const hostileValue = (ids: string[]) =>
  fc.oneof(
    { weight: 4, arbitrary: hostileString },
    { weight: 1, arbitrary: anyJson },
    { weight: 1, arbitrary: fc.constantFrom<unknown>(true, false, null, 0, -1, 1.5, Number.MAX_SAFE_INTEGER, 1e308, -1e308, [], {}, [null], { "": "" }, "00000000-0000-4000-8000-000000000000", ...ids) },
    { weight: 1, arbitrary: fc.integer() },
    { weight: 1, arbitrary: fc.double({ noNaN: true }) },
  );

// every key any of our input schemas knows, so the fuzz reaches past "unknown key" refusals
const KEYS = [
  "name", "contactName", "contactEmail", "notes", "clientId", "address", "latitude", "longitude", "timeZone", "assetKind", "launchNotes",
  "siteId", "title", "scope", "dueDate", "status", "pilotId", "reviewerId", "archived", "jobId", "flownOn", "aircraft", "launchLatitude",
  "launchLongitude", "maxAltitudeAglM", "recordingId", "startFrame", "startSec", "endFrame", "endSec", "severity", "categoryId", "note", "box",
  "heightAglM", "version", "reason", "hold", "recordingIds", "recorderOrder", "email", "role", "token", "password", "label", "recipientEmails",
  "expiresInDays", "passcode", "allowOriginals", "sendMail", "findingIds", "reportId", "event", "atSec", "positionBy", "groundDistance",
  "bearingDeg", "heightAgl", "units", "antennaOrientation", "cameraOrientation", "firmware", "flightId", "intervalIndex", "fps",
  "preferredUnits", "currentPassword", "newPassword", "metadata", "events",
];

function bodyArb(ids: string[]) {
  const objectOfKnownKeys = fc.dictionary(fc.constantFrom(...KEYS), hostileValue(ids), { maxKeys: 8 });
  return fc.oneof(
    { weight: 6, arbitrary: objectOfKnownKeys.map((o) => ({ kind: "json" as const, body: JSON.stringify(o) })) },
    { weight: 2, arbitrary: anyJson.map((v) => ({ kind: "json" as const, body: JSON.stringify(v) })) },
    { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 200 }).map((t) => ({ kind: "raw" as const, body: t })) },
    { weight: 1, arbitrary: fc.uint8Array({ maxLength: 200 }).map((b) => ({ kind: "bytes" as const, body: Buffer.from(b).toString("latin1") })) },
  );
}

// A valid body per route: most fuzz cases are this body with one to three fields replaced by a
// hostile value, so they reach the deeper checks (and the database) instead of failing on the first
// missing field.
function validBodies(f: Fixture): Record<string, Record<string, unknown>> {
  return {
    "POST /api/clients": { name: "Fuzz client", contactName: "Ann", contactEmail: "ann@example.test", notes: "Notes" },
    "PATCH /api/clients/[id]": { name: "Fuzz renamed", notes: "Notes" },
    "POST /api/sites": { clientId: f.clientId, name: "Fuzz site", address: "1 Lane", latitude: 54.4, longitude: -2.6, timeZone: "UTC", assetKind: "tower", launchNotes: "Pad" },
    "PATCH /api/sites/[id]": { name: "Fuzz site 2", address: "2 Lane" },
    "POST /api/jobs": { siteId: f.siteId, title: "Fuzz job", scope: "Scope", dueDate: "2026-04-01", status: "planned" },
    "PATCH /api/jobs/[id]": { title: "Fuzz job 2", scope: "Scope" },
    "PUT /api/jobs/[id]/hold": { hold: false, reason: "Reason" },
    "POST /api/flights": { jobId: f.jobId, flownOn: "2026-03-14", aircraft: "Quad", notes: "Notes" },
    "PATCH /api/flights/[id]": { aircraft: "Quad 2", notes: "Notes" },
    "POST /api/findings": { recordingId: f.recordingId, startFrame: 3, severity: "minor", note: "Crack" },
    "PATCH /api/findings/[id]": { note: "Crack 2", version: 1 },
    "POST /api/finding-categories": { name: "Fuzz category", assetKind: null },
    "PATCH /api/finding-categories/[id]": { name: "Fuzz category 2" },
    "POST /api/share-links": { jobId: f.jobId, scope: "job", label: "Fuzz link", sendMail: false, expiresInDays: 7 },
    "POST /api/recordings/[id]/tags": { name: "fuzz" },
    "POST /api/range-checks": { flightId: f.flightId, event: "first_degradation", positionBy: "distance", groundDistance: 500, bearingDeg: 90, heightAgl: 100, units: "m", notes: "Notes" },
    "PATCH /api/range-checks/[id]": { notes: "Notes", firmware: "1.0" },
    "POST /api/invitations": { email: "fuzz@example.test", role: "pilot" },
  };
}

function mutatedArb(template: Record<string, unknown>, ids: string[]) {
  const key = fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...Object.keys(template)) }, { weight: 1, arbitrary: fc.constantFrom(...KEYS) });
  return fc.array(fc.tuple(key, hostileValue(ids)), { minLength: 1, maxLength: 2 }).map((changes) => {
    const body: Record<string, unknown> = { ...template };
    for (const [k, v] of changes) body[k] = v;
    return { kind: "json" as const, body: JSON.stringify(body) };
  });
}

async function expectErrorShape(res: Response, label: string): Promise<void> {
  const text = await res.text();
  let body: { error?: { code?: unknown; message?: unknown } } | undefined;
  try {
    body = JSON.parse(text);
  } catch {
    body = undefined;
  }
  expect(typeof body?.error?.code, `${label}: ${res.status} ${text.slice(0, 200)}`).toBe("string");
  expect(typeof body?.error?.message, `${label}: ${text.slice(0, 200)}`).toBe("string");
}

/** One fuzz case: no 5xx; a refusal is a 4xx in our shape and leaves every table as it was. */
async function check(label: string, run: () => Promise<Response>, opts: { fingerprint: boolean } = { fingerprint: true }): Promise<void> {
  const before = opts.fingerprint ? await dbFingerprint() : null;
  const res = await run();
  expect(res.status, `${label}: ${res.status}`).toBeLessThan(500);
  if (res.status >= 400) {
    await expectErrorShape(res, label);
    // refused deletions and downloads are recorded in the custody chain by design
    if (before) expect(changedTables(before, await dbFingerprint()).filter((t) => t !== "custody_events"), label).toEqual([]);
  } else {
    tally.accepted++;
    await res.arrayBuffer().catch(() => null);
  }
}

const WRITE = /^(POST|PUT|PATCH|DELETE) /;

describe("fuzz", () => {
  it("JSON bodies of every state-changing route: never 5xx, a refusal writes nothing", async () => {
    const routes = (await discoverRoutes()).filter((r) => WRITE.test(r.key) && !r.key.includes("/api/auth/") && !r.key.includes("/api/uploads") && !r.key.includes("/api/collector"));
    const ids = [fx.jobId, fx.flightId, fx.siteId, fx.clientId, fx.recordingId, fx.findingId, fx.reportId, fx.categoryId];
    const valid = validBodies(fx);
    for (const r of routes) {
      const row = MATRIX[r.key];
      const method = r.key.split(" ")[0];
      // DELETE of real records (archiving a job, removing a member) would succeed: they get a record that does not exist
      const params = row?.params?.(fx) ?? {};
      const url = row?.url(fx) ?? r.key.split(" ")[1];
      await fc.assert(
        fc.asyncProperty(valid[r.key] ? fc.oneof({ weight: 3, arbitrary: mutatedArb(valid[r.key], ids) }, { weight: 1, arbitrary: bodyArb(ids) }) : bodyArb(ids), async (b) => {
          tally.bodies++;
          const headers: Record<string, string> = b.kind === "json" ? { "content-type": "application/json" } : { "content-type": "application/json; charset=utf-8" };
          await check(`${r.key} ${b.body.slice(0, 120)}`, async () => r.handler(await req(actors.owner, method, url, b.body, headers), route(params)));
        }),
        { numRuns: valid[r.key] ? 16 : 5, seed: 13 },
      );
    }
    expect(routes.length).toBeGreaterThan(30);
  });

  it("query strings of every read route: never 5xx, refusals in the error shape", async () => {
    const routes = (await discoverRoutes()).filter((r) => /^GET /.test(r.key) && !r.key.includes("/api/auth/"));
    const qKeys = fc.constantFrom("q", "page", "pageSize", "sort", "dir", "archived", "jobId", "flightId", "recordingId", "clientId", "siteId", "status", "role", "tag", "name", "from", "to", "units", "format", "x");
    const qValue = fc.oneof(hostileString, fc.integer().map(String), fc.constantFrom("", "-1", "0", "1e9", "asc", "desc", "1", fx.jobId, fx.flightId, fx.recordingId));
    for (const r of routes) {
      const row = MATRIX[r.key];
      const params = row?.params?.(fx) ?? {};
      const base = (row?.url(fx) ?? r.key.split(" ")[1]).split("?")[0];
      await fc.assert(
        fc.asyncProperty(fc.array(fc.tuple(qKeys, qValue), { maxLength: 5 }), async (pairs) => {
          tally.queries++;
          const qs = new URLSearchParams();
          for (const [k, v] of pairs) qs.append(k, v.replace(/[\ud800-\udfff]/g, "")); // a URL cannot carry a lone surrogate
          // reads: status and shape only (the matrix test checks that reads write nothing)
          await check(`${r.key}?${qs}`, async () => r.handler(await req(actors.owner, "GET", `${base}?${qs}`), route(params)), { fingerprint: false });
        }),
        { numRuns: 8, seed: 13 },
      );
    }
  });

  it("tus headers on creation, PATCH, HEAD and DELETE: never 5xx, a refusal writes nothing", async () => {
    const cookie = await sessionCookie(actors.pilot!);
    const origin = new URL(env().APP_URL).origin;
    const b64 = (s: string) => Buffer.from(s).toString("base64");
    const metadata = fc.oneof(
      hostileString,
      fc.array(fc.tuple(fc.constantFrom("jobId", "flightId", "filename", "filetype", "relativePath", "lastModified", "cairnOrg", "x"), hostileValue([fx.jobId, fx.flightId])), { maxLength: 6 }).map((pairs) =>
        pairs.map(([k, v]) => `${k} ${b64(typeof v === "string" ? v : JSON.stringify(v) ?? "")}`).join(","),
      ),
    );
    const header = fc.oneof(hostileString, fc.integer().map(String), fc.constantFrom("0", "-1", "1e3", "18446744073709551616", "1.0.0", "0.2.2", ""));
    const arb = fc.record({
      method: fc.constantFrom("POST", "PATCH", "HEAD", "DELETE"),
      id: fc.oneof(fc.constant(""), fc.string({ unit: fc.constantFrom(..."0123456789abcdef"), minLength: 32, maxLength: 32 }), hostileString.map((s) => encodeURIComponent(s.replace(/[\ud800-\udfff]/g, "")))),
      tusResumable: fc.oneof(fc.constant("1.0.0"), header),
      uploadLength: fc.option(header, { nil: undefined }),
      uploadOffset: fc.option(header, { nil: undefined }),
      uploadDeferLength: fc.option(header, { nil: undefined }),
      metadata: fc.option(metadata, { nil: undefined }),
      contentType: fc.option(fc.constantFrom("application/offset+octet-stream", "text/plain", "application/json", ""), { nil: undefined }),
      body: fc.option(fc.uint8Array({ maxLength: 64 }), { nil: undefined }),
    });
    await fc.assert(
      fc.asyncProperty(arb, async (c) => {
        tally.tus++;
        const h: Record<string, string> = { cookie, origin };
        const put = (k: string, v: string | undefined) => {
          if (v !== undefined) h[k] = v.replace(/[^\t\x20-\x7e\x80-\xff]/g, "?"); // what a header can carry
        };
        put("tus-resumable", c.tusResumable);
        put("upload-length", c.uploadLength);
        put("upload-offset", c.uploadOffset);
        put("upload-defer-length", c.uploadDeferLength);
        put("upload-metadata", c.metadata);
        put("content-type", c.contentType);
        const url = `http://localhost/api/uploads${c.id ? `/${c.id}` : ""}`;
        const withBody = c.body && (c.method === "PATCH" || c.method === "POST");
        await check(`tus ${c.method} ${JSON.stringify(h).slice(0, 200)}`, () =>
          handleUploadRequest(new Request(url, { method: c.method, headers: h, body: withBody ? Buffer.from(c.body!) : undefined })),
        );
      }),
      { numRuns: 150, seed: 13 },
    );
  });
});
