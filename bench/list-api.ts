// List API throughput and latency, side by side in one run: Cairn (`next start` of the build in this
// test slot's folder, the full request path: session, membership, permission, zod, the list function)
// against a bare node:http server that runs the same SQL through postgres.js and returns its rows as
// JSON. The SQL is the exact text and parameters Cairn's handlers send for each request (read through
// db/client.ts's query observer), minus the session and membership look-ups the bare server does not
// make. Load: autocannon (npm) with 50 connections per endpoint and server.
//
// Two invented organisations seeded by bench/seed-scale.ts: "small" (100 recordings, 1,000 findings,
// 10,000 custody events) and "large" (10,000 recordings, 100,000 findings, 1,000,000 custody events),
// reused between runs (.data/bench/list-api-seed-<slot>.json).
// Endpoints: the recordings list, a job's findings, the jobs list, the custody log, and the recording
// page's API (GET /api/recordings/:id).
//
// Prints per endpoint and size: requests/s and p95 of both; Cairn/bare throughput (target >= 0.5x) and
// Cairn's p95 at 10,000 recordings over its p95 at 100 (target <= 1.5x).
//
//   CAIRN_TEST_SLOT=6 NEXT_DIST_DIR=.next-test-6 npx next build
//   CAIRN_TEST_SLOT=6 npx tsx bench/list-api.ts [--seconds 10] [--custody 1000000] [--show-sql [--only-sql]]
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import http from "node:http";
import path from "node:path";
import { E2E_PORT, TEST_ENV } from "@/tests/support/test-env";

const root = path.resolve(__dirname, "..");
const CONNECTIONS = 50;

function flag(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
}

type Captured = { query: string; parameters: unknown[] };
type Endpoint = { name: string; url: string; sql: Captured[] };
type Org = { size: "small" | "large"; organisationId: string; ownerUserId: string; jobId: string; recordingId: string; cookie: string; endpoints: Endpoint[] };

function p95(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(sorted.length * 0.95))] ?? NaN;
}

async function waitFor(url: string, ms: number) {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    try {
      const r = await fetch(url);
      if (r.status < 500) return;
    } catch {}
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`nothing answered at ${url}`);
}

