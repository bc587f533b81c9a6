// The custody log cannot be changed by the application: its role has only SELECT and INSERT on the
// table, and triggers refuse UPDATE, DELETE and TRUNCATE even for a role that has the privilege.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { eq } from "drizzle-orm";
import { db, closeDb, sqlClient } from "@/db/client";
import { custodyEvents } from "@/db/schema";
import { recordCustodyEvent } from "@/lib/custody/record-custody-event";
import { demoOrganisationId } from "@/tests/support/session";
import { TEST_ENV } from "@/tests/support/test-env";
import { closeRedis } from "@/lib/queue/redis";

let orgId: string;
let eventId: string;
let admin: postgres.Sql;

beforeAll(async () => {
  orgId = await demoOrganisationId();
  const e = await recordCustodyEvent({ organisationId: orgId, eventType: "view", evidenceType: "job", purpose: "append-only test" });
  eventId = e.id;
  admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 1, onnotice: () => {} });
});
afterAll(async () => {
  await admin.end();
  await closeDb();
  await closeRedis();
});

// PostgreSQL SQLSTATE 42501 = insufficient_privilege (PostgreSQL documentation, Appendix A)
const INSUFFICIENT_PRIVILEGE = "42501";

describe("as the application's role", () => {
  it("connects as a role other than the table's owner", async () => {
    const [{ current_user: me }] = await sqlClient()`select current_user`;
    const [{ owner }] = await sqlClient()`select tableowner as owner from pg_tables where tablename = 'custody_events'`;
    expect(me).toBe(new URL(TEST_ENV.DATABASE_URL).username);
    expect(owner).not.toBe(me);
  });

  it.each([
    ["UPDATE", `update custody_events set purpose = 'rewritten' where id = $1`],
    ["DELETE", `delete from custody_events where id = $1`],
    ["TRUNCATE", `truncate custody_events`],
    ["TRUNCATE CASCADE", `truncate custody_events cascade`],
    ["DISABLE TRIGGER", `alter table custody_events disable trigger user`],
    ["DROP TRIGGER", `drop trigger custody_events_no_update_delete on custody_events`],
  ])("%s fails", async (_label, statement) => {
    const params = statement.includes("$1") ? [eventId] : [];
    const err = await sqlClient()
      .unsafe(statement, params)
      .then(() => null, (e: { code?: string }) => e);
    expect(err).not.toBeNull();
    // privilege refused, or (for ALTER/DROP) "must be owner" (42501 as well)
    expect(err!.code).toBe(INSUFFICIENT_PRIVILEGE);
    const [row] = await db().select().from(custodyEvents).where(eq(custodyEvents.id, eventId));
    expect(row.purpose).toBe("append-only test");
  });

  it("INSERT still works (appending is the only write)", async () => {
    const before = await db().$count(custodyEvents, eq(custodyEvents.organisationId, orgId));
    await recordCustodyEvent({ organisationId: orgId, eventType: "view", evidenceType: "job" });
    expect(await db().$count(custodyEvents, eq(custodyEvents.organisationId, orgId))).toBe(before + 1);
  });
});

describe("even as the table's owner", () => {
  it.each([
    ["UPDATE", `update custody_events set purpose = 'rewritten' where id = $1`],
    ["DELETE", `delete from custody_events where id = $1`],
    ["TRUNCATE", `truncate custody_events`],
  ])("%s is refused by the trigger", async (op, statement) => {
    const params = statement.includes("$1") ? [eventId] : [];
    const err = await admin.unsafe(statement, params).then(() => null, (e: { message?: string }) => e);
    expect(err?.message).toContain("append-only");
    expect(err?.message).toContain(op);
    const [row] = await db().select().from(custodyEvents).where(eq(custodyEvents.id, eventId));
    expect(row.purpose).toBe("append-only test");
  });
});
