import { execFileSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { canonicalSerialize } from "@/lib/custody/canonical-serialize";
import { chainHash, GENESIS_HASH } from "@/lib/custody/chain-hash";
import { linkCustodyEvent } from "@/lib/custody/link-custody-event";
import { verifyChain, verifyChainStream, type ChainVerification } from "@/lib/custody/verify-chain";

interface TestEvent {
  id: string;
  organisationId: string;
  occurredAt: Date;
  actorId: string | null;
  action: string;
  subjectId: string;
  details: Record<string, unknown> | null;
  prevHash: string;
  hash: string;
}

function buildChain(count: number): TestEvent[] {
  const events: TestEvent[] = [];
  let previous: string | null = null;
  for (let i = 0; i < count; i++) {
    const event: TestEvent = linkCustodyEvent(previous, {
      id: `evt-${String(i).padStart(4, "0")}`,
      organisationId: "org-test",
      occurredAt: new Date(Date.UTC(2025, 0, 1, 8, 0, i)),
      actorId: i % 3 === 0 ? null : `member-${i % 5}`,
      action: ["recording.ingested", "recording.viewed", "share.opened"][i % 3],
      subjectId: `rec-${i % 7}`,
      details: i % 2 === 0 ? { bytes: 1000 + i, sha256: "ab".repeat(32) } : null,
    });
    events.push(event);
    previous = event.hash;
  }
  return events;
}

const broken = (r: ChainVerification) => (r.ok ? null : { brokenAt: r.brokenAt, eventId: r.eventId, reason: r.reason });

describe("chainHash", () => {
  it("is SHA-256 over prevHash + '\\n' + canonical, checked against GNU coreutils sha256sum", () => {
    // sha256sum is an implementation independent of Node's OpenSSL binding.
    const canonical = canonicalSerialize({ id: "evt-1", note: "pier 3 — crack" });
    for (const prev of [null, "3f".repeat(32)]) {
      const input = `${prev ?? GENESIS_HASH}\n${canonical}`;
      const reference = execFileSync("sha256sum", { input: Buffer.from(input, "utf8") }).toString().split(" ")[0];
      expect(chainHash(prev, canonical)).toBe(reference);
    }
  });

  it("treats null as the genesis hash of 64 zeros and refuses malformed previous hashes", () => {
    expect(chainHash(null, "{}")).toBe(chainHash("0".repeat(64), "{}"));
    expect(() => chainHash("ABC", "{}")).toThrow(TypeError);
    expect(() => chainHash("F".repeat(64), "{}")).toThrow(TypeError);
  });
});

describe("verifyChain", () => {
  it("accepts an intact chain and reports its count and head", () => {
    const events = buildChain(50);
    expect(verifyChain(events)).toEqual({ ok: true, count: 50, headHash: events[49].hash });
    expect(verifyChain([])).toEqual({ ok: true, count: 0, headHash: GENESIS_HASH });
  });

  it("accepts a stored null prevHash for the first event", () => {
    const events = buildChain(3);
    expect(verifyChain([{ ...events[0], prevHash: null as unknown as string }, ...events.slice(1)]).ok).toBe(true);
  });

  it.each([0, 1, 17, 49])("an event altered after sealing is caught at exactly its index (%i)", (k) => {
    const events = buildChain(50);
    events[k] = { ...events[k], details: { bytes: 1, sha256: "cd".repeat(32) } };
    expect(broken(verifyChain(events))).toEqual({ brokenAt: k, eventId: events[k].id, reason: "hash-mismatch" });
  });

  it("a changed timestamp by one millisecond is caught", () => {
    const events = buildChain(10);
    events[4] = { ...events[4], occurredAt: new Date(events[4].occurredAt.getTime() + 1) };
    expect(broken(verifyChain(events))).toEqual({ brokenAt: 4, eventId: "evt-0004", reason: "hash-mismatch" });
  });

  it.each([0, 1, 25, 48])("a removed event is caught where the gap is (%i)", (k) => {
    const events = buildChain(50);
    events.splice(k, 1);
    expect(broken(verifyChain(events))).toEqual({ brokenAt: k, eventId: events[k].id, reason: "prev-mismatch" });
  });

  it("removing the last event is not visible inside the chain, only against a head kept elsewhere", () => {
    const events = buildChain(10);
    const result = verifyChain(events.slice(0, 9));
    expect(result.ok).toBe(true);
    expect(result.ok && result.headHash).not.toBe(events[9].hash);
  });

  it("reordered events are caught at the first moved position", () => {
    const events = buildChain(30);
    [events[12], events[13]] = [events[13], events[12]];
    expect(broken(verifyChain(events))).toEqual({ brokenAt: 12, eventId: "evt-0013", reason: "prev-mismatch" });
  });

  it("an inserted forged event is caught at its position", () => {
    const events = buildChain(20);
    const { prevHash: _p, hash: _h, ...payload } = events[8];
    const forged = linkCustodyEvent(events[7].hash, { ...payload, id: "evt-forged" });
    events.splice(8, 0, forged);
    // The forgery itself links correctly to its predecessor; its successor no longer does.
    expect(broken(verifyChain(events))).toEqual({ brokenAt: 9, eventId: "evt-0008", reason: "prev-mismatch" });
  });

  it("an altered event re-sealed by the forger breaks at its successor", () => {
    const events = buildChain(20);
    const { prevHash: _p, hash: _h, ...payload } = events[5];
    events[5] = linkCustodyEvent(events[4].hash, { ...payload, action: "recording.deleted" });
    expect(broken(verifyChain(events))).toEqual({ brokenAt: 6, eventId: "evt-0006", reason: "prev-mismatch" });
  });

  it("a first event that does not start from genesis is caught at 0", () => {
    const events = buildChain(5);
    const { prevHash: _p, hash: _h, ...payload } = events[0];
    events[0] = linkCustodyEvent("1".repeat(64), payload);
    expect(broken(verifyChain(events))).toEqual({ brokenAt: 0, eventId: "evt-0000", reason: "prev-mismatch" });
  });

  it("names the FIRST break when there are several", () => {
    const events = buildChain(40);
    events[30] = { ...events[30], action: "x" };
    events[10] = { ...events[10], action: "y" };
    events.splice(20, 1);
    expect(broken(verifyChain(events))).toEqual({ brokenAt: 10, eventId: "evt-0010", reason: "hash-mismatch" });
  });

  it("verifies a later segment given the hash before it", () => {
    const events = buildChain(30);
    expect(verifyChain(events.slice(10), { previousHash: events[9].hash, startIndex: 10 })).toEqual({ ok: true, count: 20, headHash: events[29].hash });
    const tampered = events.slice(10);
    tampered[5] = { ...tampered[5], subjectId: "rec-other" };
    expect(broken(verifyChain(tampered, { previousHash: events[9].hash, startIndex: 10 }))).toEqual({ brokenAt: 15, eventId: "evt-0015", reason: "hash-mismatch" });
  });
});

describe("verifyChainStream", () => {
  async function* inBatches<T>(items: T[], size: number, pulled: { batches: number; closed: boolean }) {
    try {
      for (let i = 0; i < items.length; i += size) {
        pulled.batches++;
        yield items.slice(i, i + size);
      }
    } finally {
      pulled.closed = true;
    }
  }

  it("gives the same answers fed in batches of any size", async () => {
    const intact = buildChain(101);
    const tampered = buildChain(101);
    tampered[64] = { ...tampered[64], actorId: "member-x" };
    for (const size of [1, 2, 7, 50, 101, 500]) {
      const state = { batches: 0, closed: false };
      expect(await verifyChainStream(inBatches(intact, size, state))).toEqual(verifyChain(intact));
      expect(await verifyChainStream(inBatches(tampered, size, { batches: 0, closed: false }))).toEqual(verifyChain(tampered));
    }
    expect(broken(verifyChain(tampered))).toEqual({ brokenAt: 64, eventId: "evt-0064", reason: "hash-mismatch" });
  });

  it("stops reading at the first break and closes the source", async () => {
    const events = buildChain(100);
    events[15] = { ...events[15], action: "tampered" };
    const state = { batches: 0, closed: false };
    const result = await verifyChainStream(inBatches(events, 10, state));
    expect(broken(result)).toEqual({ brokenAt: 15, eventId: "evt-0015", reason: "hash-mismatch" });
    expect(state).toEqual({ batches: 2, closed: true });
  });

  it("accepts single events as well as batches", async () => {
    const events = buildChain(12);
    async function* oneByOne() {
      yield* events;
    }
    expect(await verifyChainStream(oneByOne())).toEqual({ ok: true, count: 12, headHash: events[11].hash });
  });
});
