// Seeds one invented organisation at scale into the database of DATABASE_URL (a test database, never
// production): by default 10,000 recordings over 100 jobs and 1,000 flights, 100,000 findings and
// 1,000,000 custody events. The work tree rows are made by PostgreSQL itself (INSERT ... SELECT over
// generate_series, one statement per table). The custody events form a valid hash chain
// (lib/custody/chain-hash.ts over lib/custody/canonical-serialize.ts, the same functions the
// verifier uses), computed here in batches and written with multi-row INSERTs, so verification can be
// benchmarked on them.
//
//   npx tsx bench/seed-scale.ts [--recordings 10000] [--findings 100000] [--custody 1000000]
// prints the organisation's id and owner's user id as JSON on its last line.
import { randomUUID } from "node:crypto";
import { getTableColumns } from "drizzle-orm";
import postgresClient from "postgres";
import type postgres from "postgres";
import { custodyEvents } from "@/db/schema";
import { canonicalSerialize } from "@/lib/custody/canonical-serialize";
import { chainHash, GENESIS_HASH } from "@/lib/custody/chain-hash";

export type ScaleCounts = { recordings: number; findings: number; custodyEvents: number; jobs?: number; flightsPerJob?: number };
export type ScaleSeed = { organisationId: string; ownerUserId: string; jobIds: string[]; flightIds: string[]; recordingIds: string[] };

const CUSTODY_BATCH = 2000; // 21 columns x 2,000 rows stays under PostgreSQL's 65,535 bind parameters

/** Seeds a new organisation with `counts` rows; returns its ids (recordingIds: a sample of 100). */
export async function seedScale(sql: postgres.Sql, counts: ScaleCounts, onProgress: (line: string) => void = () => {}): Promise<ScaleSeed> {
  const tag = randomUUID().slice(0, 8);
  const jobCount = counts.jobs ?? Math.max(1, Math.min(100, Math.ceil(counts.recordings / 100)));
  const flightsPerJob = counts.flightsPerJob ?? 10;
  const [org] = await sql`insert into organisations (name, slug) values (${`Scale crew ${tag}`}, ${`scale-crew-${tag}`}) returning id`;
  const organisationId: string = org.id;
  const [user] = await sql`insert into users (email, name) values (${`owner-${tag}@scale.invalid`}, ${`Scale owner ${tag}`}) returning id`;
  const ownerUserId: string = user.id;
  await sql`insert into memberships (organisation_id, user_id, role) values (${organisationId}, ${ownerUserId}, 'owner')`;
  const [client] = await sql`insert into clients (organisation_id, name) values (${organisationId}, ${`Scale client ${tag}`}) returning id`;
  const [site] = await sql`insert into sites (organisation_id, client_id, name) values (${organisationId}, ${client.id}, ${`Scale site ${tag}`}) returning id`;

  const jobs = await sql`
    insert into jobs (organisation_id, site_id, title, due_date, created_at)
    select ${organisationId}, ${site.id}, 'Scale job ' || g, date '2027-01-01' + (g % 300), now() - g * interval '1 minute'
    from generate_series(1, ${jobCount}) g
    returning id`;
  const jobIds = jobs.map((j) => j.id as string);
  const flights = await sql`
    insert into flights (organisation_id, job_id, flown_on, aircraft, created_at)
    select ${organisationId}, j.id, date '2026-01-01' + (g % 365), 'Scale airframe', now() - g * interval '1 second'
    from unnest(${sql.array(jobIds)}::uuid[]) j(id), generate_series(1, ${flightsPerJob}) g
    returning id, job_id`;
  const flightIds = flights.map((f) => f.id as string);
  const flightJobs = flights.map((f) => f.job_id as string);
  onProgress(`${jobIds.length} jobs, ${flightIds.length} flights`);

  // recording g goes to flight g mod F, at place g div F in it
  await sql`
    insert into recordings (organisation_id, job_id, flight_id, original_name, size_bytes, kind, sha256, sequence_index, state, duration_sec, created_at)
    select ${organisationId}, f.job_id, f.id, 'SCALE_' || lpad(g::text, 6, '0') || '.264', 1000000 + g, 'raw_h264', lpad(to_hex(g), 64, '0'),
           g / ${flightIds.length}, 'ready', 30 + (g % 600), now() - g * interval '1 second'
    from generate_series(0, ${counts.recordings - 1}) g
    join unnest(${sql.array(flightIds)}::uuid[], ${sql.array(flightJobs)}::uuid[]) with ordinality f(id, job_id, n) on f.n = (g % ${flightIds.length}) + 1`;
  onProgress(`${counts.recordings} recordings`);

  if (counts.findings > 0) {
    // finding g goes to recording g mod R (by the recordings' order of creation)
    await sql`
      with r as (select id, job_id, row_number() over (order by created_at desc, id) - 1 as n from recordings where organisation_id = ${organisationId})
      insert into findings (organisation_id, job_id, recording_id, start_frame, start_sec, severity, note, created_at)
      select ${organisationId}, r.job_id, r.id, (g / ${counts.recordings}) * 25, (g / ${counts.recordings})::float8, 'minor', 'Scale finding ' || g, now() - g * interval '1 millisecond'
      from generate_series(0, ${counts.findings - 1}) g join r on r.n = g % ${counts.recordings}`;
    onProgress(`${counts.findings} findings`);
  }
  await sql`analyze recordings`;
  await sql`analyze findings`;
  await sql`analyze flights`;
  await sql`analyze jobs`;

  const recordingIds = (await sql`select id from recordings where organisation_id = ${organisationId} order by created_at desc limit 100`).map((r) => r.id as string);
  if (counts.custodyEvents > 0) await seedCustodyChain(sql, organisationId, jobIds, recordingIds, counts.custodyEvents, onProgress);
  return { organisationId, ownerUserId, jobIds, flightIds, recordingIds };
}

