// The lists' page queries use indexes (PostgreSQL's EXPLAIN on the exact SQL and parameters each list
// function sends, read through db/client.ts's query observer), on an organisation seeded by
// bench/seed-scale.ts with 10,000 recordings over 1,000 flights and 20,000 findings, analysed, so the
// planner chooses freely between a sequential scan and an index; for the lists whose tables stay small
// here (clients, sites, share links, playback views) with enable_seqscan=off, which proves an index
// path exists for their order (PostgreSQL documentation, "Planner Method Configuration").
// Then custody verification reads a 20,000-event chain made by the same seeder in pages: every query
// it sends is a keyset page of at most the page size (bounded memory), and the chain verifies.
process.env.CAIRN_OBSERVE_QUERIES = "1";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { closeDb, observeQueries, sqlClient } from "@/db/client";
import { listRecordings, recordingListQuery } from "@/lib/recordings/list-recordings";
import { listFindingViews } from "@/lib/findings/finding-view";
import { listJobs } from "@/lib/filing/jobs";
import { listFlights } from "@/lib/filing/flights";
import { listClients } from "@/lib/filing/clients";
import { listSites } from "@/lib/filing/sites";
import { listJobShareLinks } from "@/lib/sharing/list-share-links";
import { listPlaybackViews } from "@/lib/playback-analytics/list-playback-views";
import { jobListQuery, flightListQuery, siteListQuery } from "@/lib/validation/list-filters";
import { listQuery } from "@/lib/api/with-org";
import { COUNT_CAP } from "@/lib/api/keyset";
import { listCustodyEvents } from "@/lib/custody/list-custody-events";
import { verifyOrganisationChain } from "@/lib/custody/verify-organisation-chain";
import { eq } from "drizzle-orm";
import { findings, recordings } from "@/db/schema";
import { closeRedis } from "@/lib/queue/redis";
import { closeQueues } from "@/lib/queue/jobs";
import { seedScale, type ScaleSeed } from "@/bench/seed-scale";
import { TEST_ENV } from "@/tests/support/test-env";

type PlanNode = { "Node Type": string; "Relation Name"?: string; "Index Name"?: string; Plans?: PlanNode[] };
let seed: ScaleSeed;
let admin: postgres.Sql;

