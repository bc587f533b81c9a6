// At start-up the app warns when PostgreSQL's fsync or synchronous_commit is off, or when Redis may
// evict keys (maxmemory-policy other than noeviction). Checked against the suite's own PostgreSQL and
// Redis, whose settings the test changes (ALTER SYSTEM + pg_reload_conf(), CONFIG SET) and restores;
// and end to end: a worker process started against them prints the warnings.
import { afterAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import IORedis from "ioredis";
import { readDurabilityFacts, durabilityWarnings } from "@/lib/config/check-durability";
import { spawnWorker } from "@/tests/integration/processing/support/spawn-worker";
import { RELIABILITY_ENV } from "./support/reliability-env";

const admin = postgres(RELIABILITY_ENV.MIGRATION_DATABASE_URL, { max: 1, onnotice: () => {} });
const redis = new IORedis(RELIABILITY_ENV.REDIS_URL);
const appSql = () => postgres(RELIABILITY_ENV.DATABASE_URL, { max: 1, onnotice: () => {} });

async function setUnsafe(on: boolean) {
  if (on) {
    await admin.unsafe("ALTER SYSTEM SET fsync = off");
    await admin.unsafe("ALTER SYSTEM SET synchronous_commit = off");
    await redis.config("SET", "maxmemory-policy", "allkeys-lru");
  } else {
    await admin.unsafe("ALTER SYSTEM RESET fsync");
    await admin.unsafe("ALTER SYSTEM RESET synchronous_commit");
    await redis.config("SET", "maxmemory-policy", "noeviction");
  }
  await admin`select pg_reload_conf()`;
  await new Promise((r) => setTimeout(r, 300)); // the postmaster re-reads its files asynchronously
}

afterAll(async () => {
  await setUnsafe(false).catch(() => {});
  await admin.end();
  await redis.quit();
});

describe("start-up durability warnings", () => {
  it("say nothing when fsync and synchronous_commit are on and Redis does not evict", async () => {
    const sql = appSql();
    const { facts, problems } = await readDurabilityFacts(sql, redis);
    await sql.end();
    expect(problems).toEqual([]);
    expect(facts).toEqual({ fsync: "on", synchronousCommit: "on", maxmemoryPolicy: "noeviction" });
    expect(durabilityWarnings(facts)).toEqual([]);
  });

  it("name each unsafe setting, and a starting worker prints them", async () => {
    await setUnsafe(true);
    try {
      const sql = appSql();
      const { facts } = await readDurabilityFacts(sql, redis);
      await sql.end();
      expect(facts).toEqual({ fsync: "off", synchronousCommit: "off", maxmemoryPolicy: "allkeys-lru" });
      const lines = durabilityWarnings(facts);
      expect(lines).toHaveLength(3);
      expect(lines.join("\n")).toMatch(/fsync = off[\s\S]*synchronous_commit = off[\s\S]*maxmemory-policy allkeys-lru/);

      const worker = spawnWorker({ ...RELIABILITY_ENV, CAIRN_WORKER_RECONCILE_MS: "600000" });
      try {
        await worker.waitForLine(/warning: Redis runs with maxmemory-policy allkeys-lru/, 60_000);
        expect(worker.output()).toMatch(/warning: PostgreSQL runs with fsync = off/);
        expect(worker.output()).toMatch(/warning: PostgreSQL runs with synchronous_commit = off/);
      } finally {
        worker.child.kill("SIGTERM");
        await worker.exited;
      }
    } finally {
      await setUnsafe(false);
    }
  });
});
