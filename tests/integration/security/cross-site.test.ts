// Cross-site request forgery: every state-changing API route refuses a request a page on another
// origin sent (Origin, or Sec-Fetch-Site when Origin is absent: W3C Fetch Metadata Request Headers),
// and accepts JSON bodies only, so a cross-site text/plain form cannot be read as an API call.
// Handlers are called directly with the owner's real session cookie, as the browser would attach it.
import { readdir } from "node:fs/promises";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import * as clientsApi from "@/app/api/clients/route";
import * as verifyApi from "@/app/api/custody/verify/route";
import * as acceptApi from "@/app/api/invitations/accept/route";
import * as collector from "@/app/api/collector/route";
import { db, closeDb } from "@/db/client";
import * as s from "@/db/schema";
import { env } from "@/lib/config/env";
import { closeRedis } from "@/lib/queue/redis";
import { handleUploadRequest } from "@/lib/uploads/handle-upload-request";
import { demoActors, req, route, sessionCookie, type Actor, type DemoActorKey } from "@/tests/support/session";
import { makeFlight } from "@/tests/support/factories";

const FOREIGN = "http://localhost:8080"; // another port of the same host: same site, another origin
let actors: Record<DemoActorKey, Actor>;
let own: string;

const clientCount = async () => (await db().select({ n: count() }).from(s.clients).where(eq(s.clients.organisationId, actors.owner!.organisationId)))[0].n;

