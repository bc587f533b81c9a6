// Against the built app under next start, over real HTTP (no browser needed): sessions end on the
// server (sign-out, then the old cookie on API, page and media), sign-in limits answer 429 with
// Retry-After from the real [...nextauth] route whatever X-Forwarded-For says, the e-mail link answer
// takes the same time for known and unknown addresses, and a client account's pages stop at its
// own clients' jobs.
import { afterAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { and, desc } from "drizzle-orm";
import { custodyEvents, jobs } from "@/db/schema";
import { DEMO_PASSWORD, DEMO_USERS } from "@/db/seed/demo-scenario";
import { BASE } from "@/tests/support/browser";

afterAll(async () => {
  await closeDb();
});

const email = (key: string) => DEMO_USERS.find((u) => u.key === key)!.email;

/** A tiny cookie jar: name -> value from Set-Cookie headers. */
class Jar {
  cookies = new Map<string, string>();
  take(res: Response) {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const i = pair.indexOf("=");
      this.cookies.set(pair.slice(0, i), pair.slice(i + 1));
    }
  }
  header() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }
}

async function csrf(jar: Jar): Promise<string> {
  const res = await fetch(`${BASE}/api/auth/csrf`, { headers: { cookie: jar.header() } });
  jar.take(res);
  return ((await res.json()) as { csrfToken: string }).csrfToken;
}

/** next-auth's own password flow, as its client sends it. */
async function passwordSignIn(jar: Jar, user: string, password: string, headers: Record<string, string> = {}) {
  const csrfToken = await csrf(jar);
  const res = await fetch(`${BASE}/api/auth/callback/password`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: jar.header(), ...headers },
    body: new URLSearchParams({ email: user, password, csrfToken, json: "true", callbackUrl: `${BASE}/jobs` }),
  });
  jar.take(res);
  return res;
}

const sessionOf = (jar: Jar) => [...jar.cookies].find(([k]) => k.endsWith("next-auth.session-token"));

describe("sessions end on the server", () => {
  it("after sign-out the old cookie gets 401 from the API, a redirect to sign-in from a page, 401 from media", async () => {
    const jar = new Jar();
    expect((await passwordSignIn(jar, email("reviewer"), DEMO_PASSWORD)).status).toBe(200);
    const [name, value] = sessionOf(jar)!;
    const old = `${name}=${value}`;
    expect((await fetch(`${BASE}/api/jobs`, { headers: { cookie: old } })).status).toBe(200);
    expect((await fetch(`${BASE}/jobs`, { headers: { cookie: old }, redirect: "manual" })).status).toBe(200);
    const missing = `${BASE}/api/media/recordings/${randomUUID()}/playable.mp4`;
    expect((await fetch(missing, { headers: { cookie: old, range: "bytes=0-9" } })).status).toBe(404);

    const csrfToken = await csrf(jar);
    const out = await fetch(`${BASE}/api/auth/signout`, {
      method: "POST",
      redirect: "manual",
      headers: { "content-type": "application/x-www-form-urlencoded", cookie: jar.header() },
      body: new URLSearchParams({ csrfToken, json: "true", callbackUrl: `${BASE}/sign-in` }),
    });
    expect(out.status).toBe(200);

    // a copy of the old cookie, kept anywhere, no longer works
    expect((await fetch(`${BASE}/api/jobs`, { headers: { cookie: old } })).status).toBe(401);
    const page = await fetch(`${BASE}/jobs`, { headers: { cookie: old }, redirect: "manual" });
    expect([303, 307, 308]).toContain(page.status);
    expect(page.headers.get("location")).toMatch(/\/sign-in/);
    expect((await fetch(missing, { headers: { cookie: old, range: "bytes=0-9" } })).status).toBe(401);
  });
});