/** countUpTo's query: a count over the list's rows under a LIMIT (lib/api/keyset.ts) */
const CAPPED_COUNT = /^select count\(\*\) from \(/i;

function nodes(plan: PlanNode): PlanNode[] {
  return [plan, ...(plan.Plans ?? []).flatMap(nodes)];
}

/** The statements `call` sends, as postgres.js reports them. */
async function sentBy(call: () => Promise<unknown>): Promise<{ query: string; parameters: unknown[] }[]> {
  const sent: { query: string; parameters: unknown[] }[] = [];
  const stop = observeQueries((query, parameters) => sent.push({ query, parameters }));
  try {
    await call();
  } finally {
    stop();
  }
  return sent;
}

/** Runs `call`, returns the plan of the one query it sent that reads `table` with a LIMIT (the page). */
async function planOfPage(table: string, call: () => Promise<unknown>, seqscanOff = false): Promise<PlanNode[]> {
  const sent = await sentBy(call);
  // the page query is the one with a LIMIT that is not the capped count beside it
  const page = sent.filter((q) => new RegExp(`from "${table}"`).test(q.query) && /\blimit\b/i.test(q.query) && !CAPPED_COUNT.test(q.query));
  expect(page, `one page query on ${table}`).toHaveLength(1);
  const rows = await sqlClient().begin(async (tx) => {
    if (seqscanOff) await tx`set local enable_seqscan = off`;
    return tx.unsafe(`explain (format json) ${page[0].query}`, page[0].parameters as postgres.ParameterOrJSON<never>[]);
  });
  const plan = (rows[0] as unknown as { "QUERY PLAN": { Plan: PlanNode }[] })["QUERY PLAN"][0].Plan;
  return nodes(plan);
}

/** The table is read through one of `indexes` (an index scan, or a bitmap scan built from it), never sequentially. */
function expectIndexOn(plan: PlanNode[], table: string, indexes: string[]) {
  const onTable = plan.filter((n) => n["Relation Name"] === table);
  expect(onTable.length, `a scan of ${table}`).toBeGreaterThan(0);
  expect(onTable.map((n) => n["Node Type"]), `no sequential scan of ${table}`).not.toContain("Seq Scan");
  const throughIndex = plan.some((n) => indexes.includes(n["Index Name"] ?? ""));
  expect(throughIndex, `${table} read through ${indexes.join(" or ")}: ${JSON.stringify(onTable)}`).toBe(true);
}

beforeAll(async () => {
  // the schema owner seeds, so ANALYZE runs (the app role may not analyse tables it does not own)
  admin = postgres(TEST_ENV.MIGRATION_DATABASE_URL, { max: 2, onnotice: () => {} });
  seed = await seedScale(admin, { recordings: 10_000, findings: 20_000, custodyEvents: 20_000, jobs: 100, flightsPerJob: 10 });
  // what autovacuum does to a settled database: the visibility map lets the capped counts read their
  // partial indexes alone (index-only scans), which the planner then prefers
  await admin`vacuum (analyze) recordings, findings`;
}, 240_000);

afterAll(async () => {
  await admin?.end();
  await closeQueues();
  await closeRedis();
  await closeDb();
});

describe("the page queries of the lists read an index (10,000 recordings, analysed)", () => {
  const org = () => seed.organisationId;

  it("recordings of the organisation, first page and a later page by cursor", async () => {
    const q = recordingListQuery.parse({ pageSize: "50" });
    let next: string | null = null;
    const first = await planOfPage("recordings", async () => {
      next = (await listRecordings(org(), q)).nextCursor;
    });
    expectIndexOn(first, "recordings", ["recordings_org_seq_idx"]);
    expect(next).not.toBeNull();
    const later = await planOfPage("recordings", () => listRecordings(org(), recordingListQuery.parse({ pageSize: "50", cursor: next! })));
    expectIndexOn(later, "recordings", ["recordings_org_seq_idx"]);
  });

  it("recordings of a flight and of a job", async () => {
    expectIndexOn(await planOfPage("recordings", () => listRecordings(org(), recordingListQuery.parse({ flightId: seed.flightIds[3] }))), "recordings", ["recordings_org_flight_idx"]);
    expectIndexOn(await planOfPage("recordings", () => listRecordings(org(), recordingListQuery.parse({ jobId: seed.jobIds[7] }))), "recordings", ["recordings_org_job_idx", "recordings_org_flight_idx"]);
  });

  it("findings of a recording", async () => {
    const plan = await planOfPage("findings", () => listFindingViews(org(), eq(findings.recordingId, seed.recordingIds[5]), { pageSize: 200 }));
    expectIndexOn(plan, "findings", ["findings_org_recording_frame_idx", "findings_org_recording_idx", "findings_org_recording_live_idx"]);
  });

  it("findings of a job walk the job's recordings in order, not every recording", async () => {
    // asked the way GET /api/findings?jobId= asks: by the recording's job
    const plan = await planOfPage("findings", () => listFindingViews(org(), eq(recordings.jobId, seed.jobIds[4]), { pageSize: 50 }));
    expectIndexOn(plan, "recordings", ["recordings_org_job_idx"]);
    expectIndexOn(plan, "findings", ["findings_org_recording_frame_idx", "findings_org_recording_idx", "findings_org_recording_live_idx"]);
  });

  it("jobs and flights in their default orders", async () => {
    expectIndexOn(await planOfPage("jobs", () => listJobs(org(), jobListQuery.parse({})), true), "jobs", ["jobs_org_due_idx"]);
    expectIndexOn(await planOfPage("flights", () => listFlights(org(), flightListQuery.parse({}))), "flights", ["flights_org_date_idx"]);
    expectIndexOn(await planOfPage("flights", () => listFlights(org(), flightListQuery.parse({ jobId: seed.jobIds[2] })), true), "flights", ["flights_org_job_idx"]);
  });

  it("clients, sites, share links and playback views have an index path for their order (enable_seqscan=off)", async () => {
    expectIndexOn(await planOfPage("clients", () => listClients(org(), listQuery.parse({})), true), "clients", ["clients_org_name_idx"]);
    expectIndexOn(await planOfPage("sites", () => listSites(org(), siteListQuery.parse({})), true), "sites", ["sites_org_name_idx"]);
    expectIndexOn(await planOfPage("share_links", () => listJobShareLinks(org(), seed.jobIds[0], { pageSize: 100 }), true), "share_links", ["share_links_org_job_idx"]);
    expectIndexOn(await planOfPage("playback_views", () => listPlaybackViews(org(), seed.recordingIds[0], { pageSize: 200 }), true), "playback_views", ["playback_views_org_recording_idx"]);
  });
});

describe("list counts stop at the cap (lib/api/keyset.ts COUNT_CAP)", () => {
  /** The count query `call` sent, and its plan. */
  async function countQuery(table: string, call: () => Promise<unknown>) {
    const counts = (await sentBy(call)).filter((q) => CAPPED_COUNT.test(q.query) && new RegExp(`from "${table}"`).test(q.query));
    expect(counts.length, `a count of ${table}`).toBeGreaterThan(0);
    const rows = await sqlClient().unsafe(`explain (format json) ${counts[0].query}`, counts[0].parameters as postgres.ParameterOrJSON<never>[]);
    return nodes((rows[0] as unknown as { "QUERY PLAN": { Plan: PlanNode }[] })["QUERY PLAN"][0].Plan);
  }

  it("10,000 recordings count as at least COUNT_CAP, through a LIMIT; a flight's 10 count exactly", async () => {
    const whole = await listRecordings(seed.organisationId, recordingListQuery.parse({ pageSize: "50" }));
    expect(whole).toMatchObject({ total: COUNT_CAP, totalIsLowerBound: true });
    const plan = await countQuery("recordings", () => listRecordings(seed.organisationId, recordingListQuery.parse({ pageSize: "50" })));
    expect(plan.map((n) => n["Node Type"])).toContain("Limit");
    const oneFlight = await listRecordings(seed.organisationId, recordingListQuery.parse({ flightId: seed.flightIds[3] }));
    expect(oneFlight).toMatchObject({ total: 10, totalIsLowerBound: false });
  });

  it("20,000 custody events and a job's 200 findings", async () => {
    expect(await listCustodyEvents(seed.organisationId, {}, { pageSize: 10 })).toMatchObject({ total: COUNT_CAP, totalIsLowerBound: true });
    const [{ n }] = await admin`select count(*)::int as n from findings where organisation_id = ${seed.organisationId} and job_id = ${seed.jobIds[4]} and deleted_at is null`;
    expect(n).toBeLessThan(COUNT_CAP);
    expect(await listFindingViews(seed.organisationId, eq(recordings.jobId, seed.jobIds[4]), { pageSize: 50 })).toMatchObject({ total: n, totalIsLowerBound: false });
    // the counts walk the live-row partial indexes of migration 0013, not the tables
    expectIndexOn(await countQuery("findings", () => listFindingViews(seed.organisationId, eq(recordings.jobId, seed.jobIds[4]), { pageSize: 50 })), "findings", ["findings_org_recording_live_idx"]);
    expectIndexOn(await countQuery("recordings", () => listRecordings(seed.organisationId, recordingListQuery.parse({ pageSize: "50" }))), "recordings", ["recordings_org_live_idx"]);
  });
});

describe("custody verification streams the chain in pages", () => {
  it("verifies 20,000 seeded events reading at most one page per query", async () => {
    const sent: string[] = [];
    const params: unknown[][] = [];
    const stop = observeQueries((query, parameters) => {
      if (/from "custody_events"/.test(query) && /order by "custody_events"\."seq"/.test(query)) {
        sent.push(query);
        params.push(parameters);
      }
    });
    let result;
    try {
      result = await verifyOrganisationChain(seed.organisationId, { pageSize: 1000 });
    } finally {
      stop();
    }
    expect(result.ok).toBe(true);
    expect(result.count).toBe(20_000);
    // 20 full pages and the empty one that ends the walk; each asks for 1,000 rows at most
    // keyset pages after seq 0, 1000, ..., 20000 (the last one empty ends the walk); postgres.js may
    // report a statement twice (describe, then execute), so the positions are compared as a set
    expect([...new Set(params.map((p) => Number(p[1])))].sort((a, b) => a - b)).toEqual(Array.from({ length: 21 }, (_, i) => i * 1000));
    for (const p of params) expect(Number(p[2])).toBe(1000);
  }, 120_000);
});
