// List API throughput and latency, side by side in one run: Cairn (`next start` of the build in this
// test slot's folder, the full request path: session, membership, permission, zod, the list function)
// against a bare node:http server that runs the same SQL through postgres.js and returns its rows as
// JSON. The SQL is the exact text and parameters Cairn's handlers send for each request (read through
// db/client.ts's query observer), minus the session and membership look-ups the bare server does not
// make. Load: autocannon (npm) with 50 connections per endpoint and server.
//
// Two invented organisations seeded by bench/seed-scale.ts: "small" (50 jobs, 100 recordings, 2,500
// findings, 10,000 custody events) and "large" (100 jobs, 10,000 recordings, 100,000 findings, 1,000,000
// custody events), reused between runs (.data/bench/list-api-seed-v2-<slot>.json). Every measured page
// is a full one (50 rows) in both.
// Endpoints: the recordings list, a job's findings, the jobs list, the custody log, and the recording
// page's API (GET /api/recordings/:id).
//
// Prints per endpoint and size: requests/s and p95 of both; Cairn/bare throughput (target >= 0.5x) and
// Cairn's p95 at 10,000 recordings over its p95 at 100 (target <= 1.5x).
//
// While both servers are measured, --uploads N (default 5) tus uploads of --upload-mb MiB (default 200)
// run through Cairn's own web process without pause, each a new file (a raw H.264 head and random
// bytes), into a flight of the demo organisation; their recordings are removed at the end. Also printed:
// Next's floor, the same endpoint asked without a session (401 before any SQL), which bounds what any
// route handler of this build can answer on this machine.
//
//   CAIRN_TEST_SLOT=6 NEXT_DIST_DIR=.next-test-6 npx next build
//   CAIRN_TEST_SLOT=6 npx tsx bench/list-api.ts [--seconds 10] [--custody 1000000] [--show-sql [--only-sql]] [--only "recording page"] [--uploads 5] [--upload-mb 200]
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, openSync, readFileSync, writeFileSync } from "node:fs";
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
  const onlyAt = process.argv.indexOf("--only");
  const only = onlyAt > 0 ? process.argv[onlyAt + 1] : null;
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

  // the slot's database may predate the newest migrations (the seed is kept between runs)
  const { runMigrations } = await import("@/db/migrate");
  await runMigrations(TEST_ENV.MIGRATION_DATABASE_URL, TEST_ENV.DATABASE_URL);

  // seed once, reuse later (the custody log is append-only: a fresh seed each run would only grow it)
  const seedFile = path.join(root, `.data/bench/list-api-seed-v2-${process.env.CAIRN_TEST_SLOT ?? "0"}.json`);
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
    // every page is full in both organisations (50 jobs of 2 recordings and 50 findings each here), so
    // the p95 comparison is of the same page over more data, not of a 1-row answer against a 50-row one
    const small = await seedScale(admin, { recordings: 100, findings: 2500, custodyEvents: custody / 100, jobs: 50, flightsPerJob: 1 }, log);
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
  const webLog = openSync(path.join(root, `.data/logs/list-api-web-${process.env.CAIRN_TEST_SLOT ?? "0"}.log`), "w");
  // BENCH_WEB_NODE_ARGS: node flags for the web process only (for example "--cpu-prof --cpu-prof-dir=/tmp/prof")
  const nodeArgs = (process.env.BENCH_WEB_NODE_ARGS ?? "").split(" ").filter(Boolean);
  let uploads: Awaited<ReturnType<typeof startUploads>> | null = null;
  const web: ChildProcess = spawn(process.execPath, [...nodeArgs, path.join(root, "node_modules/next/dist/bin/next"), "start", "-p", String(E2E_PORT), "-H", "127.0.0.1"], {
    cwd: root,
    env: { ...process.env, ...TEST_ENV, CAIRN_OBSERVE_QUERIES: "", PORT: String(E2E_PORT), NEXT_TELEMETRY_DISABLED: "1" },
    stdio: ["ignore", webLog, webLog],
  });
  try {
    await waitFor(`http://127.0.0.1:${E2E_PORT}/sign-in`, 60_000);
    uploads = await startUploads(flag("uploads", 5), flag("upload-mb", 200));
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
        if (only && e.name !== only) continue;
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

    const floorUrl = `http://127.0.0.1:${E2E_PORT}${orgs[0].endpoints[0].url}`;
    const floor = await run(floorUrl, {}, seconds);
    const uploaded = uploads ? await uploads.stop() : null;

    console.log(`\nList API at ${CONNECTIONS} connections, ${seconds} s per run (small: 100 recordings, large: 10,000)`);
    if (uploaded)
      console.log(
        `meanwhile ${uploaded.streams} uploads of ${uploaded.mib} MiB ran through Cairn's web process: ${uploaded.completed} completed, ${uploaded.failed} failed, ${uploaded.mibPerSec.toFixed(0)} MiB/s in all`,
      );
    console.log(`Next's floor (the recordings list without a session: 401, no SQL): ${floor.rps.toFixed(0)} req/s, p95 ${floor.p95.toFixed(0)} ms`);
    console.log("endpoint        size   Cairn req/s  p95 ms   bare req/s  p95 ms   Cairn/bare  non-2xx");
    for (const r of rows) {
      console.log(
        `${r.endpoint.padEnd(15)} ${r.size.padEnd(6)} ${r.cairn.rps.toFixed(0).padStart(11)} ${r.cairn.p95.toFixed(0).padStart(7)} ${r.bare.rps.toFixed(0).padStart(12)} ${r.bare.p95.toFixed(0).padStart(7)} ${(r.cairn.rps / r.bare.rps).toFixed(2).padStart(10)}x ${String(r.cairn.non2xx + r.cairn.errors).padStart(8)}`,
      );
    }
    console.log("\nCairn p95, large over small (target <= 1.5x); Cairn/bare throughput at large (target >= 0.5x):");
    for (const e of orgs[0].endpoints.map((x) => x.name).filter((x) => !only || x === only)) {
      const small = rows.find((r) => r.endpoint === e && r.size === "small")!;
      const large = rows.find((r) => r.endpoint === e && r.size === "large")!;
      const growth = large.cairn.p95 / small.cairn.p95;
      const ratio = large.cairn.rps / large.bare.rps;
      console.log(`${e.padEnd(15)} p95 ${growth.toFixed(2)}x ${growth <= 1.5 ? "ok" : "OVER"}   throughput ${ratio.toFixed(2)}x ${ratio >= 0.5 ? "ok" : "UNDER"}`);
    }
  } finally {
    if (uploads) await uploads.stop().catch(() => {});
    web.kill("SIGINT"); // SIGINT lets --cpu-prof write its profile
    bare.close();
    await bareSql.end();
  }
}

