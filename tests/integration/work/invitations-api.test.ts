// Invitations against the real Postgres and the local fake SMTP server: who may invite, the mail and
// its link, the stored hash, accepting as a new or an existing person, and every way a link goes stale.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import bcrypt from "bcryptjs";
import * as list from "@/app/api/invitations/route";
import * as one from "@/app/api/invitations/[id]/route";
import * as accept from "@/app/api/invitations/accept/route";
import { db, closeDb } from "@/db/client";
import { invitations, memberships, users } from "@/db/schema";
import { demoActors, demoOrganisationId, membershipRole, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { route } from "@/tests/support/session";
import { closeRedis } from "@/lib/queue/redis";
import { readMailbox } from "@/lib/mail/read-mailbox";
import { DEMO_PASSWORD } from "@/db/seed/demo-scenario";

let actors: Record<DemoActorKey, Actor>;
let orgId: string;

beforeAll(async () => {
  actors = await demoActors();
  orgId = await demoOrganisationId();
});
afterAll(async () => {
  await closeDb();
  await closeRedis();
});

const freshEmail = (tag: string) => `invitee-${tag}-${randomUUID().slice(0, 8)}@test.example`;

/** The invitation link in the newest mail to `to`, and the token in it. */
async function mailedToken(to: string) {
  const [mail] = await readMailbox({ to, limit: 1 });
  expect(mail, `a mail to ${to}`).toBeDefined();
  const link = mail.text.match(/https?:\/\/\S+\/invite\/([A-Za-z0-9_-]+)/);
  expect(link, "an invitation link in the mail text").not.toBeNull();
  return { mail, url: link![0], token: link![1] };
}

async function invite(actor: Actor, email: string, role = "pilot") {
  return list.POST(await req(actor, "POST", "/api/invitations", { email, role }));
}

const acceptReq = (body: unknown) => req(null, "POST", "/api/invitations/accept", body);

describe("authorization matrix", () => {
  // actor, GET pending list, POST invite, DELETE (withdraw) an invitation of this organisation
  const cases: [DemoActorKey, number, number, number][] = [
    ["owner", 200, 201, 200],
    ["pilot", 403, 403, 403],
    ["reviewer", 403, 403, 403],
    ["client", 403, 403, 403],
    // another organisation's owner lists and invites into its own organisation; ours is unknown to it
    ["other", 200, 201, 404],
    ["anonymous", 401, 401, 401],
  ];
  it.each(cases)("%s: list %i, invite %i, withdraw %i", async (who, l, c, d) => {
    const a = actors[who];
    const target = freshEmail(`target-${who}`);
    expect((await invite(actors.owner, target)).status).toBe(201);
    const [inv] = await db().select().from(invitations).where(eq(invitations.email, target));

    expect((await list.GET(await req(a, "GET", "/api/invitations"))).status).toBe(l);
    const email = freshEmail(who);
    expect((await invite(a, email)).status).toBe(c);
    expect((await one.DELETE(await req(a, "DELETE", "/x"), route({ id: inv.id }))).status).toBe(d);

    const made = await db().select().from(invitations).where(eq(invitations.email, email));
    expect(made).toHaveLength(c === 201 ? 1 : 0);
    if (who === "other") expect(made[0].organisationId).toBe(actors.other!.organisationId);
    expect((await readMailbox({ to: email })).length).toBe(c === 201 ? 1 : 0);
    const [after] = await db().select().from(invitations).where(eq(invitations.id, inv.id));
    expect(after.revoked).toBe(d === 200);
  });

  it("accepting is public: the token is the credential", async () => {
    const email = freshEmail("public");
    await invite(actors.owner, email, "reviewer");
    const { token } = await mailedToken(email);
    const res = await accept.POST(await acceptReq({ token, name: "Public Person", password: "correct horse battery" }));
    expect(res.status).toBe(200);
  });
});

describe("inviting", () => {
  it("mails a link whose token is 256 random bits, stored only as its SHA-256, valid for 7 days", async () => {
    const email = freshEmail("mail");
    const before = Date.now();
    const res = await invite(actors.owner, email, "reviewer");
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body).toMatchObject({ email, role: "reviewer" });
    expect(JSON.stringify(body)).not.toMatch(/token/i);

    const { mail, url, token } = await mailedToken(email);
    expect(mail.subject).toBe("Invitation to Kestrelmoor Aerial Survey on Cairn");
    expect(mail.text).toContain("Ada Thornbury invited you");
    expect(url.startsWith(`${process.env.APP_URL}/invite/`)).toBe(true);
    expect(Buffer.from(token, "base64url")).toHaveLength(32);

    const [row] = await db().select().from(invitations).where(eq(invitations.email, email));
    // the stored value is Node's SHA-256 of the mailed token, never the token itself
    expect(row.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(row)).not.toContain(token);
    const sevenDays = 7 * 24 * 3600 * 1000;
    expect(row.expiresAt.getTime()).toBeGreaterThanOrEqual(before + sevenDays - 1000);
    expect(row.expiresAt.getTime()).toBeLessThanOrEqual(Date.now() + sevenDays + 1000);
  });

  it("two invitations never share a token", async () => {
    const a = freshEmail("ta");
    const b = freshEmail("tb");
    await invite(actors.owner, a);
    await invite(actors.owner, b);
    expect((await mailedToken(a)).token).not.toBe((await mailedToken(b)).token);
  });

  it("inviting someone who is already a member is a 409 and sends nothing", async () => {
    const before = await db().$count(invitations);
    const res = await invite(actors.owner, "pilot@kestrelmoor.example", "reviewer");
    expect(res.status).toBe(409);
    expect((await res.json()).error.fields.email).toBeDefined();
    expect(await db().$count(invitations)).toBe(before);
  });

  it("a newer invitation to the same address replaces the pending one", async () => {
    const email = freshEmail("again");
    await invite(actors.owner, email, "pilot");
    const first = await mailedToken(email);
    await new Promise((r) => setTimeout(r, 5)); // mails are ordered by arrival time in ms
    await invite(actors.owner, email, "reviewer");
    const second = await mailedToken(email);
    expect(second.token).not.toBe(first.token);
    const pending = await (await list.GET(await req(actors.owner, "GET", "/api/invitations"))).json();
    expect(pending.items.filter((i: { email: string }) => i.email === email)).toEqual([expect.objectContaining({ role: "reviewer", state: "pending" })]);
    expect((await accept.POST(await acceptReq({ token: first.token, name: "X", password: "a long enough password" }))).status).toBe(410);
  });

  const bad: [string, unknown, number][] = [
    ["malformed JSON", "{email:", 400],
    ["not an e-mail", { email: "nobody", role: "pilot" }, 422],
    ["unknown role", { email: "someone@test.example", role: "admin" }, 422],
    ["over-long e-mail", { email: `${"a".repeat(320)}@test.example`, role: "pilot" }, 422],
    ["wrong types", { email: 5, role: ["pilot"] }, 422],
  ];
  it.each(bad)("%s -> %i, nothing written", async (_label, body, status) => {
    const before = await db().$count(invitations);
    const res = await list.POST(await req(actors.owner, "POST", "/api/invitations", body));
    expect(res.status).toBe(status);
    expect(typeof (await res.json()).error.message).toBe("string");
    expect(await db().$count(invitations)).toBe(before);
  });

  it("withdrawing: unknown, malformed or accepted invitations are refused", async () => {
    expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), route({ id: randomUUID() }))).status).toBe(404);
    expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), route({ id: "x" }))).status).toBe(404);
    const email = freshEmail("accepted");
    const { id } = await (await invite(actors.owner, email)).json();
    const { token } = await mailedToken(email);
    await accept.POST(await acceptReq({ token, name: "Accepted Person", password: "a long enough password" }));
    expect((await one.DELETE(await req(actors.owner, "DELETE", "/x"), route({ id }))).status).toBe(409);
  });
});

