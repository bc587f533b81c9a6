// Benchmark: memory of verifying a stored custody chain, the way "Verify chain" does
// (verifyOrganisationChain: keyset pages of VERIFY_PAGE_SIZE events read through the app's role,
// each re-serialised and re-hashed). Two chains seeded side by side by bench/seed-scale.ts, 100,000
// and 1,000,000 events by default (reused: .data/bench/custody-verify-seed-<slot>.json); each is
// verified while the live heap is sampled every 250 ms (a full collection first, so garbage V8 has
// not collected yet does not count). Memory is bounded when the peak live heap stays the same for ten
// times the events (target: ratio <= 1.5x), while the time grows with the count.
//   CAIRN_TEST_SLOT=<n> NODE_OPTIONS=--expose-gc npx tsx bench/custody-verify-memory.ts [events=1000000]
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { TEST_ENV } from "@/tests/support/test-env";

const large = Number(process.argv[2] ?? 1_000_000);
const small = Math.max(1000, Math.floor(large / 10));

async function main() {
  if (!process.env.CAIRN_TEST_SLOT) throw new Error("set CAIRN_TEST_SLOT so the bench uses a test slot's database, never the development one");
  Object.assign(process.env, TEST_ENV);
  const postgres = (await import("postgres")).default;
  const { closeDb } = await import("@/db/client");
  const { seedScale } = await import("./seed-scale");
  const { verifyOrganisationChain, VERIFY_PAGE_SIZE } = await import("@/lib/custody/verify-organisation-chain");

  if (typeof global.gc !== "function") throw new Error("run with NODE_OPTIONS=--expose-gc");
  const gc = global.gc;
  const admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 2, onnotice: () => {} });
  const seedFile = path.resolve(__dirname, `../.data/bench/custody-verify-seed-${process.env.CAIRN_TEST_SLOT}.json`);
  mkdirSync(path.dirname(seedFile), { recursive: true });
  const saved: Record<number, string> = existsSync(seedFile) ? JSON.parse(readFileSync(seedFile, "utf8")) : {};
  const orgs: Record<number, string> = {};
  for (const n of [small, large]) {
    const [have] = saved[n] ? await admin`select count(*)::int as c from custody_events where organisation_id = ${saved[n]}` : [{ c: 0 }];
    if (have.c === n) {
      orgs[n] = saved[n];
      continue;
    }
    const t0 = performance.now();
    orgs[n] = (await seedScale(admin, { recordings: 10, findings: 0, custodyEvents: n, jobs: 1, flightsPerJob: 1 })).organisationId;
    console.error(`seeded ${n} events in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
  }
  writeFileSync(seedFile, JSON.stringify(orgs));
  await admin.end();

  const measure = async (n: number) => {
    gc();
    const base = process.memoryUsage().heapUsed;
    let peak = base;
    const timer = setInterval(() => {
      gc();
      peak = Math.max(peak, process.memoryUsage().heapUsed);
    }, 250);
    const t0 = performance.now();
    const result = await verifyOrganisationChain(orgs[n]);
    const seconds = (performance.now() - t0) / 1000;
    clearInterval(timer);
    if (!result.ok || result.count !== n) throw new Error(`verification of ${n} events: ${JSON.stringify(result)}`);
    return { n, seconds, peakAboveStartMb: (peak - base) / 2 ** 20 };
  };
  await measure(small); // warm: modules, pool, JIT
  const a = await measure(small);
  const b = await measure(large);
  console.log(`Custody verification, pages of ${VERIFY_PAGE_SIZE} events (live heap sampled every 250 ms):`);
  for (const r of [a, b]) console.log(`  ${String(r.n).padStart(9)} events: ${r.seconds.toFixed(1)} s, ${(r.n / r.seconds).toFixed(0)} events/s, peak live heap above start ${r.peakAboveStartMb.toFixed(1)} MB`);
  const ratio = b.peakAboveStartMb / a.peakAboveStartMb;
  console.log(`peak live heap, ${b.n} over ${a.n} events: ${ratio.toFixed(2)}x (bounded: target <= 1.5x) ${ratio <= 1.5 ? "ok" : "OVER"}`);
  await closeDb();
}

void main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
