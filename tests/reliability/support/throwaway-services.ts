// A PostgreSQL cluster and a Redis server of the fault suite's own (reliability-env.ts), started,
// crashed and restarted by the tests. Same tools as docker-less-dev/up.sh: initdb and pg_ctl from
// Debian's PostgreSQL (run as the `postgres` user when we are root: PostgreSQL refuses root),
// redis-server without persistence (--save "" --appendonly no), so a restart loses everything.
import { execFileSync } from "node:child_process";
import { chmodSync, chownSync, existsSync, mkdirSync, readdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { RELIABILITY_DIR, RELIABILITY_PG_PORT, RELIABILITY_REDIS_PORT } from "./reliability-env";

const isRoot = process.getuid?.() === 0;
const pgBin = () => {
  const versions = readdirSync("/usr/lib/postgresql").sort((a, b) => Number(a) - Number(b));
  return path.join("/usr/lib/postgresql", versions[versions.length - 1], "bin");
};
const pgData = path.join(RELIABILITY_DIR, "postgres");
const pgRun = path.join(RELIABILITY_DIR, "postgres-run");
const pgLog = path.join(RELIABILITY_DIR, "postgres.log");
const redisDir = path.join(RELIABILITY_DIR, "redis");

function asPg(cmd: string, args: string[]): string {
  const [file, argv] = isRoot ? ["runuser", ["-u", "postgres", "--", cmd, ...args]] : [cmd, args];
  return execFileSync(file, argv, { stdio: ["ignore", "pipe", "pipe"] }).toString();
}

function postgresOwns(p: string) {
  if (!isRoot) return;
  const uid = Number(execFileSync("id", ["-u", "postgres"]).toString().trim());
  const gid = Number(execFileSync("id", ["-g", "postgres"]).toString().trim());
  chownSync(p, uid, gid);
}

export function initPostgres(): void {
  mkdirSync(pgData, { recursive: true });
  mkdirSync(pgRun, { recursive: true });
  // the postgres user must be able to reach the data folder
  for (let d = RELIABILITY_DIR; d !== "/"; d = path.dirname(d)) {
    try {
      chmodSync(d, 0o755);
    } catch {
      // not ours: leave it
    }
    if (d.endsWith(".data")) break;
  }
  postgresOwns(pgData);
  postgresOwns(pgRun);
  chmodSync(pgData, 0o700);
  if (!existsSync(pgLog)) writeFileSync(pgLog, "");
  postgresOwns(pgLog);
  if (!existsSync(path.join(pgData, "PG_VERSION"))) {
    const pw = path.join(RELIABILITY_DIR, "pw.txt");
    writeFileSync(pw, "cairn_admin_local\n", { mode: 0o644 });
    asPg(path.join(pgBin(), "initdb"), ["-D", pgData, "-U", "cairn_admin", `--pwfile=${pw}`, "--auth=scram-sha-256", "-E", "UTF8", "--locale=C.UTF-8"]);
  }
}

export function postgresRunning(): boolean {
  try {
    asPg(path.join(pgBin(), "pg_ctl"), ["-D", pgData, "status"]);
    return true;
  } catch {
    return false;
  }
}

export function startPostgres(): void {
  if (postgresRunning()) return;
  asPg(path.join(pgBin(), "pg_ctl"), ["-D", pgData, "-l", pgLog, "-w", "-t", "60", "-o",
    `-c listen_addresses=127.0.0.1 -p ${RELIABILITY_PG_PORT} -k ${pgRun}`, "start"]);
}

/** A crash: every server process quits at once, no checkpoint (recovery replays the WAL at the next start). */
export function stopPostgresImmediate(): void {
  asPg(path.join(pgBin(), "pg_ctl"), ["-D", pgData, "-m", "immediate", "-w", "stop"]);
}

export function stopPostgresFast(): void {
  if (postgresRunning()) asPg(path.join(pgBin(), "pg_ctl"), ["-D", pgData, "-m", "fast", "-w", "stop"]);
}

const redisCli = (...args: string[]) => execFileSync("redis-cli", ["-h", "127.0.0.1", "-p", String(RELIABILITY_REDIS_PORT), ...args], { stdio: ["ignore", "pipe", "pipe"] }).toString().trim();

export function redisRunning(): boolean {
  try {
    return redisCli("ping") === "PONG";
  } catch {
    return false;
  }
}

export async function startRedis(): Promise<void> {
  if (redisRunning()) return;
  mkdirSync(redisDir, { recursive: true });
  execFileSync("redis-server", ["--bind", "127.0.0.1", "--port", String(RELIABILITY_REDIS_PORT), "--dir", redisDir, "--save", "", "--appendonly", "no",
    "--maxmemory-policy", "noeviction", "--daemonize", "yes", "--pidfile", path.join(redisDir, "redis.pid"), "--logfile", path.join(redisDir, "redis.log")]);
  for (let i = 0; i < 100 && !redisRunning(); i++) await new Promise((r) => setTimeout(r, 50));
  if (!redisRunning()) throw new Error(`the throwaway Redis did not start on ${RELIABILITY_REDIS_PORT}`);
}

/** Stops Redis without writing its data anywhere: every queued job is gone. */
export async function stopRedisNoSave(): Promise<void> {
  try {
    redisCli("shutdown", "nosave");
  } catch {
    // redis-cli reports the closed connection as an error
  }
  for (let i = 0; i < 100 && redisRunning(); i++) await new Promise((r) => setTimeout(r, 50));
}

export const redisCommand = redisCli;
export const pgPaths = { data: pgData, log: pgLog };
