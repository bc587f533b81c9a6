// Start-up check of the settings that decide whether an acknowledged write survives a crash:
//   PostgreSQL fsync off               a power loss or OS crash can corrupt the whole cluster
//                                       (PostgreSQL documentation, "Write Ahead Log" settings: fsync)
//   PostgreSQL synchronous_commit off  a commit is acknowledged before its WAL is on disk: the last
//                                       moments of uploads, findings and custody events can vanish
//   Redis maxmemory-policy not noeviction
//                                       under memory pressure Redis deletes keys, queued jobs included
//                                       (BullMQ documentation, "Going to production": noeviction)
// The web server (instrumentation.ts) and the worker (worker/main.ts) print these at start. Never
// fatal: a setting someone chose on purpose is theirs to keep, but it must not go unnoticed.
import type postgres from "postgres";
import type IORedis from "ioredis";

export type DurabilityFacts = { fsync: string | null; synchronousCommit: string | null; maxmemoryPolicy: string | null };

export async function readDurabilityFacts(sql: postgres.Sql, redis: IORedis): Promise<{ facts: DurabilityFacts; problems: string[] }> {
  const facts: DurabilityFacts = { fsync: null, synchronousCommit: null, maxmemoryPolicy: null };
  const problems: string[] = [];
  try {
    const rows = await sql<{ name: string; setting: string }[]>`select name, setting from pg_settings where name in ('fsync', 'synchronous_commit')`;
    for (const r of rows) {
      if (r.name === "fsync") facts.fsync = r.setting;
      else facts.synchronousCommit = r.setting;
    }
  } catch (err) {
    problems.push(`could not read PostgreSQL's fsync and synchronous_commit: ${(err as Error).message}`);
  }
  try {
    // INFO works where CONFIG GET is disabled (managed Redis services often rename CONFIG)
    const info = await redis.info("memory");
    facts.maxmemoryPolicy = /^maxmemory_policy:(\S+)/m.exec(info)?.[1] ?? null;
  } catch (err) {
    problems.push(`could not read Redis's maxmemory-policy: ${(err as Error).message}`);
  }
  return { facts, problems };
}

export function durabilityWarnings(facts: DurabilityFacts): string[] {
  const out: string[] = [];
  if (facts.fsync === "off") out.push("PostgreSQL runs with fsync = off: a crash of the machine can corrupt the database. Set fsync = on.");
  if (facts.synchronousCommit === "off") {
    out.push("PostgreSQL runs with synchronous_commit = off: writes acknowledged just before a crash (uploads, findings, custody events) can be lost. Set synchronous_commit = on.");
  }
  if (facts.maxmemoryPolicy && facts.maxmemoryPolicy !== "noeviction") {
    out.push(`Redis runs with maxmemory-policy ${facts.maxmemoryPolicy}: under memory pressure it deletes queued jobs. Set maxmemory-policy noeviction.`);
  }
  return out;
}

/** Reads the settings through the process's own connections and prints a warning for each risk. */
export async function warnAboutDurability(log: (line: string) => void = (l) => console.warn(l)): Promise<string[]> {
  const { sqlClient } = await import("@/db/client");
  const { redis } = await import("@/lib/queue/redis");
  const { facts, problems } = await readDurabilityFacts(sqlClient(), redis());
  const lines = [...durabilityWarnings(facts), ...problems];
  for (const line of lines) log(`[cairn] warning: ${line}`);
  return lines;
}
