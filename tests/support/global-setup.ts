// Runs once before the integration (and browser) tests: a clean test database with the committed
// migrations applied and the demo scenario seeded, an empty test Redis index, empty test storage.
import postgres from "postgres";
import IORedis from "ioredis";
import { rm, mkdir } from "node:fs/promises";
import { TEST_ENV } from "./test-env";

/** The bucket store's tests start from an empty test bucket, as the disk store's start from an empty folder. */
async function emptyTestBucket() {
  const { S3Client, ListObjectsV2Command, DeleteObjectsCommand } = await import("@aws-sdk/client-s3");
  const client = new S3Client({
    endpoint: TEST_ENV.S3_ENDPOINT,
    region: "us-east-1",
    forcePathStyle: true,
    credentials: { accessKeyId: TEST_ENV.S3_ACCESS_KEY_ID, secretAccessKey: TEST_ENV.S3_SECRET_ACCESS_KEY },
    requestChecksumCalculation: "WHEN_REQUIRED",
  });
  try {
    for (;;) {
      const page = await client.send(new ListObjectsV2Command({ Bucket: TEST_ENV.S3_BUCKET })).catch((err) => {
        if ((err as Error).name === "NoSuchBucket") return null;
        throw err;
      });
      const keys = (page?.Contents ?? []).map((o) => ({ Key: o.Key! }));
      if (!keys.length) break;
      await client.send(new DeleteObjectsCommand({ Bucket: TEST_ENV.S3_BUCKET, Delete: { Objects: keys, Quiet: true } }));
    }
  } finally {
    client.destroy();
  }
}

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
  await rm(TEST_ENV.SCRATCH_DIR, { recursive: true, force: true });
  await mkdir(TEST_ENV.STORAGE_DIR, { recursive: true });
  if (process.env.STORAGE_BACKEND === "s3") await emptyTestBucket();
}
