// Custody checkpoints: completeness, not only order. A scratch organisation gets a chain written by
// the application and checkpoints signed with the installation's Ed25519 key and time-stamped by the
// local fake authority (docker-less-dev/fake-tsa.ts, `openssl ts -reply`). Then, as the schema owner
// with the triggers off (what an intruder owning the database could do), the test cuts the tail,
// re-seals an edited tail and forges appends: the hash chain alone stays "intact" for each of these
// (checked below with the plain ChainVerifier), the checkpointed verification does not.
// Outside checks: `openssl ts -verify` for every stored token, `openssl pkeyutl -verify` for every
// Ed25519 signature (OpenSSL 3, Debian).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { and, asc, eq, gt } from "drizzle-orm";
import { db, closeDb } from "@/db/client";
import { custodyCheckpoints, custodyEvents, organisations } from "@/db/schema";
import type { CustodyEvent } from "@/db/schema/types";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { verifyOrganisationChain } from "@/lib/custody/verify-organisation-chain";
import { makeCheckpoint, makeDueCheckpoints, listCheckpoints } from "@/lib/custody/make-checkpoint";
import { checkpointStatement } from "@/lib/custody/checkpoint-statement";
import { custodySigner, signerFromSeed, signStatement } from "@/lib/custody/checkpoint-key";
import { verifyChain } from "@/lib/custody/verify-chain";
import { linkCustodyEvent } from "@/lib/custody/link-custody-event";
import { custodyPayloadOf } from "@/lib/custody/custody-payload";
import { startFakeTsa } from "@/docker-less-dev/fake-tsa";
import { TEST_ENV } from "@/tests/support/test-env";
import * as verifyRoute from "@/app/api/custody/verify/route";
import { demoActors, demoOrganisationId, req } from "@/tests/support/session";
import { closeRedis } from "@/lib/queue/redis";

let org: string;
let admin: postgres.Sql;
let tsa: Awaited<ReturnType<typeof startFakeTsa>>;
let work: string;

async function asOwner<T>(fn: (sql: postgres.TransactionSql) => Promise<T>): Promise<T> {
  return admin.begin(async (sql) => {
    await sql`alter table custody_events disable trigger user`;
    await sql`alter table custody_checkpoints disable trigger user`;
    const out = await fn(sql);
    await sql`alter table custody_events enable trigger user`;
    await sql`alter table custody_checkpoints enable trigger user`;
    return out;
  }) as Promise<T>;
}

const events = () => db().select().from(custodyEvents).where(eq(custodyEvents.organisationId, org)).orderBy(asc(custodyEvents.seq));
const addEvents = async (n: number, label: string) => {
  for (let i = 0; i < n; i++) await recordCustodyEvent({ organisationId: org, eventType: "view", evidenceType: "job", purpose: `${label} ${i}`, clientAddress: "192.0.2.20" });
};
/** What the hash chain alone says (the verifier before checkpoints): order, not completeness. */
const chainAloneOk = async () => verifyChain(await events()).ok;

