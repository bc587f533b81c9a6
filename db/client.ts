// The database client. One postgres.js pool per process, kept on globalThis so that
// Next's hot reload in development does not open a new pool on every change.
import "server-only";
import { drizzle, type PostgresJsDatabase } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import { z } from "zod";
import * as schema from "./schema";
import { env } from "@/lib/config/env";

export type Db = PostgresJsDatabase<typeof schema>;
type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
export type DbOrTx = Db | Tx;

type QueryObserver = (query: string, parameters: unknown[]) => void;
const g = globalThis as unknown as { __cairnSql?: postgres.Sql; __cairnDb?: Db; __cairnQueryObserver?: QueryObserver };

/**
 * Connections per process (DATABASE_POOL_MAX, default 10). With N web and M worker processes the
 * database sees up to (N + M) x this many, which must stay under its max_connections (or the pooler's
 * limit) with room for migrations and administration: README, "Running several instances".
 */
export function poolSize(value = process.env.DATABASE_POOL_MAX): number {
  const parsed = z.coerce.number().int().min(1).max(500).safeParse(value === undefined || value === "" ? 10 : value);
  if (!parsed.success) throw new Error(`DATABASE_POOL_MAX must be a whole number from 1 to 500, got ${JSON.stringify(value)}`);
  return parsed.data;
}

export function sqlClient(): postgres.Sql {
  if (!g.__cairnSql) {
    g.__cairnSql = postgres(env().DATABASE_URL, {
      max: poolSize(),
      idle_timeout: 30,
      onnotice: () => {},
      // tests that read the SQL a function sends (the lists' EXPLAIN tests) ask for it before the pool
      // opens; never otherwise, since postgres.js's debug mode also makes a failed query's bound
      // parameters enumerable on its error, where a log line could pick them up
      ...(process.env.CAIRN_OBSERVE_QUERIES === "1" ? { debug: (_connection: number, query: string, parameters: unknown[]) => g.__cairnQueryObserver?.(query, parameters) } : {}),
    });
  }
  return g.__cairnSql;
}

/**
 * Calls `observer` with every query this process sends until the returned function is called; only
 * when CAIRN_OBSERVE_QUERIES=1 was set before the pool opened.
 */
export function observeQueries(observer: QueryObserver): () => void {
  g.__cairnQueryObserver = observer;
  return () => {
    if (g.__cairnQueryObserver === observer) g.__cairnQueryObserver = undefined;
  };
}

export function db(): Db {
  if (!g.__cairnDb) g.__cairnDb = drizzle(sqlClient(), { schema });
  return g.__cairnDb;
}

const preparedByDb = new WeakMap<Db, Map<string, unknown>>();

/**
 * A query built once per pool and run many times with its `sql.placeholder` values (Drizzle's
 * prepared queries): Drizzle builds a query's SQL text from its object tree on every call, which
 * costs more CPU than the database round trip for the small queries every request makes (the session
 * and membership look-up: 0.55 ms per call built, 0.07 ms prepared; bench/list-api.ts). After
 * closeDb() the next call prepares again on the new pool.
 */
export function prepared<T>(name: string, build: (d: Db) => T): T {
  const d = db();
  let byName = preparedByDb.get(d);
  if (!byName) preparedByDb.set(d, (byName = new Map()));
  if (!byName.has(name)) byName.set(name, build(d));
  return byName.get(name) as T;
}

export async function closeDb(): Promise<void> {
  if (g.__cairnSql) await g.__cairnSql.end({ timeout: 5 });
  g.__cairnSql = undefined;
  g.__cairnDb = undefined;
}
