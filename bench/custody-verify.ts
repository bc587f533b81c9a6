// Benchmark: verifying the custody hash chain of 100,000 events held in memory.
// Run: npx tsx bench/custody-verify.ts [eventCount]
//
// Printed side by side, on the same events:
//   baseline A  SHA-256 of the precomputed canonical strings, unchained (the hashing floor)
//   baseline B  canonical serialization + SHA-256, unchained (what any per-event digest costs)
//   verify      verifyChain: serialization + chained SHA-256 + the prev/hash comparisons
// The ratios verify/A and verify/B show what canonicalization and chaining add on top.
import { createHash } from "node:crypto";
import { canonicalSerialize } from "@/lib/custody/canonical-serialize";
import { linkCustodyEvent } from "@/lib/custody/link-custody-event";
import { custodyPayloadOf } from "@/lib/custody/custody-payload";
import { verifyChain } from "@/lib/custody/verify-chain";

const count = Number(process.argv[2] ?? 100_000);
const ROUNDS = 5;

const ACTIONS = ["recording.ingested", "recording.viewed", "rendition.created", "finding.created", "share.opened", "report.built"];

type BenchEvent = ReturnType<typeof linkCustodyEvent<{ id: string } & Record<string, unknown>>>;

function buildEvents(n: number): BenchEvent[] {
  const events: BenchEvent[] = [];
  let previous: string | null = null;
  const t0 = Date.UTC(2025, 0, 1);
  for (let i = 0; i < n; i++) {
    const event: BenchEvent = linkCustodyEvent<{ id: string } & Record<string, unknown>>(previous, {
      id: `0190a6b2-${String(i).padStart(8, "0")}-7000-8000-000000000000`,
      organisationId: "0190a6b2-0000-7000-8000-00000000org1",
      occurredAt: new Date(t0 + i * 1500),
      actorId: i % 4 === 0 ? null : `0190a6b2-0000-7000-8000-0000000mem${i % 9}`,
      action: ACTIONS[i % ACTIONS.length],
      subjectType: i % 2 === 0 ? "recording" : "finding",
      subjectId: `0190a6b2-0000-7000-8000-${String(i % 5000).padStart(12, "0")}`,
      details: i % 3 === 0 ? { bytes: 734_003_200 + i, sha256: "9f".repeat(32), fileName: `flight-${i % 40}.264` } : { ip: "192.0.2.10" },
    });
    events.push(event);
    previous = event.hash;
  }
  return events;
}

function time(fn: () => unknown): number {
  const start = process.hrtime.bigint();
  fn();
  return Number(process.hrtime.bigint() - start) / 1e6;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

const buildStart = process.hrtime.bigint();
const events = buildEvents(count);
const buildTotalMs = Number(process.hrtime.bigint() - buildStart) / 1e6;
const canonicals = events.map((e) => canonicalSerialize(custodyPayloadOf(e)));
const canonicalBytes = canonicals.reduce((sum, s) => sum + Buffer.byteLength(s, "utf8"), 0);

// Baselines produce hex digests as verifyChain does, and keep them observable so no work is elided.
let sink = 0;
const hashOnly = () => {
  for (const s of canonicals) sink ^= createHash("sha256").update(s, "utf8").digest("hex").charCodeAt(0);
};
const serializeAndHash = () => {
  for (const e of events) sink ^= createHash("sha256").update(canonicalSerialize(custodyPayloadOf(e)), "utf8").digest("hex").charCodeAt(0);
};
let verified = 0;
const verify = () => {
  const result = verifyChain(events);
  if (!result.ok) throw new Error(`bench chain broken at ${result.brokenAt}`);
  verified = result.count;
};

// One warm-up pass each, then alternate so drift on a shared machine hits all three alike.
hashOnly();
serializeAndHash();
verify();
const runs = { a: [] as number[], b: [] as number[], v: [] as number[] };
for (let r = 0; r < ROUNDS; r++) {
  runs.a.push(time(hashOnly));
  runs.b.push(time(serializeAndHash));
  runs.v.push(time(verify));
}
const a = median(runs.a), b = median(runs.b), v = median(runs.v);
const rate = (ms: number) => Math.round((count / ms) * 1000).toLocaleString("en-US");

console.log(`custody chain verification, ${count.toLocaleString("en-US")} events in memory (Node ${process.version}, median of ${ROUNDS})`);
console.log(`  built and sealed in ${buildTotalMs.toFixed(0)} ms; canonical payloads average ${(canonicalBytes / count).toFixed(0)} bytes`);
console.log(`  baseline A  hash precomputed canonical strings, unchained  ${a.toFixed(1).padStart(8)} ms  ${rate(a).padStart(11)} events/s`);
console.log(`  baseline B  serialize + hash, unchained                     ${b.toFixed(1).padStart(8)} ms  ${rate(b).padStart(11)} events/s`);
console.log(`  verifyChain serialize + chained hash + compare              ${v.toFixed(1).padStart(8)} ms  ${rate(v).padStart(11)} events/s`);
console.log(`  ratio verify / A = ${(v / a).toFixed(2)}x   verify / B = ${(v / b).toFixed(2)}x   (verified ${verified}, sink ${sink & 1})`);
