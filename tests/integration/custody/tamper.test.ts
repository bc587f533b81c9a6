// Tampering found by verification. A scratch organisation gets a chain written by the application;
// then, as the superuser-like schema owner, the test disables the triggers, alters the stored data
// and re-enables them (what an intruder with database ownership could do). Verification must name
// exactly the event touched. The demo organisation's chain is left alone and must verify in full.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { and, asc, eq } from "drizzle-orm";
import { createHash } from "node:crypto";
import { db, closeDb } from "@/db/client";
import { custodyEvents, organisations } from "@/db/schema";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { verifyOrganisationChain } from "@/lib/custody/verify-organisation-chain";
import { chainHash } from "@/lib/custody/chain-hash";
import { canonicalSerialize } from "@/lib/custody/canonical-serialize";
import * as verifyRoute from "@/app/api/custody/verify/route";
import { demoActors, demoOrganisationId, req, type Actor, type DemoActorKey } from "@/tests/support/session";
import { TEST_ENV } from "@/tests/support/test-env";
import { closeRedis } from "@/lib/queue/redis";

let scratchOrg: string;
let admin: postgres.Sql;
let actors: Record<DemoActorKey, Actor>;
const N = 40;

async function asOwner<T>(fn: (sql: postgres.TransactionSql) => Promise<T>): Promise<T> {
  // one transaction: the triggers are off only inside it
  return admin.begin(async (sql) => {
    await sql`alter table custody_events disable trigger user`;
    const out = await fn(sql);
    await sql`alter table custody_events enable trigger user`;
    return out;
  }) as Promise<T>;
}

async function eventAt(seq: number) {
  const [e] = await db().select().from(custodyEvents).where(and(eq(custodyEvents.organisationId, scratchOrg), eq(custodyEvents.seq, seq)));
  return e;
}

beforeAll(async () => {
  actors = await demoActors();
  admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 1, onnotice: () => {} });
  const [org] = await db().insert(organisations).values({ name: "Scratch custody org", slug: `scratch-${Date.now()}` }).returning();
  scratchOrg = org.id;
  for (let i = 1; i <= N; i++) {
    await recordCustodyEvent({
      organisationId: scratchOrg,
      eventType: i % 3 === 0 ? "download" : "view",
      evidenceType: "recording",
      evidenceId: "5a3c2d1e-0f9b-4a8c-b7d6-e5f4a3b2c1d0",
      originalSha256: "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad",
      originalSize: 3 + i,
      clientAddress: "192.0.2.10",
      userAgent: "vitest",
      purpose: `event ${i}`,
      toolArgs: i % 5 === 0 ? ["-f", "h264", "-i", "in.264"] : null,
      details: i % 4 === 0 ? { frames: i * 10, note: "ünïcödé ✓" } : null,
    });
  }
});
afterAll(async () => {
  await admin.end();
  await closeDb();
  await closeRedis();
});

describe("verification of an untouched chain", () => {
  it("verifies all events and reports the head", async () => {
    const r = await verifyOrganisationChain(scratchOrg, { pageSize: 7 }); // pages of 7: the page seams are crossed too
    expect(r).toMatchObject({ ok: true, count: N, headSeq: N });
    if (r.ok) expect(r.headHash).toBe((await eventAt(N)).hash);
  });

  it("each stored hash is SHA-256(prevHash + LF + canonical JSON) recomputed independently", async () => {
    // An independent recomputation with Node's crypto and a sorted-key JSON writer: for the values
    // we store (strings, integers, null, arrays and plain objects) sorted-key JSON.stringify is
    // the RFC 8785 canonical form.
    const sorted = (v: unknown): unknown =>
      Array.isArray(v) ? v.map(sorted) : v && typeof v === "object" && !(v instanceof Date) ? Object.fromEntries(Object.keys(v).sort().map((k) => [k, sorted((v as Record<string, unknown>)[k])])) : v;
    const rows = await db().select().from(custodyEvents).where(eq(custodyEvents.organisationId, scratchOrg)).orderBy(asc(custodyEvents.seq));
    let prev = "0".repeat(64);
    for (const { prevHash, hash, ...payload } of rows) {
      expect(prevHash).toBe(prev);
      const canonical = JSON.stringify(sorted({ ...payload, occurredAt: payload.occurredAt.toISOString() }));
      expect(createHash("sha256").update(`${prevHash}\n${canonical}`, "utf8").digest("hex")).toBe(hash);
      prev = hash;
    }
  });
});

