// Runs once before the integration (and browser) tests: a clean test database with the committed
// migrations applied and the demo scenario seeded, an empty test Redis index, empty test storage.
import postgres from "postgres";
import IORedis from "ioredis";
import { rm, mkdir } from "node:fs/promises";
import { TEST_ENV } from "./test-env";

export default async function setup() {
  Object.assign(process.env, TEST_ENV);
  // the test database is created on first use (a parallel test slot has its own)
  const server = postgres(TEST_ENV.MIGRATION_DATABASE_URL.replace(/\/[^/]+$/, "/postgres"), { max: 1, onnotice: () => {} });
  const name = new URL(TEST_ENV.MIGRATION_DATABASE_URL).pathname.slice(1);
  const [exists] = await server`select 1 from pg_database where datname = ${name}`;
  if (!exists) await server.unsafe(`CREATE DATABASE "${name}"`);
  await server.end();
  const admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 1, onnotice: () => {} });
  await admin.unsafe("DROP SCHEMA IF EXISTS drizzle CASCADE; DROP SCHEMA IF EXISTS public CASCADE; CREATE SCHEMA public;");
  await admin.end();
  const { runMigrations } = await import("@/db/migrate");
  await runMigrations(TEST_ENV.MIGRATION_DATABASE_URL, TEST_ENV.DATABASE_URL);
  const { db, closeDb } = await import("@/db/client");
  const { seedDemo } = await import("@/db/seed/seed-demo");
  await seedDemo(db());
  await closeDb();
  const redis = new IORedis(TEST_ENV.REDIS_URL);
  await redis.flushdb();
  await redis.quit();
  await rm(TEST_ENV.STORAGE_DIR, { recursive: true, force: true });
  await rm(TEST_ENV.UPLOAD_DIR, { recursive: true, force: true });
  await mkdir(TEST_ENV.STORAGE_DIR, { recursive: true });
}
