// The rows of the authorization matrix (tests/integration/security/authorization-matrix.test.ts),
// the route discovery and the records they point at; shared with the API fuzz (api-fuzz.test.ts).
import { readdir } from "node:fs/promises";
import path from "node:path";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";
import { signMediaGrant } from "@/lib/sharing/media-grant";
import { and, eq } from "drizzle-orm";
import * as rangeChecksApi from "@/app/api/range-checks/route";
import * as invitationsApi from "@/app/api/invitations/route";
import { env } from "@/lib/config/env";
import { demoOrganisationId, req, type Actor } from "@/tests/support/session";
import { makeSharedJob } from "@/tests/integration/sharing/share-fixtures";

export const ACTORS = ["anonymous", "client", "pilot", "reviewer", "owner", "other"] as const;
const NOWHERE = "00000000-0000-4000-8000-000000000000";

export type Fixture = {
  jobId: string;
  flightId: string;
  siteId: string;
  clientId: string;
  recordingId: string;
  findingId: string;
  reportId: string;
  categoryId: string;
  rangeCheckId: string;
  invitationId: string;
  shareLinkId: string;
  shareToken: string;
  mediaGrant: string;
  pilotUserId: string;
};

export type MatrixRow = {
  /** the URL as a client sends it; :name is filled from `params` */
  url: (f: Fixture) => string;
  params?: (f: Fixture) => Record<string, string | string[]>;
  body?: unknown;
  headers?: Record<string, string>;
  /** statuses for anonymous, client, pilot, reviewer, owner, other */
  expect: string;
  /** rows that write on purpose for an allowed actor (never used: every row is read-only or refused) */
  skip?: string;
};

const id = (k: keyof Fixture) => (f: Fixture) => ({ id: f[k] });
const none = () => ({ id: NOWHERE });
const tus = { "tus-resumable": "1.0.0" };