/**
 * Appends `count` custody events to the organisation's (empty) chain: each event's hash covers every
 * stored column but prev_hash and hash, named and typed as the application reads them back
 * (lib/custody/custody-payload.ts), so verifyOrganisationChain accepts the chain.
 */
export async function seedCustodyChain(sql: postgres.Sql, organisationId: string, jobIds: string[], evidenceIds: string[], count: number, onProgress: (line: string) => void = () => {}) {
  const columns = Object.entries(getTableColumns(custodyEvents)).map(([key, col]) => ({ key, name: col.name }));
  let prev = GENESIS_HASH;
  const start = Date.UTC(2026, 0, 1);
  for (let first = 1; first <= count; first += CUSTODY_BATCH) {
    const rows: Record<string, unknown>[] = [];
    for (let seq = first; seq < first + CUSTODY_BATCH && seq <= count; seq++) {
      const payload: Record<string, unknown> = Object.fromEntries(columns.filter((c) => c.key !== "prevHash" && c.key !== "hash").map((c) => [c.key, null]));
      Object.assign(payload, {
        id: randomUUID(),
        organisationId,
        seq,
        eventType: seq % 10 === 0 ? "viewed" : "downloaded",
        evidenceType: "recording",
        evidenceId: evidenceIds[seq % evidenceIds.length],
        jobId: jobIds[seq % jobIds.length],
        occurredAt: new Date(start + seq * 1000),
        purpose: "Scale seed",
      });
      const hash = chainHash(prev, canonicalSerialize(payload));
      const row: Record<string, unknown> = {};
      for (const c of columns) row[c.name] = c.key === "prevHash" ? prev : c.key === "hash" ? hash : payload[c.key];
      rows.push(row);
      prev = hash;
    }
    await sql`insert into custody_events ${sql(rows as Record<string, postgres.SerializableParameter>[], ...columns.map((c) => c.name))}`;
    if ((first - 1) % 100_000 === 0) onProgress(`custody events: ${first - 1 + rows.length} of ${count}`);
  }
  await sql`analyze custody_events`;
}

function flag(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
}

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("Set DATABASE_URL to a test database (its owner role, so ANALYZE runs)");
  const sql = postgresClient(url, { max: 2, onnotice: () => {} });
  const t0 = performance.now();
  const seed = await seedScale(sql, { recordings: flag("recordings", 10_000), findings: flag("findings", 100_000), custodyEvents: flag("custody", 1_000_000) }, (line) =>
    console.error(`${((performance.now() - t0) / 1000).toFixed(1)} s  ${line}`),
  );
  console.error(`seeded in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  console.log(JSON.stringify({ organisationId: seed.organisationId, ownerUserId: seed.ownerUserId }));
  await sql.end();
}

if (process.argv[1]?.endsWith("seed-scale.ts")) void main();
