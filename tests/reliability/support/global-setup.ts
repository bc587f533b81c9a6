// Before the fault suite: its own PostgreSQL cluster and Redis (throwaway-services.ts) running, a fresh
// database with the committed migrations and the demo seed, empty storage. After it: both stopped.
import postgres from "postgres";
import { rm, mkdir } from "node:fs/promises";
import { RELIABILITY_ENV } from "./reliability-env";
import { initPostgres, startPostgres, startRedis, stopPostgresFast, stopRedisNoSave } from "./throwaway-services";

export default async function setup() {
  Object.assign(process.env, RELIABILITY_ENV);
  initPostgres();
  startPostgres();
  await startRedis();
  const server = postgres(RELIABILITY_ENV.MIGRATION_DATABASE_URL.replace(/\/[^/]+$/, "/postgres"), { max: 1, onnotice: () => {} });
  const [role] = await server`select 1 from pg_roles where rolname = 'cairn_app'`;
  if (!role) await server.unsafe(`CREATE ROLE cairn_app LOGIN PASSWORD 'cairn_app_local' NOSUPERUSER NOCREATEDB NOCREATEROLE`);
  await server.unsafe(`DROP DATABASE IF EXISTS cairn WITH (FORCE)`);
  await server.unsafe(`CREATE DATABASE cairn`);
  await server.end();
  const { runMigrations } = await import("@/db/migrate");
  await runMigrations(RELIABILITY_ENV.MIGRATION_DATABASE_URL, RELIABILITY_ENV.DATABASE_URL);
  const { db, closeDb } = await import("@/db/client");
  const { seedDemo } = await import("@/db/seed/seed-demo");
  await seedDemo(db());
  await closeDb();
  const { closeQueues } = await import("@/lib/queue/jobs");
  await closeQueues();
  const { closeRedis } = await import("@/lib/queue/redis");
  await closeRedis();
  await rm(RELIABILITY_ENV.STORAGE_DIR, { recursive: true, force: true });
  await rm(RELIABILITY_ENV.UPLOAD_DIR, { recursive: true, force: true });
  await mkdir(RELIABILITY_ENV.STORAGE_DIR, { recursive: true });
  return async () => {
    stopPostgresFast();
    await stopRedisNoSave();
  };
}