function snake(o: Record<string, unknown>) {
  return Object.fromEntries(
    Object.entries(o).map(([k, v]) => [k.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`), v !== null && typeof v === "object" && !(v instanceof Date) ? JSON.stringify(v) : v]),
  );
}
/** Puts the org's events back exactly as they were (after a test rewrote them). */
async function restore(original: CustodyEvent[]) {
  await asOwner(async (sql) => {
    await sql`delete from custody_events where organisation_id = ${org}`;
    for (const e of original) await sql`insert into custody_events ${sql(snake(e) as Record<string, postgres.ParameterOrJSON<never>>)}`;
  });
  expect((await verifyOrganisationChain(org)).ok).toBe(true);
}
/** Rewrites every event from `fromSeq` on with correct hashes (what someone re-sealing the tail does). */
async function reseal(rows: CustodyEvent[], fromSeq: number) {
  let prev = rows.find((e) => e.seq === fromSeq - 1)?.hash ?? null;
  const out: CustodyEvent[] = [];
  for (const e of rows.filter((r) => r.seq >= fromSeq)) {
    const sealed = linkCustodyEvent(prev, custodyPayloadOf(e) as CustodyEvent & { id: string }) as unknown as CustodyEvent;
    out.push(sealed);
    prev = sealed.hash;
  }
  await asOwner(async (sql) => {
    await sql`delete from custody_events where organisation_id = ${org} and seq >= ${fromSeq}`;
    for (const e of out) await sql`insert into custody_events ${sql(snake(e) as Record<string, postgres.ParameterOrJSON<never>>)}`;
  });
}

beforeAll(async () => {
  admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 1, onnotice: () => {} });
  work = mkdtempSync(path.join(os.tmpdir(), "cairn-checkpoints-"));
  tsa = await startFakeTsa({ dir: path.join(work, "tsa") });
  const [o] = await db().insert(organisations).values({ name: "Scratch checkpoint org", slug: `scratch-cp-${Date.now()}` }).returning();
  org = o.id;
  await addEvents(30, "first");
});
afterAll(async () => {
  await tsa?.close();
  await admin.end();
  await closeDb();
  await closeRedis();
  rmSync(work, { recursive: true, force: true });
});

describe("making checkpoints", () => {
  it("before any checkpoint the chain verifies with no anchor", async () => {
    expect(await verifyOrganisationChain(org)).toMatchObject({ ok: true, count: 30, anchor: null });
  });

  it("signs and stamps the head; a second run with no new events makes none", async () => {
    const made = await makeCheckpoint(org, { tsaUrl: tsa.url });
    expect(made.outcome).toBe("made");
    if (made.outcome !== "made") return;
    const head = (await events())[29];
    expect(made.checkpoint).toMatchObject({ number: 1, headSeq: 30, headEventId: head.id, headHash: head.hash, publicKey: custodySigner().publicKey });
    expect(made.checkpoint.stampedAt).toBeInstanceOf(Date);
    expect(Math.abs(made.checkpoint.stampedAt!.getTime() - made.checkpoint.signedAt.getTime())).toBeLessThan(5_000);
    expect((await makeCheckpoint(org, { tsaUrl: tsa.url })).outcome).toBe("up-to-date");
  });

  it("events after the last checkpoint are reported as not yet anchored; the next checkpoint anchors them", async () => {
    await addEvents(5, "second");
    const r = await verifyOrganisationChain(org, { pageSize: 7 });
    expect(r).toMatchObject({ ok: true, count: 35, anchor: { number: 1, headSeq: 30, unanchored: 5, checkpoints: 1, stale: false } });
    if (r.ok) expect(r.anchor?.oldestUnanchoredAt).toEqual((await events())[30].occurredAt);
    // with checkpoints due every second, events waiting for two periods and more make the anchor stale
    process.env.CUSTODY_CHECKPOINT_EVERY_MS = "1000";
    try {
      await new Promise((resolve) => setTimeout(resolve, 2100));
      expect(await verifyOrganisationChain(org)).toMatchObject({ ok: true, anchor: { unanchored: 5, stale: true } });
    } finally {
      delete process.env.CUSTODY_CHECKPOINT_EVERY_MS;
    }
    const due = await makeDueCheckpoints({ tsaUrl: tsa.url });
    expect(due.failed).toEqual([]);
    expect(due.made).toBeGreaterThanOrEqual(1);
    expect(await verifyOrganisationChain(org)).toMatchObject({ ok: true, count: 35, anchor: { number: 2, headSeq: 35, unanchored: 0, checkpoints: 2, stale: false, oldestUnanchoredAt: null } });
  });

  it("the database role of the app cannot change or remove a checkpoint", async () => {
    await expect(db().update(custodyCheckpoints).set({ headSeq: 1 }).where(eq(custodyCheckpoints.organisationId, org))).rejects.toThrow();
    await expect(db().delete(custodyCheckpoints).where(eq(custodyCheckpoints.organisationId, org))).rejects.toThrow();
  });

  it("every stored token passes `openssl ts -verify` and every signature `openssl pkeyutl -verify` (outside checks)", async () => {
    const cps = await listCheckpoints(org);
    expect(cps).toHaveLength(2);
    for (const c of cps) {
      const dir = path.join(work, `cp-${c.number}`);
      execFileSync("mkdir", ["-p", dir]);
      const statement = path.join(dir, "statement.json");
      writeFileSync(statement, checkpointStatement(c));
      writeFileSync(path.join(dir, "resp.tsr"), Buffer.from(c.tsaResponse!, "base64"));
      // RFC 3161 token against the authority's CA: OpenSSL's own verifier
      const ts = execFileSync("openssl", ["ts", "-verify", "-data", statement, "-in", path.join(dir, "resp.tsr"), "-CAfile", tsa.files.caCert, "-untrusted", tsa.files.tsaCert], { stdio: "pipe" }).toString();
      expect(ts).toContain("Verification: OK");
      // Ed25519 signature (RFC 8032) with the stored public key as SubjectPublicKeyInfo (RFC 8410)
      const spki = Buffer.concat([Buffer.from("302a300506032b6570032100", "hex"), Buffer.from(c.publicKey, "base64url")]);
      writeFileSync(path.join(dir, "pub.der"), spki);
      writeFileSync(path.join(dir, "sig.bin"), Buffer.from(c.signature, "base64url"));
      const sig = execFileSync("openssl", ["pkeyutl", "-verify", "-pubin", "-keyform", "DER", "-inkey", path.join(dir, "pub.der"), "-rawin", "-in", statement, "-sigfile", path.join(dir, "sig.bin")], { stdio: "pipe" }).toString();
      expect(sig).toContain("Signature Verified Successfully");
    }
    // and a token over other bytes does not verify
    writeFileSync(path.join(work, "other.json"), "{}");
    expect(() => execFileSync("openssl", ["ts", "-verify", "-data", path.join(work, "other.json"), "-in", path.join(work, "cp-1/resp.tsr"), "-CAfile", tsa.files.caCert, "-untrusted", tsa.files.tsaCert], { stdio: "pipe" })).toThrow();
  });
});

describe("what the checkpoints catch that the hash chain alone does not", () => {
  it("a deleted tail (the newest event removed)", async () => {
    const original = await events();
    await asOwner((sql) => sql`delete from custody_events where organisation_id = ${org} and seq = 35`);
    expect(await chainAloneOk()).toBe(true);
    const r = await verifyOrganisationChain(org);
    expect(r).toMatchObject({ ok: false, reason: "truncated", count: 34, checkpoint: { number: 2, headSeq: 35 } });
    await restore(original);
  });

  it("a re-sealed tail (event 20 edited, every later one re-hashed)", async () => {
    const original = await events();
    const edited = original.map((e) => (e.seq === 20 ? { ...e, purpose: "nothing to see" } : e));
    await reseal(edited, 20);
    expect(await chainAloneOk()).toBe(true);
    const r = await verifyOrganisationChain(org);
    // the first checkpoint whose signed head no longer matches: #1 covers events 1..30
    expect(r).toMatchObject({ ok: false, reason: "checkpoint-mismatch", checkpoint: { number: 1, headSeq: 30 }, brokenAt: { seq: 30 } });
    await restore(original);
  });

  it("a forged append with correct hashes after the last checkpoint is reported as not yet anchored", async () => {
    const original = await events();
    const last = original[original.length - 1];
    const forged = linkCustodyEvent(last.hash, { ...custodyPayloadOf(last), id: "0b5e0c3a-7d1f-4e9b-a2c8-3f6d5e4c3b2a", seq: 36, purpose: "forged" } as CustodyEvent);
    await asOwner((sql) => sql`insert into custody_events ${sql(snake(forged as unknown as Record<string, unknown>) as Record<string, postgres.ParameterOrJSON<never>>)}`);
    const r = await verifyOrganisationChain(org);
    expect(r).toMatchObject({ ok: true, count: 36, anchor: { number: 2, headSeq: 35, unanchored: 1 } });
    await restore(original);
  });

  it("a forged append within a checkpoint (tail cut, forged events appended with correct hashes up to the same length)", async () => {
    const original = await events();
    const forgedTail = original.map((e) => (e.seq >= 33 ? { ...e, id: crypto.randomUUID(), purpose: `forged ${e.seq}` } : e));
    await reseal(forgedTail, 33);
    expect(await chainAloneOk()).toBe(true);
    expect(await verifyOrganisationChain(org)).toMatchObject({ ok: false, reason: "checkpoint-mismatch", checkpoint: { number: 2 }, brokenAt: { seq: 35 } });
    await restore(original);
  });

  it("a checkpoint signed with another key, a removed checkpoint and a swapped time-stamp token are each refused", async () => {
    const cps = await listCheckpoints(org);
    const [first, second] = cps;
    const other = signerFromSeed(Buffer.alloc(32, 7).toString("base64url"));
    // a forged checkpoint 2 re-signed by someone without the installation's key
    await asOwner((sql) => sql`update custody_checkpoints set public_key = ${other.publicKey}, signature = ${signStatement(other, checkpointStatement(second))} where id = ${second.id}`);
    expect(await verifyOrganisationChain(org)).toMatchObject({ ok: false, reason: "checkpoint-signature", checkpoint: { number: 2 } });
    // after a key change, an earlier key listed in the environment (never the database) is trusted
    process.env.CUSTODY_PREVIOUS_PUBLIC_KEYS = other.publicKey;
    try {
      expect((await verifyOrganisationChain(org)).ok).toBe(true);
    } finally {
      delete process.env.CUSTODY_PREVIOUS_PUBLIC_KEYS;
    }
    await asOwner((sql) => sql`update custody_checkpoints set public_key = ${second.publicKey}, signature = ${second.signature} where id = ${second.id}`);
    // checkpoint 2's token put on checkpoint 1
    await asOwner((sql) => sql`update custody_checkpoints set tsa_response = ${second.tsaResponse}, stamped_at = ${second.stampedAt} where id = ${first.id}`);
    expect(await verifyOrganisationChain(org)).toMatchObject({ ok: false, reason: "checkpoint-timestamp", checkpoint: { number: 1 } });
    await asOwner((sql) => sql`update custody_checkpoints set tsa_response = ${first.tsaResponse}, stamped_at = ${first.stampedAt} where id = ${first.id}`);
    // checkpoint 1 removed
    await asOwner((sql) => sql`delete from custody_checkpoints where id = ${first.id}`);
    expect(await verifyOrganisationChain(org)).toMatchObject({ ok: false, reason: "checkpoint-missing", checkpoint: { number: 2 } });
    await asOwner((sql) => sql`insert into custody_checkpoints ${sql(snake(first) as Record<string, postgres.ParameterOrJSON<never>>)}`);
    expect((await verifyOrganisationChain(org)).ok).toBe(true);
  });

  it("the untouched chain after all this still verifies complete up to checkpoint 2", async () => {
    const after = await db().select().from(custodyEvents).where(and(eq(custodyEvents.organisationId, org), gt(custodyEvents.seq, 35)));
    expect(after).toEqual([]);
    expect(await verifyOrganisationChain(org)).toMatchObject({ ok: true, count: 35, anchor: { number: 2, unanchored: 0 } });
  });
});

describe("the verify action", () => {
  it("reports the anchor of the demo organisation's chain, and a cut tail with a plain explanation", async () => {
    const actors = await demoActors();
    const orgId = await demoOrganisationId();
    await recordCustodyEvent({ organisationId: orgId, eventType: "view", evidenceType: "job", purpose: "before the checkpoint" });
    expect((await makeCheckpoint(orgId, { tsaUrl: tsa.url })).outcome).toBe("made");
    const victim = await recordCustodyEvent({ organisationId: orgId, eventType: "view", evidenceType: "job", purpose: "after the checkpoint" });
    const body = await (await verifyRoute.POST(await req(actors.owner, "POST", "/api/custody/verify"))).json();
    expect(body).toMatchObject({ ok: true, anchor: { unanchored: 1 } });
    expect(typeof body.anchor.stampedAt).toBe("string");
    expect((await makeCheckpoint(orgId, { tsaUrl: tsa.url })).outcome).toBe("made");
    await asOwner((sql) => sql`delete from custody_events where id = ${victim.id}`);
    const cut = await (await verifyRoute.POST(await req(actors.owner, "POST", "/api/custody/verify"))).json();
    expect(cut).toMatchObject({ ok: false, reason: "truncated", checkpoint: { headSeq: victim.seq } });
    expect(cut.explanation).toContain("removed from the end");
    await asOwner((sql) => sql`insert into custody_events ${sql(snake(victim as unknown as Record<string, unknown>) as Record<string, postgres.ParameterOrJSON<never>>)}`);
    expect((await (await verifyRoute.POST(await req(actors.owner, "POST", "/api/custody/verify"))).json()).ok).toBe(true);
  });
});
