// Browser-level hardening against the built app in Debian's chromium:
//   - a page on another origin of localhost (a tiny server of ours on another port) auto-submits a
//     text/plain form and sends a credentialed fetch to the API with the owner's cookie: refused,
//     nothing created; the same owner's own page still creates;
//   - every page carries a Content-Security-Policy whose nonce is fresh per answer and on every
//     script, and the product's pages (video.js review, Uppy upload, share page, dev mailbox) run
//     without a single CSP violation;
//   - the share API answers with Referrer-Policy: no-referrer (next.config.ts: config headers win
//     over a handler's own), and media answers full and partial requests byte-exact.
import http from "node:http";
import { readFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { like } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launch, newContext, signInWithPassword, BASE } from "@/tests/support/browser";
import { E2E_PORT } from "@/tests/support/test-env";
import { makeRawH264, runTool } from "@/tests/support/media/make-h264";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { demoOrganisationId, sessionCookie, actorByEmail } from "@/tests/support/session";
import { DEMO_USERS } from "@/db/seed/demo-scenario";
import { makeSharedJob } from "@/tests/integration/sharing/share-fixtures";
import { generateShareToken, hashShareToken } from "@/lib/sharing/share-token";

const OTHER_PORT = E2E_PORT + 5;
const OTHER = `http://localhost:${OTHER_PORT}`;
const ownerEmail = DEMO_USERS.find((u) => u.key === "owner")!.email;
const marker = `xsite-${Date.now()}`;

let browser: Browser;
let owner: BrowserContext;
let page: Page;
let other: http.Server;
let job: Awaited<ReturnType<typeof makeSharedJob>>;
let shareToken: string;

// the attacker's pages: only what a page on another origin can do without reading any answer
function attackerPages(): http.Server {
  const target = `${BASE}/api/clients`;
  const pages: Record<string, string> = {
    // enctype text/plain: the body reads {"name":"<marker>-form","x":"="}, valid JSON
    "/form": `<!doctype html><form method="POST" enctype="text/plain" action="${target}"><input type="hidden" name='{"name":"${marker}-form","x":"' value='"}'></form><script>document.forms[0].submit()</script>`,
    "/fetch": `<!doctype html><p id="out">sending</p><script>
      Promise.allSettled([
        fetch(${JSON.stringify(target)}, { method: "POST", mode: "no-cors", credentials: "include", headers: { "Content-Type": "text/plain" }, body: JSON.stringify({ name: "${marker}-fetch-text" }) }),
        fetch(${JSON.stringify(target)}, { method: "POST", mode: "no-cors", credentials: "include", body: new Blob([JSON.stringify({ name: "${marker}-fetch-untyped" })]) }),
        fetch(${JSON.stringify(target)}, { method: "POST", credentials: "include", headers: { "Content-Type": "application/json" }, body: JSON.stringify({ name: "${marker}-fetch-json" }) }),
      ]).then(() => { document.getElementById("out").textContent = "sent"; });
    </script>`,
  };
  return http.createServer((req, res) => {
    const body = pages[req.url ?? ""];
    res.writeHead(body ? 200 : 404, { "Content-Type": "text/html; charset=utf-8" });
    res.end(body ?? "not here");
  });
}

async function playableMp4(): Promise<Buffer> {
  const raw = await makeRawH264({ seconds: 3, width: 432, height: 240, fps: 30 });
  const out = path.join(os.tmpdir(), `cairn-e2e-headers-${process.pid}.mp4`);
  await runTool("ffmpeg", ["-v", "error", "-y", "-f", "h264", "-r", "30", "-i", raw, "-c", "copy", "-movflags", "+faststart", out]);
  return readFile(out);
}

/** Collects CSP violations of a page: the DOM event (W3C CSP3 section 5.3) and chromium's console line. */
async function watchViolations(p: Page): Promise<() => Promise<string[]>> {
  const fromConsole: string[] = [];
  p.on("console", (m) => {
    if (/Content Security Policy|Refused to (execute|load|apply|connect|frame)/i.test(m.text())) fromConsole.push(m.text());
  });
  await p.addInitScript(() => {
    const w = window as unknown as { __csp: string[] };
    w.__csp = [];
    document.addEventListener("securitypolicyviolation", (e) => w.__csp.push(`${e.violatedDirective} ${e.blockedURI}`));
  });
  return async () => [...fromConsole, ...((await p.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []).catch(() => [])) as string[])];
}