// "METHOD /api/path" as the route folder names it -> the row
export const MATRIX: Record<string, MatrixRow> = {
  "GET /api/auth/[...nextauth]": { url: () => "/api/auth/session", expect: "", skip: "next-auth's own routes" },
  "POST /api/auth/[...nextauth]": { url: () => "/api/auth/signout", expect: "", skip: "next-auth's own routes (its CSRF token)" },

  "GET /api/attention": { url: () => "/api/attention", expect: "401 200 200 200 200 200" },

  "GET /api/clients": { url: () => "/api/clients", expect: "401 200 200 200 200 200" },
  "POST /api/clients": { url: () => "/api/clients", body: { name: "" }, expect: "401 403 403 403 422 422" },
  "GET /api/clients/[id]": { url: (f) => `/api/clients/${f.clientId}`, params: id("clientId"), expect: "401 404 200 200 200 404" },
  "PATCH /api/clients/[id]": { url: (f) => `/api/clients/${f.clientId}`, params: id("clientId"), body: { name: "" }, expect: "401 403 403 403 422 422" },
  "DELETE /api/clients/[id]": { url: () => `/api/clients/${NOWHERE}`, params: none, expect: "401 403 403 403 404 404" },

  "POST /api/collector": { url: () => "/api/collector?via=localhost", body: { metadata: {}, events: [] }, expect: "401 200 200 200 200 200" },
  "OPTIONS /api/collector": { url: () => "/api/collector", expect: "204 204 204 204 204 204" },
  "GET /api/collector/views": { url: (f) => `/api/collector/views?recordingId=${f.recordingId}`, expect: "401 403 200 200 200 404" },

  "GET /api/custody": { url: (f) => `/api/custody?jobId=${f.jobId}`, expect: "401 403 200 200 200 404" },
  "GET /api/custody/filters": { url: (f) => `/api/custody/filters?jobId=${f.jobId}`, expect: "401 403 200 200 200 404" },
  "GET /api/custody/export": { url: (f) => `/api/custody/export?jobId=${f.jobId}`, expect: "401 403 200 200 200 404" },
  "POST /api/custody/verify": { url: () => "/api/custody/verify", expect: "401 403 200 200 200 200" },

  "GET /api/evidence-packages": { url: (f) => `/api/evidence-packages?jobId=${f.jobId}`, expect: "401 403 200 200 200 404" },
  "POST /api/evidence-packages": { url: () => "/api/evidence-packages", body: { jobId: "nope" }, expect: "401 403 403 422 422 422" },
  "GET /api/evidence-packages/[id]": { url: () => `/api/evidence-packages/${NOWHERE}`, params: none, expect: "401 403 404 404 404 404" },
  "GET /api/evidence-packages/[id]/download": { url: () => `/api/evidence-packages/${NOWHERE}/download`, params: none, headers: { range: "bytes=0-0" }, expect: "401 403 404 404 404 404" },
  "HEAD /api/evidence-packages/[id]/download": { url: () => `/api/evidence-packages/${NOWHERE}/download`, params: none, expect: "401 403 404 404 404 404" },
  "PUT /api/evidence-packages/[id]/share": { url: () => `/api/evidence-packages/${NOWHERE}/share`, params: none, body: { shareLinkId: null }, expect: "401 403 403 403 404 404" },

  "GET /api/finding-categories": { url: () => "/api/finding-categories", expect: "401 200 200 200 200 200" },
  "POST /api/finding-categories": { url: () => "/api/finding-categories", body: { name: "" }, expect: "401 403 403 422 422 422" },
  "POST /api/finding-categories/defaults": { url: () => "/api/finding-categories/defaults", expect: "", skip: "restores defaults for an allowed actor (idempotent write): covered by the findings API tests" },
  "PATCH /api/finding-categories/[id]": { url: (f) => `/api/finding-categories/${f.categoryId}`, params: id("categoryId"), body: { name: "" }, expect: "401 403 403 422 422 422" },
  "DELETE /api/finding-categories/[id]": { url: () => `/api/finding-categories/${NOWHERE}`, params: none, expect: "401 403 403 404 404 404" },

  "GET /api/findings": { url: (f) => `/api/findings?jobId=${f.jobId}`, expect: "401 200 200 200 200 200" },
  "POST /api/findings": { url: () => "/api/findings", body: { severity: "nope" }, expect: "401 403 403 422 422 422" },
  "GET /api/findings/[id]": { url: (f) => `/api/findings/${f.findingId}`, params: id("findingId"), expect: "401 404 200 200 200 404" },
  "PATCH /api/findings/[id]": { url: (f) => `/api/findings/${f.findingId}`, params: id("findingId"), body: { severity: "nope" }, expect: "401 403 403 422 422 422" },
  "DELETE /api/findings/[id]": { url: () => `/api/findings/${NOWHERE}`, params: none, expect: "401 403 403 404 404 404" },
  "GET /api/findings/[id]/history": { url: (f) => `/api/findings/${f.findingId}/history`, params: id("findingId"), expect: "401 404 200 200 200 404" },
  "POST /api/findings/[id]/still": { url: () => `/api/findings/${NOWHERE}/still`, params: none, expect: "401 403 403 404 404 404" },

  "GET /api/flights": { url: () => "/api/flights", expect: "401 200 200 200 200 200" },
  "POST /api/flights": { url: () => "/api/flights", body: { jobId: "nope" }, expect: "401 403 422 403 422 422" },
  "GET /api/flights/[id]": { url: (f) => `/api/flights/${f.flightId}`, params: id("flightId"), expect: "401 404 200 200 200 404" },
  "PATCH /api/flights/[id]": { url: (f) => `/api/flights/${f.flightId}`, params: id("flightId"), body: { flownOn: "nope" }, expect: "401 403 422 403 422 422" },
  "DELETE /api/flights/[id]": { url: () => `/api/flights/${NOWHERE}`, params: none, expect: "401 403 404 403 404 404" },
  "PATCH /api/flights/[id]/order": { url: (f) => `/api/flights/${f.flightId}/order`, params: id("flightId"), body: { recordingIds: [] }, expect: "401 403 422 403 422 422" },
  "GET /api/flights/[id]/timeline": { url: (f) => `/api/flights/${f.flightId}/timeline`, params: id("flightId"), expect: "401 404 200 200 200 404" },
  "GET /api/flights/[id]/track": { url: (f) => `/api/flights/${f.flightId}/track`, params: id("flightId"), expect: "401 403 200 200 200 404" },
  "POST /api/flights/[id]/track": { url: (f) => `/api/flights/${f.flightId}/track`, params: id("flightId"), body: { fileName: "", contentBase64: "" }, expect: "401 403 422 403 422 422" },
  "POST /api/flights/[id]/track/alignment": { url: (f) => `/api/flights/${f.flightId}/track/alignment`, params: id("flightId"), body: { method: "nope" }, expect: "401 403 422 403 422 422" },
  "POST /api/flights/[id]/track/range-checks": { url: (f) => `/api/flights/${f.flightId}/track/range-checks`, params: id("flightId"), body: { recordingId: "nope" }, expect: "401 403 422 403 422 422" },

  "GET /api/invitations": { url: () => "/api/invitations", expect: "401 403 403 403 200 200" },
  "POST /api/invitations": { url: () => "/api/invitations", body: { email: "nope", role: "pilot" }, expect: "401 403 403 403 422 422" },
  "DELETE /api/invitations/[id]": { url: () => `/api/invitations/${NOWHERE}`, params: none, expect: "401 403 403 403 404 404" },
  "POST /api/invitations/accept": { url: () => "/api/invitations/accept", body: { token: "A".repeat(43) }, expect: "404 404 404 404 404 404" },

  "GET /api/jobs": { url: () => "/api/jobs", expect: "401 200 200 200 200 200" },
  "POST /api/jobs": { url: () => "/api/jobs", body: { title: "" }, expect: "401 403 403 403 422 422" },
  "GET /api/jobs/[id]": { url: (f) => `/api/jobs/${f.jobId}`, params: id("jobId"), expect: "401 404 200 200 200 404" },
  "PATCH /api/jobs/[id]": { url: (f) => `/api/jobs/${f.jobId}`, params: id("jobId"), body: { title: "" }, expect: "401 403 403 403 422 422" },
  "DELETE /api/jobs/[id]": { url: () => `/api/jobs/${NOWHERE}`, params: none, expect: "401 403 403 403 404 404" },
  "GET /api/jobs/[id]/hold": { url: (f) => `/api/jobs/${f.jobId}/hold`, params: id("jobId"), expect: "401 404 200 200 200 404" },
  "PUT /api/jobs/[id]/hold": { url: (f) => `/api/jobs/${f.jobId}/hold`, params: id("jobId"), body: { hold: "yes" }, expect: "401 403 403 403 422 422" },

  "GET /api/media/recordings/[id]/[file]": { url: (f) => `/api/media/recordings/${f.recordingId}/poster.jpg`, params: (f) => ({ id: f.recordingId, file: "poster.jpg" }), expect: "401 404 200 200 200 404" },
  "HEAD /api/media/recordings/[id]/[file]": { url: (f) => `/api/media/recordings/${f.recordingId}/poster.jpg`, params: (f) => ({ id: f.recordingId, file: "poster.jpg" }), expect: "401 404 200 200 200 404" },
  "GET /api/media/stills/[id]": { url: () => `/api/media/stills/${NOWHERE}`, params: none, expect: "401 404 404 404 404 404" },
  "HEAD /api/media/stills/[id]": { url: () => `/api/media/stills/${NOWHERE}`, params: none, expect: "401 404 404 404 404 404" },

  "GET /api/members": { url: () => "/api/members", expect: "401 200 200 200 200 200" },
  "PATCH /api/members/[userId]": { url: (f) => `/api/members/${f.pilotUserId}`, params: (f) => ({ userId: f.pilotUserId }), body: { role: "nope" }, expect: "401 403 403 403 422 422" },
  "GET /api/members/[userId]/clients": { url: (f) => `/api/members/${f.pilotUserId}/clients`, params: (f) => ({ userId: f.pilotUserId }), expect: "401 403 403 403 200 404" },
  "PUT /api/members/[userId]/clients": { url: (f) => `/api/members/${f.pilotUserId}/clients`, params: (f) => ({ userId: f.pilotUserId }), body: { clientIds: "nope" }, expect: "401 403 403 403 422 422" },
  "DELETE /api/members/[userId]": { url: () => `/api/members/${NOWHERE}`, params: () => ({ userId: NOWHERE }), expect: "401 403 403 403 404 404" },

  "GET /api/range-checks": { url: () => "/api/range-checks", expect: "401 403 200 200 200 200" },
  "POST /api/range-checks": { url: () => "/api/range-checks", body: { event: "nope" }, expect: "401 403 422 403 422 422" },
  "GET /api/range-checks/[id]": { url: (f) => `/api/range-checks/${f.rangeCheckId}`, params: id("rangeCheckId"), expect: "401 403 200 200 200 404" },
  "PATCH /api/range-checks/[id]": { url: (f) => `/api/range-checks/${f.rangeCheckId}`, params: id("rangeCheckId"), body: { event: "nope" }, expect: "401 403 422 403 422 422" },
  "DELETE /api/range-checks/[id]": { url: () => `/api/range-checks/${NOWHERE}`, params: none, expect: "401 403 404 403 404 404" },
  "GET /api/range-checks/chart": { url: () => "/api/range-checks/chart", expect: "401 403 200 200 200 200" },
  "GET /api/range-checks/export.csv": { url: () => "/api/range-checks/export.csv", expect: "401 403 200 200 200 200" },
  "POST /api/range-checks/from-trace": { url: () => "/api/range-checks/from-trace", body: { flightId: "nope" }, expect: "401 403 422 403 422 422" },
  "GET /api/range-checks/trace-events": { url: (f) => `/api/range-checks/trace-events?flightId=${f.flightId}`, expect: "401 403 200 200 200 404" },

  "GET /api/recordings": { url: () => "/api/recordings", expect: "401 200 200 200 200 200" },
  "GET /api/recordings/[id]": { url: (f) => `/api/recordings/${f.recordingId}`, params: id("recordingId"), expect: "401 404 200 200 200 404" },
  "POST /api/recordings/[id]/deletion": { url: (f) => `/api/recordings/${f.recordingId}/deletion`, params: id("recordingId"), body: { reason: 5 }, expect: "401 404 422 422 422 422" },
  "GET /api/recordings/[id]/original": { url: () => `/api/recordings/${NOWHERE}/original`, params: none, expect: "401 403 404 404 404 404" },
  "HEAD /api/recordings/[id]/original": { url: () => `/api/recordings/${NOWHERE}/original`, params: none, expect: "401 403 404 404 404 404" },
  "GET /api/recordings/[id]/progress": { url: (f) => `/api/recordings/${f.recordingId}/progress`, params: id("recordingId"), expect: "401 404 200 200 200 404" },
  "POST /api/recordings/[id]/reprocess": { url: (f) => `/api/recordings/${f.recordingId}/reprocess`, params: id("recordingId"), body: { fps: "nope" }, expect: "401 403 422 403 422 422" },
  "GET /api/recordings/[id]/tags": { url: (f) => `/api/recordings/${f.recordingId}/tags`, params: id("recordingId"), expect: "401 404 200 200 200 404" },
  "POST /api/recordings/[id]/tags": { url: (f) => `/api/recordings/${f.recordingId}/tags`, params: id("recordingId"), body: { name: "" }, expect: "401 403 422 422 422 422" },
  "DELETE /api/recordings/[id]/tags": { url: (f) => `/api/recordings/${f.recordingId}/tags`, params: id("recordingId"), expect: "401 403 422 422 422 422" },
  "GET /api/recordings/[id]/trace": { url: (f) => `/api/recordings/${f.recordingId}/trace`, params: id("recordingId"), expect: "401 404 200 200 200 404" },

  "GET /api/reports": { url: (f) => `/api/reports?jobId=${f.jobId}`, expect: "401 200 200 200 200 200" },
  "POST /api/reports": { url: () => "/api/reports", body: { jobId: "nope" }, expect: "401 403 403 422 422 422" },
  "GET /api/reports/[id]": { url: (f) => `/api/reports/${f.reportId}`, params: id("reportId"), expect: "401 404 200 200 200 404" },
  "POST /api/reports/[id]/approve": { url: () => `/api/reports/${NOWHERE}/approve`, params: none, expect: "401 403 403 403 404 404" },
  "GET /api/reports/[id]/download": { url: (f) => `/api/reports/${f.reportId}/download`, params: id("reportId"), headers: { range: "bytes=1-1" }, expect: "401 404 206 206 206 404" },
  "HEAD /api/reports/[id]/download": { url: (f) => `/api/reports/${f.reportId}/download`, params: id("reportId"), expect: "401 404 200 200 200 404" },

  "GET /api/retention": { url: () => "/api/retention", expect: "401 403 403 403 200 200" },
  "PUT /api/retention": { url: () => "/api/retention", body: { target: "nope" }, expect: "401 403 403 403 422 422" },
  "POST /api/retention/jobs/[id]/disposal": { url: () => `/api/retention/jobs/${NOWHERE}/disposal`, params: none, body: {}, expect: "401 403 403 403 422 422" },
  "POST /api/retention/jobs/[id]/final-package": { url: () => `/api/retention/jobs/${NOWHERE}/final-package`, params: none, body: {}, expect: "401 403 403 403 404 404" },

  "GET /api/s/[token]/manifest": { url: (f) => `/api/s/${f.shareToken}/manifest`, params: (f) => ({ token: f.shareToken }), expect: "200 200 200 200 200 200" },
  "GET /api/s/[token]/package": { url: (f) => `/api/s/${f.shareToken}/package`, params: (f) => ({ token: f.shareToken }), expect: "404 404 404 404 404 404" },
  "HEAD /api/s/[token]/package": { url: (f) => `/api/s/${f.shareToken}/package`, params: (f) => ({ token: f.shareToken }), expect: "404 404 404 404 404 404" },
  "GET /api/s/media/[grant]": { url: (f) => `/api/s/media/${f.mediaGrant}`, params: (f) => ({ grant: f.mediaGrant }), expect: "200 200 200 200 200 200" },
  "HEAD /api/s/media/[grant]": { url: (f) => `/api/s/media/${f.mediaGrant}`, params: (f) => ({ grant: f.mediaGrant }), expect: "200 200 200 200 200 200" },

  "GET /api/share-links": { url: (f) => `/api/share-links?jobId=${f.jobId}`, expect: "401 403 403 403 200 404" },
  "POST /api/share-links": { url: () => "/api/share-links", body: { scope: "nope" }, expect: "401 403 403 403 422 422" },
  "GET /api/share-links/[id]": { url: (f) => `/api/share-links/${f.shareLinkId}`, params: id("shareLinkId"), expect: "401 403 403 403 200 404" },
  "DELETE /api/share-links/[id]": { url: () => `/api/share-links/${NOWHERE}`, params: none, expect: "401 403 403 403 404 404" },
  "GET /api/share-links/options": { url: (f) => `/api/share-links/options?jobId=${f.jobId}`, expect: "401 403 403 403 200 404" },

  "GET /api/sites": { url: () => "/api/sites", expect: "401 200 200 200 200 200" },
  "POST /api/sites": { url: () => "/api/sites", body: { name: "" }, expect: "401 403 403 403 422 422" },
  "GET /api/sites/[id]": { url: (f) => `/api/sites/${f.siteId}`, params: id("siteId"), expect: "401 404 200 200 200 404" },
  "PATCH /api/sites/[id]": { url: (f) => `/api/sites/${f.siteId}`, params: id("siteId"), body: { name: "" }, expect: "401 403 403 403 422 422" },
  "DELETE /api/sites/[id]": { url: () => `/api/sites/${NOWHERE}`, params: none, expect: "401 403 403 403 404 404" },

  "GET /api/uploads/[[...path]]": { url: () => "/api/uploads/0123456789abcdef0123456789abcdef", params: () => ({ path: ["0123456789abcdef0123456789abcdef"] }), expect: "401 403 404 403 404 404" },
  "HEAD /api/uploads/[[...path]]": { url: () => "/api/uploads/0123456789abcdef0123456789abcdef", params: () => ({ path: ["0123456789abcdef0123456789abcdef"] }), headers: tus, expect: "401 403 404 403 404 404" },
  "POST /api/uploads/[[...path]]": { url: () => "/api/uploads", headers: { ...tus, "upload-length": "10", "upload-metadata": "filename bm9wZQ==" }, expect: "401 403 422 403 422 422" },
  "PATCH /api/uploads/[[...path]]": { url: () => "/api/uploads/0123456789abcdef0123456789abcdef", params: () => ({ path: ["0123456789abcdef0123456789abcdef"] }), headers: { ...tus, "upload-offset": "0", "content-type": "application/offset+octet-stream" }, expect: "401 403 404 403 404 404" },
  "DELETE /api/uploads/[[...path]]": { url: () => "/api/uploads/0123456789abcdef0123456789abcdef", params: () => ({ path: ["0123456789abcdef0123456789abcdef"] }), headers: tus, expect: "401 403 404 403 404 404" },
  "OPTIONS /api/uploads/[[...path]]": { url: () => "/api/uploads", headers: tus, expect: "204 204 204 204 204 204" },

  "GET /api/users/me/preferences": { url: () => "/api/users/me/preferences", expect: "401 200 200 200 200 200" },
  "POST /api/users/me/password": { url: () => "/api/users/me/password", body: { currentPassword: "" }, expect: "401 422 422 422 422 422" },
  "PATCH /api/users/me/preferences": { url: () => "/api/users/me/preferences", body: { preferredUnits: "cubits" }, expect: "401 422 422 422 422 422" },
};

const METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"] as const;
const apiRoot = path.resolve(__dirname, "../../../app/api");

async function routeFiles(dir: string): Promise<string[]> {
  const out: string[] = [];
  for (const e of await readdir(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...(await routeFiles(p)));
    else if (e.name === "route.ts") out.push(p);
  }
  return out.sort();
}

/** Every "METHOD /api/folder" the app serves, read from the route files' exports. */
export async function discoverRoutes(): Promise<{ key: string; handler: (r: Request, c: unknown) => Promise<Response> }[]> {
  const out: { key: string; handler: (r: Request, c: unknown) => Promise<Response> }[] = [];
  for (const file of await routeFiles(apiRoot)) {
    const folder = "/api/" + path.relative(apiRoot, path.dirname(file)).split(path.sep).join("/");
    const mod = (await import(file)) as Record<string, unknown>;
    for (const m of METHODS) if (typeof mod[m] === "function") out.push({ key: `${m} ${folder}`, handler: mod[m] as (r: Request, c: unknown) => Promise<Response> });
  }
  return out;
}


export async function makeMatrixFixture(owner: Actor): Promise<Fixture> {
  const orgId = await demoOrganisationId();
  const job = await makeSharedJob(orgId);
  const [j] = await db().select({ siteId: s.jobs.siteId }).from(s.jobs).where(eq(s.jobs.id, job.jobId));
  const [site] = await db().select({ clientId: s.sites.clientId }).from(s.sites).where(eq(s.sites.id, j.siteId));
  const [cat] = await db().insert(s.findingCategories).values({ organisationId: orgId, name: `Matrix ${Date.now()}` }).returning();
  const rc = await rangeChecksApi.POST(
    await req(owner, "POST", "/api/range-checks", { flightId: job.flightId, event: "first_degradation", positionBy: "distance", groundDistance: 500, bearingDeg: 90, heightAgl: 100, units: "m" }),
  );
  if (rc.status !== 201) throw new Error(`range check fixture: ${rc.status} ${await rc.text()}`);
  const inv = await invitationsApi.POST(await req(owner, "POST", "/api/invitations", { email: `matrix-${Date.now()}@example.test`, role: "pilot" }));
  if (inv.status !== 201) throw new Error(`invitation fixture: ${inv.status} ${await inv.text()}`);
  const shareToken = generateShareToken();
  const [link] = await db()
    .insert(s.shareLinks)
    .values({ organisationId: orgId, jobId: job.jobId, scope: "job", tokenHash: hashShareToken(shareToken), label: "Matrix", expiresAt: new Date(Date.now() + 86_400_000) })
    .returning();
  const mediaGrant = signMediaGrant({ linkId: link.id, kind: "poster", resourceId: job.recA.id, expiresAt: Math.floor(Date.now() / 1000) + 3600 }, env().MEDIA_SIGNING_KEY);
  const [pilot] = await db().select({ userId: s.memberships.userId }).from(s.memberships).where(and(eq(s.memberships.role, "pilot"), eq(s.memberships.organisationId, orgId)));
  return {
    jobId: job.jobId,
    flightId: job.flightId,
    siteId: j.siteId,
    clientId: site.clientId,
    recordingId: job.recA.id,
    findingId: job.fA.finding.id,
    reportId: job.report.id,
    categoryId: cat.id,
    rangeCheckId: (await rc.json()).id,
    invitationId: (await inv.json()).id,
    shareLinkId: link.id,
    shareToken,
    mediaGrant,
    pilotUserId: pilot.userId,
  };
}

export async function matrixRequest(row: MatrixRow, method: string, actor: Actor, f: Fixture): Promise<Request> {
  return req(actor, method, row.url(f), row.body, row.headers ?? {});
}