async function main() {
  Object.assign(process.env, TEST_ENV, { CAIRN_OBSERVE_QUERIES: "1" });
  const seconds = flag("seconds", 10);
  if (!existsSync(path.join(root, TEST_ENV.NEXT_DIST_DIR, "BUILD_ID"))) throw new Error(`build first: CAIRN_TEST_SLOT=${process.env.CAIRN_TEST_SLOT ?? ""} NEXT_DIST_DIR=${TEST_ENV.NEXT_DIST_DIR} npx next build`);
  // autocannon ships no type declarations: the part used here, as its README describes it
  type Result = { requests: { average: number }; errors: number; timeouts: number; non2xx: number };
  type Instance = { on(event: "response", fn: (client: unknown, status: number, bytes: number, responseTime: number) => void): void };
  type Autocannon = (opts: { url: string; connections: number; duration: number; headers: Record<string, string> }, done: (err: Error | null, result: Result) => void) => Instance;
  // @ts-expect-error no declaration file
  const autocannon = (await import("autocannon")).default as Autocannon;
  const { default: postgres } = await import("postgres");
  const { eq, and } = await import("drizzle-orm");
  const { db, observeQueries, closeDb } = await import("@/db/client");
  const s = await import("@/db/schema");
  const { seedScale } = await import("./seed-scale");
  const { sessionCookie } = await import("@/tests/support/session");
  const { loadMember } = await import("@/lib/auth/load-member");
  const { startSession } = await import("@/lib/auth/user-sessions");

  // seed once, reuse later (the custody log is append-only: a fresh seed each run would only grow it)
  const seedFile = path.join(root, `.data/bench/list-api-seed-${process.env.CAIRN_TEST_SLOT ?? "0"}.json`);
  mkdirSync(path.dirname(seedFile), { recursive: true });
  let seeds: Record<"small" | "large", { organisationId: string; ownerUserId: string }> | null = existsSync(seedFile) ? JSON.parse(readFileSync(seedFile, "utf8")) : null;
  if (seeds) {
    const found = await db().select({ id: s.organisations.id }).from(s.organisations).where(eq(s.organisations.id, seeds.large.organisationId));
    if (!found.length) seeds = null;
  }
  if (!seeds) {
    const admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 2, onnotice: () => {} });
    const custody = flag("custody", 1_000_000);
    const t0 = performance.now();
    const log = (line: string) => console.error(`  seed ${((performance.now() - t0) / 1000).toFixed(0)} s: ${line}`);
    const small = await seedScale(admin, { recordings: 100, findings: 1000, custodyEvents: custody / 100, jobs: 1, flightsPerJob: 10 }, log);
    const large = await seedScale(admin, { recordings: 10_000, findings: 100_000, custodyEvents: custody, jobs: 100, flightsPerJob: 10 }, log);
    await admin.end();
    seeds = { small: { organisationId: small.organisationId, ownerUserId: small.ownerUserId }, large: { organisationId: large.organisationId, ownerUserId: large.ownerUserId } };
    writeFileSync(seedFile, JSON.stringify(seeds));
  }

  // what Cairn sends per request, captured by calling the route handlers in this process
  const handlers = {
    recordings: await import("@/app/api/recordings/route"),
    findings: await import("@/app/api/findings/route"),
    jobs: await import("@/app/api/jobs/route"),
    custody: await import("@/app/api/custody/route"),
    recording: await import("@/app/api/recordings/[id]/route"),
  };
  async function capture(run: () => Promise<Response>): Promise<{ sql: Captured[]; status: number }> {
    const sent: Captured[] = [];
    const stop = observeQueries((query, parameters) => sent.push({ query, parameters }));
    let status: number;
    try {
      status = (await run()).status;
    } finally {
      stop();
    }
    // postgres.js may report a statement twice (describe, then execute): keep each once, in order
    // postgres.js's own type look-up when a connection opens is not part of the answer
    const unique = sent.filter((q, i) => !/pg_catalog\.pg_type/.test(q.query) && !sent.slice(0, i).some((p) => p.query === q.query && JSON.stringify(p.parameters) === JSON.stringify(q.parameters)));
    return { sql: unique, status };
  }

  const orgs: Org[] = [];
  for (const size of ["small", "large"] as const) {
    const { organisationId, ownerUserId } = seeds[size];
    const [job] = await db().select({ id: s.jobs.id }).from(s.jobs).where(eq(s.jobs.organisationId, organisationId)).limit(1);
    const [rec] = await db().select({ id: s.recordings.id }).from(s.recordings).where(and(eq(s.recordings.organisationId, organisationId), eq(s.recordings.jobId, job.id))).limit(1);
    const sid = await startSession(ownerUserId);
    const cookie = await sessionCookie({ userId: ownerUserId, organisationId }, sid);
    // the session and membership look-ups: Cairn's own, left out of the bare server's work
    const auth = await capture(async () => {
      await loadMember({ userId: ownerUserId, organisationId, sessionId: sid });
      return new Response(null);
    });
    const authQueries = new Set(auth.sql.map((q) => q.query));
    const request = (url: string) => new Request(new URL(url, "http://localhost"), { headers: { cookie } });
    const routes: [string, string, () => Promise<Response>][] = [
      ["recordings", "/api/recordings?pageSize=50", () => handlers.recordings.GET(request("/api/recordings?pageSize=50"))],
      ["findings", `/api/findings?jobId=${job.id}&pageSize=50`, () => handlers.findings.GET(request(`/api/findings?jobId=${job.id}&pageSize=50`))],
      ["jobs", "/api/jobs?pageSize=50", () => handlers.jobs.GET(request("/api/jobs?pageSize=50"))],
      ["custody", "/api/custody?pageSize=50", () => handlers.custody.GET(request("/api/custody?pageSize=50"))],
      ["recording page", `/api/recordings/${rec.id}`, () => handlers.recording.GET(request(`/api/recordings/${rec.id}`), { params: Promise.resolve({ id: rec.id }) })],
    ];
    const endpoints: Endpoint[] = [];
    for (const [name, url, run] of routes) {
      const { sql, status } = await capture(run);
      if (status !== 200) throw new Error(`${name} (${size}) answered ${status} in process`);
      endpoints.push({ name, url, sql: sql.filter((q) => !authQueries.has(q.query)) });
    }
    orgs.push({ size, organisationId, ownerUserId, jobId: job.id, recordingId: rec.id, cookie, endpoints });
  }
  await closeDb();
  if (process.argv.includes("--show-sql")) {
    // each statement with its plan's execution time (EXPLAIN ANALYZE, run once warm)
    const explainSql = postgres(TEST_ENV.DATABASE_URL, { max: 1, onnotice: () => {} });
    for (const o of orgs)
      for (const e of o.endpoints) {
        console.log(`-- ${e.name} (${o.size})`);
        for (const q of e.sql) {
          await explainSql.unsafe(q.query, q.parameters as never[]);
          const plan = await explainSql.unsafe(`explain (analyze, format json) ${q.query}`, q.parameters as never[]);
          const ms = (plan[0]["QUERY PLAN"] as { "Execution Time": number }[])[0]["Execution Time"];
          console.log(`${ms.toFixed(2).padStart(8)} ms  ${q.query.replace(/\s+/g, " ").slice(0, 150)}`);
        }
      }
    await explainSql.end();
    if (process.argv.includes("--only-sql")) return;
  }

  // the bare server: same SQL, same pool size, rows as JSON, no framework, no session
  const bareSql = postgres(TEST_ENV.DATABASE_URL, { max: 10, onnotice: () => {} });
  const byPath = new Map<string, Captured[]>();
  orgs.forEach((o, oi) => o.endpoints.forEach((e, ei) => byPath.set(`/${oi}/${ei}`, e.sql)));
  const bare = http.createServer(async (req, res) => {
    const statements = byPath.get(req.url ?? "");
    if (!statements) return void res.writeHead(404).end();
    try {
      // like Cairn's list functions, the statements of one answer run side by side
      const results = await Promise.all(statements.map((q) => bareSql.unsafe(q.query, q.parameters as never[])));
      const body = JSON.stringify({ results });
      res.writeHead(200, { "content-type": "application/json", "cache-control": "no-store" }).end(body);
    } catch (err) {
      res.writeHead(500).end(String(err));
    }
  });
  const barePort = E2E_PORT + 1;
  await new Promise<void>((r) => bare.listen(barePort, "127.0.0.1", r));

  mkdirSync(path.join(root, ".data/logs"), { recursive: true });
  const web: ChildProcess = spawn(path.join(root, "node_modules/.bin/next"), ["start", "-p", String(E2E_PORT), "-H", "127.0.0.1"], {
    cwd: root,
    env: { ...process.env, ...TEST_ENV, CAIRN_OBSERVE_QUERIES: "", PORT: String(E2E_PORT), NEXT_TELEMETRY_DISABLED: "1" },
    stdio: "ignore",
  });
  try {
    await waitFor(`http://127.0.0.1:${E2E_PORT}/sign-in`, 60_000);
    const run = (url: string, headers: Record<string, string>, duration: number) =>
      new Promise<{ rps: number; p95: number; errors: number; non2xx: number }>((resolve, reject) => {
        const latencies: number[] = [];
        const inst = autocannon({ url, connections: CONNECTIONS, duration, headers }, (err, result) => {
          if (err) return reject(err);
          resolve({ rps: result.requests.average, p95: p95(latencies), errors: result.errors + result.timeouts, non2xx: result.non2xx });
        });
        inst.on("response", (_client: unknown, _status: number, _bytes: number, responseTime: number) => latencies.push(responseTime));
      });

    const rows: { endpoint: string; size: string; cairn: Awaited<ReturnType<typeof run>>; bare: Awaited<ReturnType<typeof run>> }[] = [];
    for (const [oi, org] of orgs.entries()) {
      for (const [ei, e] of org.endpoints.entries()) {
        const cairnUrl = `http://127.0.0.1:${E2E_PORT}${e.url}`;
        const bareUrl = `http://127.0.0.1:${barePort}/${oi}/${ei}`;
        // warm both (Next compiles nothing at run time, but caches and the pool fill)
        await run(cairnUrl, { cookie: org.cookie }, 2);
        await run(bareUrl, {}, 2);
        const cairn = await run(cairnUrl, { cookie: org.cookie }, seconds);
        const bareResult = await run(bareUrl, {}, seconds);
        rows.push({ endpoint: e.name, size: org.size, cairn, bare: bareResult });
        console.error(`  ${e.name} (${org.size}): Cairn ${cairn.rps.toFixed(0)} req/s p95 ${cairn.p95.toFixed(0)} ms; bare ${bareResult.rps.toFixed(0)} req/s p95 ${bareResult.p95.toFixed(0)} ms`);
      }
    }

    console.log(`\nList API at ${CONNECTIONS} connections, ${seconds} s per run (small: 100 recordings, large: 10,000)`);
    console.log("endpoint        size   Cairn req/s  p95 ms   bare req/s  p95 ms   Cairn/bare  non-2xx");
    for (const r of rows) {
      console.log(
        `${r.endpoint.padEnd(15)} ${r.size.padEnd(6)} ${r.cairn.rps.toFixed(0).padStart(11)} ${r.cairn.p95.toFixed(0).padStart(7)} ${r.bare.rps.toFixed(0).padStart(12)} ${r.bare.p95.toFixed(0).padStart(7)} ${(r.cairn.rps / r.bare.rps).toFixed(2).padStart(10)}x ${String(r.cairn.non2xx + r.cairn.errors).padStart(8)}`,
      );
    }
    console.log("\nCairn p95, large over small (target <= 1.5x); Cairn/bare throughput at large (target >= 0.5x):");
    for (const e of orgs[0].endpoints.map((x) => x.name)) {
      const small = rows.find((r) => r.endpoint === e && r.size === "small")!;
      const large = rows.find((r) => r.endpoint === e && r.size === "large")!;
      const growth = large.cairn.p95 / small.cairn.p95;
      const ratio = large.cairn.rps / large.bare.rps;
      console.log(`${e.padEnd(15)} p95 ${growth.toFixed(2)}x ${growth <= 1.5 ? "ok" : "OVER"}   throughput ${ratio.toFixed(2)}x ${ratio >= 0.5 ? "ok" : "UNDER"}`);
    }
  } finally {
    web.kill("SIGTERM");
    bare.close();
    await bareSql.end();
  }
}

void main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
