// A fingerprint of every table in the test database: md5 over the text of all rows of each table,
// so a test can say "nothing was written" for any route without naming the tables it might touch.
import { sql } from "drizzle-orm";
import { db } from "@/db/client";

export async function tableNames(): Promise<string[]> {
  const rows = await db().execute<{ table_name: string }>(
    sql`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' and table_name not like '%drizzle%' order by table_name`,
  );
  return rows.map((r) => r.table_name);
}

// Bookkeeping that any signed-in request may touch (session rows, their last-seen time, sign-in
// limits): not something a refused request "wrote".
const BOOKKEEPING = /session|attempt|rate_limit|throttle/;

/** table name -> md5 of its rows (row text, sorted), for every table but session bookkeeping. */
export async function dbFingerprint(): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const t of await tableNames()) {
    if (BOOKKEEPING.test(t)) continue;
    const [row] = await db().execute<{ h: string }>(sql.raw(`select md5(coalesce(string_agg(t::text, '|' order by t::text), '')) as h from "${t}" t`));
    out[t] = row.h;
  }
  return out;
}

/** The tables whose fingerprint differs between two snapshots. */
export function changedTables(before: Record<string, string>, after: Record<string, string>): string[] {
  return Object.keys({ ...before, ...after }).filter((t) => before[t] !== after[t]);
}
