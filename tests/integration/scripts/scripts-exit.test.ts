// The set-up scripts that `npm start` and `npm test` run one after another must each exit on their
// own: one that leaves a PostgreSQL or Redis connection open never returns, and everything after it
// (the build, the web app, the worker) never starts. Run here as `npm start` runs them, on a database
// of their own that starts empty, with a time limit.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { execFile } from "node:child_process";
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import postgres from "postgres";
import IORedis from "ioredis";
import { TEST_ENV, TEST_DB_NAME } from "@/tests/support/test-env";

const root = path.resolve(__dirname, "../../..");
const dbName = `${TEST_DB_NAME}_scripts`;
const prefix = `cairn-scripts-${process.pid}`;
const withDb = (url: string) => url.replace(/\/[^/]+$/, `/${dbName}`);
let storage: string;

type Outcome = { code: number | null; signal: string | null; stdout: string; stderr: string; ms: number };

/** Runs a script with tsx; a script still running after `limitMs` is killed and reported as such. */
function runScript(script: string, env: NodeJS.ProcessEnv, limitMs: number): Promise<Outcome> {
  const started = Date.now();
  return new Promise((resolve) => {
    execFile(path.join(root, "node_modules/.bin/tsx"), [script], { cwd: root, env, timeout: limitMs, killSignal: "SIGKILL" }, (err, stdout, stderr) => {
      const e = err as (Error & { code?: number; signal?: string }) | null;
      resolve({ code: e ? (typeof e.code === "number" ? e.code : null) : 0, signal: e?.signal ?? null, stdout, stderr, ms: Date.now() - started });
    });
  });
}

async function dropDatabase() {
  const server = postgres(TEST_ENV.MIGRATION_DATABASE_URL.replace(/\/[^/]+$/, "/postgres"), { max: 1, onnotice: () => {} });
  await server.unsafe(`DROP DATABASE IF EXISTS "${dbName}" WITH (FORCE)`);
  return server;
}

beforeAll(async () => {
  const server = await dropDatabase();
  await server.unsafe(`CREATE DATABASE "${dbName}"`);
  await server.end();
  storage = await mkdtemp(path.join(os.tmpdir(), "cairn-scripts-"));
});

afterAll(async () => {
  await (await dropDatabase()).end();
  const redis = new IORedis(TEST_ENV.REDIS_URL);
  const keys = await redis.keys(`${prefix}:*`);
  if (keys.length) await redis.del(...keys);
  await redis.quit();
  await rm(storage, { recursive: true, force: true });
});

describe("set-up scripts exit on their own", () => {
  const env = () => ({
    ...process.env,
    ...TEST_ENV,
    DATABASE_URL: withDb(TEST_ENV.DATABASE_URL),
    MIGRATION_DATABASE_URL: withDb(TEST_ENV.MIGRATION_DATABASE_URL),
    QUEUE_PREFIX: prefix,
    STORAGE_DIR: path.join(storage, "storage"),
    UPLOAD_DIR: path.join(storage, "uploads"),
  });

  it("db/migrate.ts on an empty database", async () => {
    const out = await runScript("db/migrate.ts", env(), 60_000);
    expect(out.signal, `still running after ${out.ms} ms:\n${out.stdout}${out.stderr}`).toBeNull();
    expect(out.code, out.stderr).toBe(0);
    expect(out.stdout).toContain("migrations applied");
  });

  it("db/seed.ts on the first start (demo recordings generated and queued), then again (nothing to do)", async () => {
    const first = await runScript("db/seed.ts", env(), 240_000);
    expect(first.signal, `still running after ${first.ms} ms:\n${first.stdout}${first.stderr}`).toBeNull();
    expect(first.code, first.stderr).toBe(0);
    expect(first.stdout).toMatch(/\d+ demo recordings generated/);
    // the jobs really reached Redis before the script closed its connections
    const redis = new IORedis(TEST_ENV.REDIS_URL);
    const waiting = await redis.llen(`${prefix}:process-recording:wait`);
    await redis.quit();
    expect(waiting).toBeGreaterThan(0);

    const again = await runScript("db/seed.ts", env(), 60_000);
    expect(again.signal, `still running after ${again.ms} ms`).toBeNull();
    expect(again.code, again.stderr).toBe(0);
    expect(again.stdout).toContain("already present");
  }, 400_000);
});
