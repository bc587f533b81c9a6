// Benchmark: verifying a custody chain of 100,000 events stored in PostgreSQL, the way the
// "Verify chain" action does (keyset pages read through the app's database role, every event
// re-serialised and re-hashed, each link compared).
// Run: CAIRN_TEST_SLOT=<n> npx tsx bench/custody-chain-db.ts [eventCount]
// It uses the test slot's database (tests/support/test-env.ts), writes the events for a scratch
// organisation, and removes them afterwards as the schema owner (the app's role cannot).
//
// Printed side by side, on the same stored events:
//   read only   the same keyset page queries, rows mapped, nothing hashed (the database floor)
//   hash only   verifyChain over the rows already in memory (the hashing floor)
//   verify      verifyOrganisationChain: reading and verifying together
import { TEST_ENV } from "@/tests/support/test-env";

Object.assign(process.env, TEST_ENV);

const count = Number(process.argv[2] ?? 100_000);
const ROUNDS = 3;
const INSERT_BATCH = 2000;

async function main() {
  if (!process.env.CAIRN_TEST_SLOT) throw new Error("set CAIRN_TEST_SLOT so the bench uses a test slot's database, never the development one");
  const { randomUUID } = await import("node:crypto");
  const postgres = (await import("postgres")).default;
  const { and, asc, eq, gt } = await import("drizzle-orm");
  const { db, closeDb } = await import("@/db/client");
  const { custodyEvents, organisations } = await import("@/db/schema");
  const { linkCustodyEvent } = await import("@/lib/custody/link-custody-event");
  const { verifyChain } = await import("@/lib/custody/verify-chain");
  const { verifyOrganisationChain, VERIFY_PAGE_SIZE } = await import("@/lib/custody/verify-organisation-chain");
  const { runMigrations } = await import("@/db/migrate");

  const admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 1, onnotice: () => {} });
  const [{ exists }] = await admin`select to_regclass('public.custody_events') is not null as exists`;
  if (!exists) await runMigrations(TEST_ENV.MIGRATION_DATABASE_URL, TEST_ENV.DATABASE_URL);

  const [org] = await db().insert(organisations).values({ name: "Bench custody org", slug: `bench-chain-${Date.now()}` }).returning();
  const TYPES = ["upload", "processing", "derived", "view", "download", "share", "share_open", "finding_created", "report_built"] as const;
  const recordingIds = Array.from({ length: 200 }, () => randomUUID());
  const t0 = Date.UTC(2026, 0, 1);

  // Events shaped like recordCustodyEvent's payloads: every column present, sealed in order.
  const buildStart = process.hrtime.bigint();
  let previous: string | null = null;
  let inserted = 0;
  type Sealed = { id: string; prevHash: string; hash: string } & Record<string, unknown>;
  let batch: Sealed[] = [];
  const insertStart = process.hrtime.bigint();
  for (let i = 1; i <= count; i++) {
    const type = TYPES[i % TYPES.length];
    const sealed: Sealed = linkCustodyEvent<{ id: string } & Record<string, unknown>>(previous, {
      id: randomUUID(),
      organisationId: org.id,
      seq: i,
      eventType: type,
      evidenceType: type === "derived" ? "rendition" : "recording",
      evidenceId: recordingIds[i % recordingIds.length],
      jobId: null,
      originalSha256: "9f".repeat(32),
      originalSize: 734_003_200 + i,
      actorUserId: null,
      actorRole: i % 3 === 0 ? "pilot" : i % 3 === 1 ? "reviewer" : null,
      actorShareLinkId: null,
      occurredAt: new Date(t0 + i * 1500),
      clientAddress: "192.0.2.10",
      userAgent: "Mozilla/5.0 (X11; Linux x86_64) bench",
      storageLocation: `originals/${org.id}/${i % 100}`,
      purpose: type === "download" ? "Client downloaded the original through a share link" : null,
      tool: type === "derived" ? "ffmpeg" : null,
      toolArgs: type === "derived" ? ["-f", "h264", "-r", "30", "-i", "in.264", "-c", "copy", "-movflags", "+faststart", "out.mp4"] : null,
      outputSha256: type === "derived" ? "e3".repeat(32) : null,
      details: i % 4 === 0 ? { frames: i, note: "bench" } : null,
    });
    previous = sealed.hash;
    batch.push(sealed);
    if (batch.length === INSERT_BATCH || i === count) {
      await db().insert(custodyEvents).values(batch as (typeof custodyEvents.$inferInsert)[]);
      inserted += batch.length;
      batch = [];
    }
  }
  const insertMs = Number(process.hrtime.bigint() - insertStart) / 1e6;
  void buildStart;

  async function readOnly(): Promise<{ id: string; prevHash: string; hash: string }[]> {
    const all: (typeof custodyEvents.$inferSelect)[] = [];
    let after = 0;
    for (;;) {
      const rows = await db()
        .select()
        .from(custodyEvents)
        .where(and(eq(custodyEvents.organisationId, org.id), gt(custodyEvents.seq, after)))
        .orderBy(asc(custodyEvents.seq))
        .limit(VERIFY_PAGE_SIZE);
      if (rows.length === 0) break;
      for (const r of rows) all.push(r);
      after = rows[rows.length - 1].seq;
      if (rows.length < VERIFY_PAGE_SIZE) break;
    }
    return all;
  }
  const time = async (fn: () => Promise<unknown> | unknown) => {
    const s = process.hrtime.bigint();
    await fn();
    return Number(process.hrtime.bigint() - s) / 1e6;
  };
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

  const rowsInMemory = await readOnly(); // warm-up and the input of "hash only"
  if (rowsInMemory.length !== count) throw new Error(`read ${rowsInMemory.length} of ${count} events`);
  const first = await verifyOrganisationChain(org.id);
  if (!first.ok || first.count !== count) throw new Error(`bench chain did not verify: ${JSON.stringify(first)}`);

  const runs = { read: [] as number[], hash: [] as number[], verify: [] as number[] };
  for (let r = 0; r < ROUNDS; r++) {
    runs.read.push(await time(readOnly));
    runs.hash.push(
      await time(() => {
        const v = verifyChain(rowsInMemory);
        if (!v.ok) throw new Error("in-memory verify failed");
      }),
    );
    runs.verify.push(
      await time(async () => {
        const v = await verifyOrganisationChain(org.id);
        if (!v.ok) throw new Error("verify failed");
      }),
    );
  }
  const read = median(runs.read), hash = median(runs.hash), verify = median(runs.verify);
  const rate = (ms: number) => Math.round((count / ms) * 1000).toLocaleString("en-US");
  const [{ size }] = await admin`select pg_size_pretty(pg_total_relation_size('custody_events')) as size`;

  console.log(`custody chain verification from PostgreSQL, ${count.toLocaleString("en-US")} events (Node ${process.version}, page ${VERIFY_PAGE_SIZE}, median of ${ROUNDS})`);
  console.log(`  stored in ${(insertMs / 1000).toFixed(1)} s (${rate(insertMs)} events/s, batches of ${INSERT_BATCH}); custody_events now ${size}`);
  console.log(`  read only   keyset pages, rows mapped     ${(read / 1000).toFixed(2).padStart(7)} s  ${rate(read).padStart(9)} events/s`);
  console.log(`  hash only   verifyChain on loaded rows    ${(hash / 1000).toFixed(2).padStart(7)} s  ${rate(hash).padStart(9)} events/s`);
  console.log(`  verify      verifyOrganisationChain       ${(verify / 1000).toFixed(2).padStart(7)} s  ${rate(verify).padStart(9)} events/s`);
  console.log(`  ratio verify / (read + hash) = ${(verify / (read + hash)).toFixed(2)}x   (verified ${first.count}, head #${first.ok ? first.headSeq : "-"})`);

  // the app's role cannot remove events (append-only): the schema owner does, triggers off briefly
  await admin.begin(async (sql) => {
    await sql`alter table custody_events disable trigger user`;
    await sql`delete from custody_events where organisation_id = ${org.id}`;
    await sql`alter table custody_events enable trigger user`;
    await sql`delete from organisations where id = ${org.id}`;
  });
  await admin.end();
  await closeDb();
  if (inserted !== count) throw new Error("insert count mismatch");
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