beforeAll(async () => {
  actors = await demoActors();
  own = new URL(env().APP_URL).origin;
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

async function expectRefused(res: Response, status: number, code: string) {
  expect(res.status).toBe(status);
  const body = await res.json();
  expect(body.error.code).toBe(code);
  expect(typeof body.error.message).toBe("string");
}

describe("origin check on a JSON route (POST /api/clients as the owner)", () => {
  it("refuses a foreign Origin with 403 and creates nothing", async () => {
    const before = await clientCount();
    await expectRefused(await clientsApi.POST(await req(actors.owner, "POST", "/api/clients", { name: "Forged client" }, { origin: FOREIGN })), 403, "forbidden");
    expect(await clientCount()).toBe(before);
  });

  it("refuses when Origin is absent and Sec-Fetch-Site says cross-site or same-site", async () => {
    const before = await clientCount();
    for (const site of ["cross-site", "same-site"]) {
      await expectRefused(await clientsApi.POST(await req(actors.owner, "POST", "/api/clients", { name: `Forged ${site}` }, { origin: "", "sec-fetch-site": site })), 403, "forbidden");
    }
    expect(await clientCount()).toBe(before);
  });

  it("refuses Origin: null unless Sec-Fetch-Site vouches for the app's own page", async () => {
    await expectRefused(await clientsApi.POST(await req(actors.owner, "POST", "/api/clients", { name: "From a sandbox" }, { origin: "null" })), 403, "forbidden");
    // a no-referrer page of our own sends Origin: null with Sec-Fetch-Site: same-origin
    expect((await clientsApi.POST(await req(actors.owner, "POST", "/api/clients", { name: "From a no-referrer page" }, { origin: "null", "sec-fetch-site": "same-origin" }))).status).toBe(201);
  });

  it("refuses a foreign Origin even when a forged Sec-Fetch-Site says same-origin", async () => {
    await expectRefused(await clientsApi.POST(await req(actors.owner, "POST", "/api/clients", { name: "Mixed" }, { origin: FOREIGN, "sec-fetch-site": "same-origin" })), 403, "forbidden");
  });

  it("refuses a text/plain body (what an HTML form can send cross-site) with 415 and creates nothing", async () => {
    const before = await clientCount();
    const r = new Request(new URL("/api/clients", "http://localhost"), {
      method: "POST",
      headers: { cookie: await sessionCookie(actors.owner!), origin: own, "content-type": "text/plain" },
      body: JSON.stringify({ name: "Text plain client" }),
    });
    await expectRefused(await clientsApi.POST(r), 415, "unsupported_media_type");
    const form = new Request(new URL("/api/clients", "http://localhost"), {
      method: "POST",
      headers: { cookie: await sessionCookie(actors.owner!), origin: own, "content-type": "application/x-www-form-urlencoded" },
      body: "name=Form+client",
    });
    await expectRefused(await clientsApi.POST(form), 415, "unsupported_media_type");
    const untyped = new Request(new URL("/api/clients", "http://localhost"), {
      method: "POST",
      headers: { cookie: await sessionCookie(actors.owner!), origin: own, "content-length": "26" },
      body: JSON.stringify({ name: "Untyped client" }),
    });
    await expectRefused(await clientsApi.POST(untyped), 415, "unsupported_media_type");
    expect(await clientCount()).toBe(before);
  });

  it("accepts the app's own origin, the origin the request was addressed to, and non-browser clients", async () => {
    expect((await clientsApi.POST(await req(actors.owner, "POST", "/api/clients", { name: "Own origin" }))).status).toBe(201);
    expect((await clientsApi.POST(await req(actors.owner, "POST", "/api/clients", { name: "Own origin, same-origin fetch" }, { "sec-fetch-site": "same-origin" }))).status).toBe(201);
    const viaIp = new Request("http://127.0.0.1:3100/api/clients", {
      method: "POST",
      headers: { cookie: await sessionCookie(actors.owner!), host: "127.0.0.1:3100", origin: "http://127.0.0.1:3100", "content-type": "application/json" },
      body: JSON.stringify({ name: "Addressed by IP" }),
    });
    expect((await clientsApi.POST(viaIp)).status).toBe(201);
    // no Origin and no Sec-Fetch-Site: not a browser, so no cookie was attached on anyone's behalf
    expect((await clientsApi.POST(await req(actors.owner, "POST", "/api/clients", { name: "curl" }, { origin: "" }))).status).toBe(201);
    // reads are not state-changing: a foreign Origin on a GET is answered as usual
    expect((await clientsApi.GET(await req(actors.owner, "GET", "/api/clients", undefined, { origin: FOREIGN }))).status).toBe(200);
  });

  it("a POST without a body needs no Content-Type (POST /api/custody/verify)", async () => {
    expect((await verifyApi.POST(await req(actors.owner, "POST", "/api/custody/verify"))).status).toBe(200);
    await expectRefused(await verifyApi.POST(await req(actors.owner, "POST", "/api/custody/verify", undefined, { origin: FOREIGN })), 403, "forbidden");
  });
});

describe("routes outside withOrg", () => {
  it("invitation acceptance refuses a foreign Origin and a text/plain body", async () => {
    await expectRefused(await acceptApi.POST(await req(null, "POST", "/api/invitations/accept", { token: "x".repeat(43) }, { origin: FOREIGN })), 403, "forbidden");
    const plain = new Request("http://localhost/api/invitations/accept", { method: "POST", headers: { origin: own, "content-type": "text/plain" }, body: JSON.stringify({ token: "x".repeat(43) }) });
    await expectRefused(await acceptApi.POST(plain), 415, "unsupported_media_type");
  });

  it("tus keeps its own content type but refuses a foreign Origin before anything is created", async () => {
    const flight = await makeFlight(actors.pilot!.organisationId);
    const meta = (k: string, v: string) => `${k} ${Buffer.from(v).toString("base64")}`;
    const headers = {
      cookie: await sessionCookie(actors.pilot!),
      "tus-resumable": "1.0.0",
      "upload-length": "100",
      "upload-metadata": [meta("jobId", flight.jobId), meta("flightId", flight.id), meta("filename", "CROSS.264")].join(","),
    };
    const staged = async () => (await readdir(env().uploadDir).catch(() => [] as string[])).length;
    const before = await staged();
    for (const extra of [{ origin: FOREIGN }, { "sec-fetch-site": "cross-site" }] as Record<string, string>[]) {
      const res = await handleUploadRequest(new Request("http://localhost/api/uploads", { method: "POST", headers: { ...headers, ...extra } }));
      await expectRefused(res, 403, "forbidden");
    }
    const patch = await handleUploadRequest(
      new Request("http://localhost/api/uploads/0123456789abcdef0123456789abcdef", {
        method: "PATCH",
        headers: { cookie: headers.cookie, "tus-resumable": "1.0.0", "upload-offset": "0", "content-type": "application/offset+octet-stream", origin: FOREIGN },
        body: Buffer.alloc(10),
      }),
    );
    await expectRefused(patch, 403, "forbidden");
    expect(await staged()).toBe(before);
    // the same creation from our own origin goes through
    const ok = await handleUploadRequest(new Request("http://localhost/api/uploads", { method: "POST", headers: { ...headers, origin: own } }));
    expect(ok.status, await ok.clone().text()).toBe(201);
  });

  it("the analytics collector takes mux-embed's text/plain beacons from its own pages only", async () => {
    const views = async () => (await db().select({ n: count() }).from(s.playbackViews))[0].n;
    const before = await views();
    const body = JSON.stringify({ metadata: {}, events: [{ e: "hb", xid: "cross-site-view", vid: "00000000-0000-4000-8000-000000000000", xwati: 1000 }] });
    const post = async (h: Record<string, string>) =>
      collector.POST(new Request("http://localhost/api/collector?via=localhost", { method: "POST", headers: { cookie: await sessionCookie(actors.reviewer!), "content-type": "text/plain", ...h }, body }));
    await expectRefused(await post({ origin: FOREIGN }), 403, "forbidden");
    await expectRefused(await post({ "sec-fetch-site": "cross-site" }), 403, "forbidden");
    expect(await views()).toBe(before);
    // its own page (text/plain is the SDK's choice) is let through to the beacon checks
    expect((await post({ origin: own })).status).toBe(200);
  });
});

// Every POST/PUT/PATCH/DELETE handler under app/api, found by walking the folder, refuses the owner's
// cookie sent from a foreign origin: a new route cannot forget the guard.
describe("every state-changing route found under app/api", () => {
  const apiRoot = path.resolve(__dirname, "../../../app/api");
  async function routeFiles(dir: string): Promise<string[]> {
    const out: string[] = [];
    for (const e of await readdir(dir, { withFileTypes: true })) {
      const p = path.join(dir, e.name);
      if (e.isDirectory()) out.push(...(await routeFiles(p)));
      else if (e.name === "route.ts") out.push(p);
    }
    return out;
  }

  it("answers 403 to a foreign Origin, and to Sec-Fetch-Site: cross-site without Origin", async () => {
    const tried: string[] = [];
    for (const file of await routeFiles(apiRoot)) {
      const rel = path.relative(apiRoot, path.dirname(file)).split(path.sep).join("/");
      if (rel.startsWith("auth/")) continue; // next-auth's own routes carry their own CSRF token
      const mod = (await import(file)) as Record<string, unknown>;
      const params: Record<string, string | string[]> = {};
      for (const seg of rel.split("/")) {
        const m = /^\[\[?(\.\.\.)?([^\]]+)\]\]?$/.exec(seg);
        if (m) params[m[2]] = m[1] ? ["00000000000000000000000000000000"] : "00000000-0000-4000-8000-000000000000";
      }
      const urlPath = "/api/" + rel.replace(/\[\[?(\.\.\.)?[^\]]+\]\]?/g, "00000000-0000-4000-8000-000000000000");
      for (const method of ["POST", "PUT", "PATCH", "DELETE"]) {
        const handler = mod[method] as ((r: Request, c: unknown) => Promise<Response>) | undefined;
        if (!handler) continue;
        for (const headers of [{ origin: FOREIGN }, { origin: "", "sec-fetch-site": "cross-site" }] as Record<string, string>[]) {
          const res = await handler(await req(actors.owner, method, urlPath, {}, headers), route(params));
          expect(res.status, `${method} ${urlPath} ${JSON.stringify(headers)}`).toBe(403);
          expect((await res.json()).error.code).toBe("forbidden");
        }
        tried.push(`${method} ${urlPath}`);
      }
    }
    // the walk found the routes (guards against a walk that silently finds nothing)
    expect(tried.length).toBeGreaterThan(30);
  });
});