describe("sign-in limits through the real route", () => {
  it("five wrong passwords, then 429 with Retry-After, even with a new X-Forwarded-For on every try; another account from the same place still signs in", async () => {
    const target = `nobody-${randomUUID().slice(0, 8)}@test.example`;
    for (let i = 0; i < 5; i++) {
      const res = await passwordSignIn(new Jar(), target, "wrong password", { "x-forwarded-for": `203.0.113.${i + 1}` });
      expect(res.status).toBe(401);
    }
    const limited = await passwordSignIn(new Jar(), target, "wrong password", { "x-forwarded-for": "203.0.113.99" });
    expect(limited.status).toBe(429);
    expect(Number(limited.headers.get("retry-after"))).toBeGreaterThanOrEqual(29);
    const body = (await limited.json()) as { url: string; error: { code: string } };
    expect(body.error.code).toBe("rate_limited");
    expect(new URL(body.url).searchParams.get("error")).toBe("rate_limited");
    expect((await passwordSignIn(new Jar(), email("pilot"), DEMO_PASSWORD)).status).toBe(200);
  });

  it("the e-mail link answer takes the same time for a known and an unknown address (median of 8 each)", async () => {
    const ask = async (address: string) => {
      const jar = new Jar();
      const csrfToken = await csrf(jar);
      const t = performance.now();
      const res = await fetch(`${BASE}/api/auth/signin/email`, {
        method: "POST",
        redirect: "manual",
        headers: { "content-type": "application/x-www-form-urlencoded", cookie: jar.header() },
        body: new URLSearchParams({ email: address, csrfToken, json: "true", callbackUrl: `${BASE}/jobs` }),
      });
      await res.text();
      expect(res.status).toBe(200);
      return performance.now() - t;
    };
    const known: number[] = [];
    const unknown: number[] = [];
    // known accounts in turn (each stays under its 5 links per address); a pause lets the previous
    // request's mail, sent off the request path, finish before the next one is timed
    const accounts = ["owner", "pilot", "reviewer", "client"].map(email);
    const settle = () => new Promise((r) => setTimeout(r, 300));
    for (let i = 0; i < 8; i++) {
      known.push(await ask(accounts[i % accounts.length]));
      await settle();
      unknown.push(await ask(`nobody-${randomUUID().slice(0, 8)}@test.example`));
      await settle();
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    console.log(`e-mail link answer over HTTP: known ${known.map((x) => x.toFixed(0)).join("/")} ms, unknown ${unknown.map((x) => x.toFixed(0)).join("/")} ms`);
    expect(Math.abs(median(known) - median(unknown))).toBeLessThan(50);
  });
});

describe("the client address under next start", () => {
  it("is the socket address: a forged X-Forwarded-For is not what the custody log records", async () => {
    const jar = new Jar();
    expect((await passwordSignIn(jar, email("owner"), DEMO_PASSWORD)).status).toBe(200);
    const [job] = await db().select({ id: jobs.id }).from(jobs).where(eq(jobs.title, "Footbridge bearing check"));
    const put = (hold: boolean) =>
      fetch(`${BASE}/api/jobs/${job.id}/hold`, {
        method: "PUT",
        headers: { "content-type": "application/json", origin: BASE, cookie: jar.header(), "x-forwarded-for": "203.0.113.50" },
        body: JSON.stringify(hold ? { hold: true, reason: "Address check" } : { hold: false, reason: "Address check done" }),
      });
    expect((await put(true)).status).toBe(200);
    expect((await put(false)).status).toBe(200);
    const [ev] = await db().select().from(custodyEvents).where(and(eq(custodyEvents.jobId, job.id), eq(custodyEvents.eventType, "hold_released"))).orderBy(desc(custodyEvents.seq)).limit(1);
    // the server listens on 127.0.0.1 (tests/support/e2e-setup.ts), so that is where the test connected from
    expect(ev.clientAddress).toBe("127.0.0.1");
  });
});

describe("a client account's pages", () => {
  it("open its own client's job and answer 404 for another customer's job and for the range tools", async () => {
    const jar = new Jar();
    expect((await passwordSignIn(jar, email("client"), DEMO_PASSWORD)).status).toBe(200);
    const [own] = await db().select({ id: jobs.id }).from(jobs).where(eq(jobs.title, "Valve tower annual inspection"));
    const [other] = await db().select({ id: jobs.id }).from(jobs).where(eq(jobs.title, "Storm damage claim, terrace roofs"));
    const page = (path: string) => fetch(`${BASE}${path}`, { headers: { cookie: jar.header() }, redirect: "manual" });
    expect((await page(`/jobs/${own.id}`)).status).toBe(200);
    expect((await page(`/jobs/${other.id}`)).status).toBe(404);
    expect((await page(`/jobs/${other.id}/report`)).status).toBe(404);
    expect((await page("/range")).status).toBe(404);
    const list = (await (await page("/api/jobs?pageSize=200")).json()) as { items: { id: string }[] };
    expect(list.items.map((j) => j.id)).toContain(own.id);
    expect(list.items.map((j) => j.id)).not.toContain(other.id);
  });
});