/**
 * `streams` tus uploaders, each uploading a new file of `mib` MiB to Cairn's web process again and again
 * until stop(); stop() waits for the uploads in flight to end, then removes the recordings they made.
 */
async function startUploads(streams: number, mib: number) {
  if (streams <= 0) return null;
  const { open: openFile } = await import("node:fs/promises");
  const { createReadStream } = await import("node:fs");
  const { randomBytes } = await import("node:crypto");
  const os = await import("node:os");
  const tus = await import("tus-js-client");
  const { db } = await import("@/db/client");
  const s = await import("@/db/schema");
  const { eq } = await import("drizzle-orm");
  const { removeKey } = await import("@/lib/storage/store");
  const { actorByEmail, sessionCookie } = await import("@/tests/support/session");
  const { makeFlight } = await import("@/tests/support/factories");
  const { paddedH264 } = await import("./support/padded-h264");
  const { UPLOAD_CHUNK_BYTES } = await import("@/lib/uploads/upload-limits");

  const pilot = await actorByEmail("pilot@kestrelmoor.example");
  const flight = await makeFlight(pilot.organisationId, { aircraft: "bench" });
  const cookie = await sessionCookie(pilot);
  const size = mib * 1024 * 1024;
  const files: string[] = [];
  for (let i = 0; i < streams; i++) files.push(await paddedH264(path.join(os.tmpdir(), "cairn-bench", `list-api-upload-${i}-${mib}MiB.264`), size));

  let stopping = false;
  let completed = 0;
  let failed = 0;
  const created: string[] = [];
  const t0 = performance.now();
  const once = async (file: string) => {
    // new bytes each time, or the upload would be taken for a duplicate and not stored
    const fh = await openFile(file, "r+");
    await fh.write(randomBytes(64), 0, 64, 1024 * 1024);
    await fh.close();
    await new Promise<void>((resolve) => {
      const upload = new tus.Upload(createReadStream(file) as unknown as Buffer, {
        endpoint: `http://127.0.0.1:${E2E_PORT}/api/uploads`,
        chunkSize: UPLOAD_CHUNK_BYTES,
        retryDelays: [],
        headers: { cookie },
        storeFingerprintForResuming: false,
        metadata: { jobId: flight.jobId, flightId: flight.id, filename: `list-bench-${Date.now()}-${Math.random().toString(36).slice(2)}.264`, filetype: "", relativePath: "null" },
        onSuccess: ({ lastResponse }) => {
          const id = lastResponse.getHeader("Cairn-Recording-Id");
          if (id) created.push(id);
          completed++;
          resolve();
        },
        onError: (err) => {
          failed++;
          console.error(`  upload failed: ${err.message.slice(0, 200)}`);
          resolve();
        },
      });
      upload.start();
    });
  };
  const loops = files.map(async (file) => {
    while (!stopping) await once(file);
  });
  let stopped: Promise<{ streams: number; mib: number; completed: number; failed: number; mibPerSec: number }> | null = null;
  return {
    stop: () =>
      (stopped ??= (async () => {
        stopping = true;
        await Promise.all(loops);
        const seconds = (performance.now() - t0) / 1000;
        for (const id of created) {
          const [row] = await db().select({ key: s.recordings.storageKey }).from(s.recordings).where(eq(s.recordings.id, id));
          if (row?.key) await removeKey(row.key);
          await db().delete(s.recordings).where(eq(s.recordings.id, id));
        }
        return { streams, mib, completed, failed, mibPerSec: (completed * mib) / seconds };
      })()),
  };
}

void main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
