// Limits that slow guessing without letting a stranger keep the owner out: sign-in through the real
// [...nextauth] route's POST (the 429 comes from it, before next-auth) and next-auth's authorize,
// share-link passcodes and tokens, invitation tokens. Addresses come from the socket-address header
// our server stamps (lib/http/client-address.ts); X-Forwarded-For is ignored with no trusted proxy.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { NextRequest } from "next/server";
import * as nextAuthRoute from "@/app/api/auth/[...nextauth]/route";
import * as acceptApi from "@/app/api/invitations/accept/route";
import * as gate from "@/app/s/[token]/route";
import { closeDb } from "@/db/client";
import { authOptions } from "@/lib/auth/auth-options";
import { ATTEMPT_POLICIES, waitAfter } from "@/lib/auth/attempt-limits";
import { signInLimitGate } from "@/lib/auth/sign-in-limit-gate";
import { PEER_HEADER } from "@/lib/http/client-address";
import { closeRedis, redis } from "@/lib/queue/redis";
import { generateShareToken } from "@/lib/sharing/share-token";
import { DEMO_PASSWORD, DEMO_USERS } from "@/db/seed/demo-scenario";
import { route } from "@/tests/support/session";

const OWNER = DEMO_USERS.find((u) => u.key === "owner")!.email;
let n = 0;
/** A documentation address (RFC 3849) of its own for each test. */
const address = () => `2001:db8:${(++n).toString(16)}::1`;