beforeAll(async () => {
  const orgId = await demoOrganisationId();
  const mp4 = await playableMp4();
  job = await makeSharedJob(orgId, { playable: mp4, durationSec: 3 });
  shareToken = generateShareToken();
  await db().insert(s.shareLinks).values({
    organisationId: orgId,
    jobId: job.jobId,
    scope: "job",
    tokenHash: hashShareToken(shareToken),
    label: "Headers test",
    expiresAt: new Date(Date.now() + 86_400_000),
    createdBy: (await actorByEmail(ownerEmail)).userId,
  } as typeof s.shareLinks.$inferInsert);
  other = attackerPages();
  await new Promise<void>((r) => other.listen(OTHER_PORT, "127.0.0.1", r));
  browser = await launch();
  owner = await newContext(browser);
  page = await owner.newPage();
  await signInWithPassword(page, ownerEmail);
});
afterAll(async () => {
  await browser?.close();
  await new Promise((r) => other?.close(r));
  await closeDb();
});

const clientsNamed = (prefix: string) => db().select({ name: s.clients.name }).from(s.clients).where(like(s.clients.name, `${prefix}%`));

describe("a page on another origin of localhost", () => {
  it("cannot create a client with the owner's cookie: the form and the fetches are refused", async () => {
    const attacker = await owner.newPage();
    const answers: { url: string; status: number }[] = [];
    attacker.on("response", (r) => {
      if (r.url().startsWith(`${BASE}/api/`)) answers.push({ url: r.url(), status: r.status() });
    });
    await attacker.goto(`${OTHER}/form`);
    await attacker.waitForURL(`${BASE}/api/clients`);
    expect(answers.find((a) => a.url === `${BASE}/api/clients`)?.status).toBe(403);
    expect(await attacker.textContent("body")).toContain("Cross-site requests are not accepted");

    await attacker.goto(`${OTHER}/fetch`);
    await attacker.waitForFunction(() => document.getElementById("out")?.textContent === "sent");
    expect(await clientsNamed(marker)).toEqual([]);
    await attacker.close();

    // the cookie was good: the owner's own page creates a client with the same kind of request
    const created = await page.evaluate(async (name) => {
      const r = await fetch("/api/clients", { method: "POST", headers: { "Content-Type": "application/json" }, body: JSON.stringify({ name }) });
      return r.status;
    }, `${marker}-own`);
    expect(created).toBe(201);
    expect((await clientsNamed(marker)).map((c) => c.name)).toEqual([`${marker}-own`]);
  });
});