describe("tampering", () => {
  it("an altered event is named exactly (hash-mismatch at its seq), and restoring it heals the chain", async () => {
    const target = await eventAt(17);
    await asOwner((sql) => sql`update custody_events set purpose = 'nothing happened here' where id = ${target.id}`);
    const r = await verifyOrganisationChain(scratchOrg, { pageSize: 5 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.brokenAt?.seq).toBe(17);
      expect(r.brokenAt?.id).toBe(target.id);
      expect(r.reason).toBe("hash-mismatch");
      expect(r.count).toBe(16);
    }
    await asOwner((sql) => sql`update custody_events set purpose = ${target.purpose} where id = ${target.id}`);
    expect((await verifyOrganisationChain(scratchOrg)).ok).toBe(true);
  });

  it.each([
    ["a changed size", `original_size = original_size + 1`],
    ["a changed time", `occurred_at = occurred_at + interval '1 millisecond'`],
    ["a changed actor address", `client_address = '198.51.100.7'`],
    ["changed details", `details = '{"frames": 1}'::jsonb`],
  ])("%s is found at that event", async (_label, assignment) => {
    const target = await eventAt(24);
    await asOwner((sql) => sql.unsafe(`update custody_events set ${assignment} where id = $1`, [target.id]));
    const r = await verifyOrganisationChain(scratchOrg);
    expect(r.ok ? null : r.brokenAt?.seq).toBe(24);
    await asOwner((sql) =>
      sql`update custody_events set original_size = ${target.originalSize}, occurred_at = ${target.occurredAt}, client_address = ${target.clientAddress}, details = ${target.details ? sql.json(target.details as postgres.JSONValue) : null} where id = ${target.id}`,
    );
    expect((await verifyOrganisationChain(scratchOrg)).ok).toBe(true);
  });

  it("an altered event re-sealed with a correct new hash shows at its successor (prev-mismatch)", async () => {
    const target = await eventAt(30);
    const { prevHash, hash: _old, ...payload } = target;
    const forgedHash = chainHash(prevHash, canonicalSerialize({ ...payload, purpose: "rewritten and re-sealed" }));
    await asOwner((sql) => sql`update custody_events set purpose = 'rewritten and re-sealed', hash = ${forgedHash} where id = ${target.id}`);
    const r = await verifyOrganisationChain(scratchOrg);
    // the event itself is consistent again; the link from the next event to it is not
    expect(r.ok ? null : [r.brokenAt?.seq, r.reason]).toEqual([31, "prev-mismatch"]);
    await asOwner((sql) => sql`update custody_events set purpose = ${target.purpose}, hash = ${target.hash} where id = ${target.id}`);
    expect((await verifyOrganisationChain(scratchOrg)).ok).toBe(true);
  });

  it("a changed stored hash alone is found at that event", async () => {
    const target = await eventAt(33);
    await asOwner((sql) => sql`update custody_events set hash = ${"ab".repeat(32)} where id = ${target.id}`);
    const r = await verifyOrganisationChain(scratchOrg);
    expect(r.ok ? null : [r.brokenAt?.seq, r.reason]).toEqual([33, "hash-mismatch"]);
    await asOwner((sql) => sql`update custody_events set hash = ${target.hash} where id = ${target.id}`);
    expect((await verifyOrganisationChain(scratchOrg)).ok).toBe(true);
  });

  it("a removed event breaks the chain at the next one", async () => {
    const removed = await eventAt(9);
    const next = await eventAt(10);
    await asOwner((sql) => sql`delete from custody_events where id = ${removed.id}`);
    const r = await verifyOrganisationChain(scratchOrg);
    expect(r.ok ? null : [r.brokenAt?.seq, r.brokenAt?.id, r.reason]).toEqual([10, next.id, "prev-mismatch"]);
    // put it back exactly as it was: the chain verifies again
    await asOwner(async (sql) => {
      const { prevHash, hash, ...rest } = removed;
      await sql`insert into custody_events ${sql({ ...snake(rest), prev_hash: prevHash, hash } as Record<string, postgres.ParameterOrJSON<never>>)}`;
    });
    expect((await verifyOrganisationChain(scratchOrg)).ok).toBe(true);
  });
});

function snake(o: Record<string, unknown>) {
  return Object.fromEntries(
    Object.entries(o).map(([k, v]) => [k.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`), v !== null && typeof v === "object" && !(v instanceof Date) ? JSON.stringify(v) : v]),
  );
}

describe("the demo organisation", () => {
  it("its full chain verifies through the verify action", async () => {
    const orgId = await demoOrganisationId();
    await recordCustodyEvent({ organisationId: orgId, eventType: "view", evidenceType: "job", purpose: "so the chain is never empty" });
    const total = await db().$count(custodyEvents, eq(custodyEvents.organisationId, orgId));
    const res = await verifyRoute.POST(await req(actors.owner, "POST", "/api/custody/verify"));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body).toMatchObject({ ok: true, count: total });
    expect((await verifyRoute.POST(await req(actors.reviewer, "POST", "/api/custody/verify"))).status).toBe(200);
    expect((await verifyRoute.POST(await req(actors.client, "POST", "/api/custody/verify"))).status).toBe(403);
    expect((await verifyRoute.POST(await req(null, "POST", "/api/custody/verify"))).status).toBe(401);
  });

  it("a break in the demo chain is reported by the verify action with its event and a plain explanation", async () => {
    const orgId = await demoOrganisationId();
    const victim = await recordCustodyEvent({ organisationId: orgId, eventType: "view", evidenceType: "job", purpose: "will be altered" });
    await asOwner((sql) => sql`update custody_events set purpose = 'altered' where id = ${victim.id}`);
    const body = await (await verifyRoute.POST(await req(actors.owner, "POST", "/api/custody/verify"))).json();
    expect(body).toMatchObject({ ok: false, reason: "hash-mismatch", brokenAt: { seq: victim.seq, id: victim.id } });
    expect(body.explanation).toContain("altered");
    await asOwner((sql) => sql`update custody_events set purpose = 'will be altered' where id = ${victim.id}`);
    expect((await (await verifyRoute.POST(await req(actors.owner, "POST", "/api/custody/verify"))).json()).ok).toBe(true);
  });
});
