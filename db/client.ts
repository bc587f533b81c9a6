// The database client. One postgres.js pool per process, kept on globalThis so that
// Next's hot reload in development does not open a new pool on every change.
import { drizzle, type PostgresJsDatabase } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import * as schema from "./schema";
import { env } from "@/lib/config/env";

export type Db = PostgresJsDatabase<typeof schema>;
type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
export type DbOrTx = Db | Tx;

const g = globalThis as unknown as { __cairnSql?: postgres.Sql; __cairnDb?: Db };

export function sqlClient(): postgres.Sql {
  if (!g.__cairnSql) {
    g.__cairnSql = postgres(env().DATABASE_URL, { max: 10, idle_timeout: 30, onnotice: () => {} });
  }
  return g.__cairnSql;
}

export function db(): Db {
  if (!g.__cairnDb) g.__cairnDb = drizzle(sqlClient(), { schema });
  return g.__cairnDb;
}

export async function closeDb(): Promise<void> {
  if (g.__cairnSql) await g.__cairnSql.end({ timeout: 5 });
  g.__cairnSql = undefined;
  g.__cairnDb = undefined;
}