describe("content security policy on every page", () => {
  it("a fresh nonce per answer, on every script of the page", async () => {
    const nonces = new Set<string>();
    for (const p of ["/sign-in", "/jobs", `/jobs/${job.jobId}`, "/upload", "/dev/mailbox", `/s/${shareToken}/view`]) {
      const res = await owner.request.get(p);
      expect(res.status(), p).toBe(200);
      const csp = res.headers()["content-security-policy"] ?? "";
      expect(csp, p).toMatch(/frame-ancestors 'self'/);
      const nonce = /'nonce-([^']+)'/.exec(csp)?.[1];
      expect(nonce, p).toBeTruthy();
      nonces.add(nonce!);
      const html = await res.text();
      const scripts = html.match(/<script\b[^>]*>/g) ?? [];
      expect(scripts.length, p).toBeGreaterThan(0);
      for (const tag of scripts) expect(tag, `${p}: ${tag}`).toContain(`nonce="${nonce}"`);
    }
    expect(nonces.size).toBe(6);
    // API answers are not pages and are left alone; uploads above all never pass through the proxy
    const api = await owner.request.get("/api/clients");
    expect(api.headers()["content-security-policy"]).toBeUndefined();
  });

  it("the review player (video.js) plays under the policy without a violation", async () => {
    const p = await owner.newPage();
    const violations = await watchViolations(p);
    await p.goto(`/recordings/${job.recA.id}`);
    await p.waitForFunction(() => ((document.querySelector("[data-testid=review-video] video") as HTMLVideoElement | null)?.readyState ?? 0) >= 2);
    await p.evaluate(() => (document.querySelector("[data-testid=review-video] video") as HTMLVideoElement).play());
    await p.waitForFunction(() => (document.querySelector("[data-testid=review-video] video") as HTMLVideoElement).currentTime > 0.3);
    expect(await violations()).toEqual([]);
    await p.close();
  });

  it("the uploader (Uppy), the jobs pages, the report page and the dev mailbox load without a violation", async () => {
    for (const [url, ready] of [
      [`/upload?jobId=${job.jobId}&flightId=${job.flightId}`, ".uppy-Dashboard"],
      ["/jobs", "main"],
      [`/jobs/${job.jobId}`, "main"],
      [`/jobs/${job.jobId}/report`, "main"],
      ["/dev/mailbox", "body"],
    ] as const) {
      const p = await owner.newPage();
      const violations = await watchViolations(p);
      await p.goto(url);
      await p.waitForSelector(ready);
      await p.waitForLoadState("networkidle");
      expect(await violations(), url).toEqual([]);
      await p.close();
    }
  });

  it("the share page plays its clip without a violation, in a context with no account", async () => {
    const visitor = await newContext(browser);
    const p = await visitor.newPage();
    const violations = await watchViolations(p);
    await p.goto(`/s/${shareToken}`);
    await p.waitForURL(/\/view$/);
    await p.waitForFunction(() => [...document.querySelectorAll("video")].some((v) => v.readyState >= 2));
    await p.waitForLoadState("networkidle");
    expect(await violations()).toEqual([]);
    await visitor.close();
  });
});

describe("share API and media headers", () => {
  it("/api/s/* answers Referrer-Policy: no-referrer, also when refusing; media answers full and partial requests byte-exact", async () => {
    const manifest = await fetch(`${BASE}/api/s/${shareToken}/manifest`);
    expect(manifest.status).toBe(200);
    expect(manifest.headers.get("referrer-policy")).toBe("no-referrer");
    const body = JSON.stringify(await manifest.json());
    const grantPath = /\/api\/s\/media\/[^"\\]+/.exec(body)?.[0];
    expect(grantPath).toBeTruthy();
    const unknown = await fetch(`${BASE}/api/s/not-a-token/manifest`);
    expect(unknown.headers.get("referrer-policy")).toBe("no-referrer");

    // Content-Length: the handlers set it (tests/integration/security/media-content-length.test.ts),
    // but Next 16.4 drops Content-Length from every route-handler answer it sends
    // (next/dist/server/send-response.js, FORBIDDEN_HEADERS) and sends the body chunked. Here: the
    // bytes and ranges the client gets are right.
    const full = await fetch(`${BASE}${grantPath}`);
    expect(full.status).toBe(200);
    expect(full.headers.get("referrer-policy")).toBe("no-referrer");
    const bytes = Buffer.from(await full.arrayBuffer());
    expect(bytes.length).toBeGreaterThan(110);
    const part = await fetch(`${BASE}${grantPath}`, { headers: { Range: "bytes=10-109" } });
    expect(part.status).toBe(206);
    expect(part.headers.get("content-range")).toBe(`bytes 10-109/${bytes.length}`);
    expect(Buffer.from(await part.arrayBuffer()).equals(bytes.subarray(10, 110))).toBe(true);

    // the workspace's own media route, with the owner's session
    const cookie = await sessionCookie(await actorByEmail(ownerEmail));
    const mediaUrl = `${BASE}/api/media/recordings/${job.recA.id}/poster.jpg`;
    const own = await fetch(mediaUrl, { headers: { cookie } });
    expect(own.status).toBe(200);
    const ownBytes = Buffer.from(await own.arrayBuffer());
    const ownPart = await fetch(mediaUrl, { headers: { cookie, Range: "bytes=0-0" } });
    expect(ownPart.status).toBe(206);
    expect(ownPart.headers.get("content-range")).toBe(`bytes 0-0/${ownBytes.length}`);
  });
});