beforeAll(async () => {
  // a clean count: earlier runs in this slot's Redis index must not decide these tests
  const stale = await redis().keys("*:al:*");
  if (stale.length) await redis().del(...stale);
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

type Authorize = (c: Record<string, string>, req: { headers: Record<string, string> }) => Promise<{ id: string } | null>;
const authorize = (authOptions.providers[0] as unknown as { options: { authorize: Authorize } }).options.authorize;
/**
 * One password try as the route runs it: the route's limit gate first (429 here), then next-auth's
 * authorize (which the route's handler would call next). Returns "429", the user, or null.
 */
async function tryPassword(email: string, password: string, from: string, forged?: string) {
  const headers = { "content-type": "application/x-www-form-urlencoded", [PEER_HEADER]: from, ...(forged ? { "x-forwarded-for": forged } : {}) };
  const limited = await signInLimitGate(new Request("http://localhost/api/auth/callback/password", { method: "POST", headers, body: new URLSearchParams({ email, password }) }), ["callback", "password"]);
  if (limited) return String(limited.status);
  return authorize({ email, password }, { headers });
}

/** POST /api/auth/callback/password (or signin/email) through the route module, as next-auth's client sends it. */
function postAuth(path: string[], body: Record<string, string>, from: string, forged?: string) {
  const req = new NextRequest(`http://localhost/api/auth/${path.join("/")}`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded", [PEER_HEADER]: from, ...(forged ? { "x-forwarded-for": forged } : {}) },
    body: new URLSearchParams({ ...body, csrfToken: "x", json: "true" }),
  });
  return nextAuthRoute.POST(req, { params: Promise.resolve({ nextauth: path }) });
}

describe("the waits", () => {
  it("five free failures per account and address, then 30 s doubling to at most an hour", () => {
    const p = ATTEMPT_POLICIES.signin;
    expect([5, 6, 7, 8, 12, 20, 40].map((f) => waitAfter(f, p.pairFree!, p))).toEqual([0, 30_000, 60_000, 120_000, 1_920_000, 3_600_000, 3_600_000]);
  });
});

describe("password sign-in", () => {
  it("a stranger's wrong passwords make the stranger's address wait (429 with Retry-After from the real route), not the owner's", async () => {
    const stranger = address();
    for (let i = 0; i < 5; i++) expect(await tryPassword(OWNER, `wrong ${i}`, stranger)).toBeNull();
    // the sixth try, even with the right password, through the real route: 429 before next-auth
    const limited = await postAuth(["callback", "password"], { email: OWNER, password: DEMO_PASSWORD }, stranger);
    expect(limited.status).toBe(429);
    const retry = Number(limited.headers.get("retry-after"));
    expect(retry).toBeGreaterThanOrEqual(29);
    expect(retry).toBeLessThanOrEqual(30);
    const body = await limited.json();
    expect(body.error.code).toBe("rate_limited");
    // next-auth's client reads `url` and its ?error=
    expect(new URL(body.url).searchParams.get("error")).toBe("rate_limited");
    // while it waits, authorize refuses the right password from there too (a try that raced the gate)
    expect(await authorize({ email: OWNER, password: DEMO_PASSWORD }, { headers: { [PEER_HEADER]: stranger } })).toBeNull();
    // the owner, from their own address, signs in: the gate lets the request through, authorize accepts
    expect(await tryPassword(OWNER, DEMO_PASSWORD, address())).toMatchObject({ email: OWNER });
    // and so does the e-mail link, from the stranger's address too (a separate count)
    expect(await signInLimitGate(new Request("http://localhost/x", { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded", [PEER_HEADER]: stranger }, body: new URLSearchParams({ email: OWNER }) }), ["signin", "email"])).toBeNull();
  });

  it("the wait grows with each failure after it runs out: 30 s, then 60 s, then 120 s", async () => {
    const stranger = address();
    const email = `nobody-${randomUUID().slice(0, 8)}@test.example`; // unknown accounts are limited the same way
    for (let i = 0; i < 5; i++) await tryPassword(email, "wrong", stranger);
    const waits: number[] = [];
    for (let round = 0; round < 3; round++) {
      // the sixth, seventh, eighth try: each is refused with a wait twice the last
      const res = await postAuth(["callback", "password"], { email, password: "wrong" }, stranger);
      expect(res.status).toBe(429);
      waits.push(Number(res.headers.get("retry-after")));
      // and while it runs, the next try is refused without adding to it
      expect(Number((await postAuth(["callback", "password"], { email, password: "wrong" }, stranger)).headers.get("retry-after"))).toBeLessThanOrEqual(waits.at(-1)!);
      // let the wait run out (its Redis key expires), keeping the count
      const keys = await redis().keys("*:al:signin:pw:*");
      await redis().del(...keys);
    }
    expect(waits).toEqual([30, 60, 120]);
  });

  it("a new X-Forwarded-For on every try does not escape the limit (no trusted proxy)", async () => {
    const stranger = address();
    const email = `forged-${randomUUID().slice(0, 8)}@test.example`;
    for (let i = 0; i < 5; i++) await tryPassword(email, "wrong", stranger, `203.0.113.${i + 1}`);
    const res = await postAuth(["callback", "password"], { email, password: "wrong" }, stranger, "203.0.113.77");
    expect(res.status).toBe(429);
  });

  it("30 failures from one address over many accounts make that address wait for every account; other addresses are untouched", async () => {
    const stranger = address();
    for (let i = 0; i < 30; i++) await tryPassword(`spray-${i}-${randomUUID().slice(0, 6)}@test.example`, "wrong", stranger);
    const res = await postAuth(["callback", "password"], { email: OWNER, password: DEMO_PASSWORD }, stranger);
    expect(res.status).toBe(429);
    expect(await tryPassword(OWNER, DEMO_PASSWORD, address())).toMatchObject({ email: OWNER });
  });

  it("parallel guesses from one address: five are compared, the rest refused", async () => {
    const stranger = address();
    const email = `parallel-${randomUUID().slice(0, 8)}@test.example`;
    const answers = await Promise.all(Array.from({ length: 12 }, () => tryPassword(email, "wrong", stranger)));
    expect(answers.filter((a) => a === null)).toHaveLength(5);
    expect(answers.filter((a) => a === "429")).toHaveLength(7);
  });

  it("a right password is forgiven: it does not count towards the address's limit", async () => {
    const own = address();
    for (let i = 0; i < 32; i++) expect(await tryPassword(OWNER, DEMO_PASSWORD, own)).toMatchObject({ email: OWNER });
    // past the 30 an address may fail, still let through
    expect(await tryPassword(OWNER, DEMO_PASSWORD, own)).toMatchObject({ email: OWNER });
  });
});

describe("e-mail sign-in links", () => {
  it("five requests per address asked for and client address, then 429 with Retry-After; the owner's own address still gets links", async () => {
    const stranger = address();
    const form = (from: string) => new Request("http://localhost/x", { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded", [PEER_HEADER]: from }, body: new URLSearchParams({ email: OWNER }) });
    for (let i = 0; i < 5; i++) expect(await signInLimitGate(form(stranger), ["signin", "email"])).toBeNull();
    const limited = await postAuth(["signin", "email"], { email: OWNER }, stranger);
    expect(limited.status).toBe(429);
    expect(Number(limited.headers.get("retry-after"))).toBeGreaterThanOrEqual(59);
    expect(await signInLimitGate(form(address()), ["signin", "email"])).toBeNull();
  });

  it("the provider answers at once for known and unknown addresses: the lookup and the mail run off the request path", async () => {
    const provider = authOptions.providers[1] as unknown as { options: { sendVerificationRequest: (p: { identifier: string; url: string }) => Promise<void> } };
    const send = provider.options.sendVerificationRequest;
    const time = async (identifier: string) => {
      const t = performance.now();
      await send({ identifier, url: "http://localhost:3100/api/auth/callback/email?token=test" });
      return performance.now() - t;
    };
    const known: number[] = [];
    const unknown: number[] = [];
    for (let i = 0; i < 8; i++) {
      known.push(await time(OWNER));
      unknown.push(await time(`nobody-${i}@test.example`));
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    console.log(`sign-in link answer, median of 8: known ${median(known).toFixed(2)} ms, unknown ${median(unknown).toFixed(2)} ms`);
    expect(Math.abs(median(known) - median(unknown))).toBeLessThan(50);
    expect(median(known)).toBeLessThan(50);
    // the mail to the known address still goes out, afterwards
    const { readMailbox } = await import("@/lib/mail/read-mailbox");
    const deadline = Date.now() + 10_000;
    let mails: unknown[] = [];
    while (Date.now() < deadline && mails.length === 0) {
      mails = (await readMailbox({ to: OWNER })).filter((m) => (m as { subject: string }).subject === "Your Cairn sign-in link");
      if (!mails.length) await new Promise((r) => setTimeout(r, 200));
    }
    expect(mails.length).toBeGreaterThan(0);
  });
});

describe("share-link and invitation tokens", () => {
  const door = (token: string, from: string) => gate.GET(new Request(`http://localhost/s/${token}`, { headers: { [PEER_HEADER]: from } }), route({ token }));
  it("twenty unknown share tokens from one address, then 429 with Retry-After for that address only; a real link does not count", async () => {
    const guesser = address();
    for (let i = 0; i < 20; i++) expect((await door(generateShareToken(), guesser)).status).toBe(404);
    const limited = await door(generateShareToken(), guesser);
    expect(limited.status).toBe(429);
    expect(Number(limited.headers.get("retry-after"))).toBeGreaterThanOrEqual(29);
    expect(limited.headers.get("referrer-policy")).toBe("no-referrer");
    expect((await door(generateShareToken(), address())).status).toBe(404);
  });

  it("twenty unknown invitation tokens from one address, then 429", async () => {
    const guesser = address();
    const accept = (from: string) =>
      acceptApi.POST(
        new Request("http://localhost/api/invitations/accept", {
          method: "POST",
          headers: { "content-type": "application/json", origin: new URL(process.env.APP_URL!).origin, [PEER_HEADER]: from },
          body: JSON.stringify({ token: generateShareToken(), name: "X", password: "a long enough password" }),
        }),
      );
    for (let i = 0; i < 20; i++) expect((await accept(guesser)).status).toBe(404);
    const limited = await accept(guesser);
    expect(limited.status).toBe(429);
    expect(limited.headers.get("retry-after")).toMatch(/^\d+$/);
    expect((await limited.json()).error.code).toBe("rate_limited");
    expect((await accept(address())).status).toBe(404);
  });
});