describe("accepting", () => {
  it("a new person chooses a name and password (bcrypt), joins with the invited role, and the link is used up", async () => {
    const email = freshEmail("new");
    await invite(actors.owner, email, "reviewer");
    const { token } = await mailedToken(email);
    const res = await accept.POST(await acceptReq({ token, name: "  Nell Farrow  ", password: "correct horse battery" }));
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ email, organisationName: "Kestrelmoor Aerial Survey", role: "reviewer", newAccount: true });
    const [u] = await db().select().from(users).where(eq(users.email, email));
    expect(u.name).toBe("Nell Farrow");
    // bcryptjs checks the stored hash independently of our wrapper; cost 12 is in the hash prefix
    expect(u.passwordHash).toMatch(/^\$2[aby]\$12\$/);
    expect(await bcrypt.compare("correct horse battery", u.passwordHash!)).toBe(true);
    expect(u.emailVerifiedAt).not.toBeNull();
    expect(await membershipRole(u.id, orgId)).toBe("reviewer");
    const again = await accept.POST(await acceptReq({ token, name: "Twice", password: "correct horse battery" }));
    expect(again.status).toBe(410);
    expect((await again.json()).error.code).toBe("gone");
  });

  it("someone with an account joins with the token alone; their password is left alone", async () => {
    const existing = actors.other!;
    await invite(actors.owner, "owner@harrowfell.example", "client");
    const { token } = await mailedToken("owner@harrowfell.example");
    const [before] = await db().select().from(users).where(eq(users.id, existing.userId));
    const res = await accept.POST(await acceptReq({ token, name: "Ignored", password: "an attempt to reset it" }));
    expect(res.status).toBe(200);
    expect((await res.json()).newAccount).toBe(false);
    const [after] = await db().select().from(users).where(eq(users.id, existing.userId));
    expect(after.passwordHash).toBe(before.passwordHash);
    expect(after.name).toBe(before.name);
    expect(await bcrypt.compare(DEMO_PASSWORD, after.passwordHash!)).toBe(true);
    expect(await membershipRole(existing.userId, orgId)).toBe("client");
    expect(await membershipRole(existing.userId, existing.organisationId)).toBe("owner");
    // tidy: the other organisation's owner leaves again so other tests see the scenario as seeded
    await db().delete(memberships).where(and(eq(memberships.userId, existing.userId), eq(memberships.organisationId, orgId)));
  });

  it("a new person without a name or password gets field errors and nothing is created", async () => {
    const email = freshEmail("missing");
    await invite(actors.owner, email);
    const { token } = await mailedToken(email);
    const res = await accept.POST(await acceptReq({ token }));
    expect(res.status).toBe(422);
    expect(Object.keys((await res.json()).error.fields).sort()).toEqual(["name", "password"]);
    expect(await db().$count(users, eq(users.email, email))).toBe(0);
    const [inv] = await db().select().from(invitations).where(eq(invitations.email, email));
    expect(inv.acceptedAt).toBeNull();
  });

  it("expired and withdrawn links answer 410; unknown 404; malformed 422; nothing is created", async () => {
    const expired = freshEmail("expired");
    await invite(actors.owner, expired);
    const e = await mailedToken(expired);
    await db().update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.email, expired));
    const withdrawn = freshEmail("withdrawn");
    const { id } = await (await invite(actors.owner, withdrawn)).json();
    const w = await mailedToken(withdrawn);
    await one.DELETE(await req(actors.owner, "DELETE", "/x"), route({ id }));

    const body = (token: string) => ({ token, name: "Late Person", password: "a long enough password" });
    expect((await accept.POST(await acceptReq(body(e.token)))).status).toBe(410);
    expect((await accept.POST(await acceptReq(body(w.token)))).status).toBe(410);
    expect((await accept.POST(await acceptReq(body(Buffer.alloc(32, 7).toString("base64url"))))).status).toBe(404);
    expect((await accept.POST(await acceptReq(body("short")))).status).toBe(422);
    expect((await accept.POST(await acceptReq("{token"))).status).toBe(400);
    expect(await db().$count(users, eq(users.email, expired))).toBe(0);
    expect(await db().$count(users, eq(users.email, withdrawn))).toBe(0);
  });

  it("passwords shorter than 12 characters or longer than bcrypt's 72 bytes are refused", async () => {
    const email = freshEmail("pw");
    await invite(actors.owner, email);
    const { token } = await mailedToken(email);
    for (const password of ["short", "é".repeat(37)]) {
      const res = await accept.POST(await acceptReq({ token, name: "Pat", password }));
      expect(res.status).toBe(422);
      expect((await res.json()).error.fields.password).toBeDefined();
    }
    expect(await db().$count(users, eq(users.email, email))).toBe(0);
  });
});
