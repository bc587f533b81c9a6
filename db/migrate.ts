// Applies the committed SQL migrations as the schema owner, then grants the app's role
// what it needs: DML on every table, but only SELECT and INSERT on the custody log.
import { drizzle } from "drizzle-orm/postgres-js";
import { migrate } from "drizzle-orm/postgres-js/migrator";
import postgres from "postgres";
import path from "node:path";
import { env } from "@/lib/config/env";

export async function runMigrations(adminUrl = env().MIGRATION_DATABASE_URL, appUrl = env().DATABASE_URL): Promise<void> {
  const sql = postgres(adminUrl, { max: 1, onnotice: () => {} });
  try {
    await migrate(drizzle(sql), { migrationsFolder: path.resolve(__dirname, "migrations") });
    const appRole = new URL(appUrl).username;
    const adminRole = new URL(adminUrl).username;
    if (appRole && appRole !== adminRole) {
      await sql.unsafe(`GRANT USAGE ON SCHEMA public TO "${appRole}"`);
      await sql.unsafe(`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO "${appRole}"`);
      await sql.unsafe(`GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO "${appRole}"`);
      await sql.unsafe(`REVOKE UPDATE, DELETE, TRUNCATE ON custody_events FROM "${appRole}"`);
    }
  } finally {
    await sql.end({ timeout: 5 });
  }
}

if (process.argv[1] && process.argv[1].endsWith("migrate.ts")) {
  runMigrations()
    .then(() => console.log("[cairn] migrations applied"))
    .catch((err) => {
      console.error("[cairn] migration failed:", err);
      process.exit(1);
    });
}
