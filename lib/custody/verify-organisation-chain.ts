// Verifies an organisation's whole custody chain as stored, reading it from Postgres in pages
// (keyset on seq) and feeding the pure ChainVerifier, so a log of millions of events never sits in
// memory at once. Names the first broken event by its position in the chain (seq) and id.
import { and, asc, eq, gt } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { custodyEvents } from "@/db/schema";
import type { CustodyEvent } from "@/db/schema/types";
import { ChainVerifier, type ChainBreakReason } from "./verify-chain";

export const VERIFY_PAGE_SIZE = 5000;

export type BrokenEvent = { seq: number; id: string; eventType: string; evidenceType: string; evidenceId: string | null; occurredAt: Date };

export type OrganisationChainVerification =
  | { ok: true; count: number; headHash: string; headSeq: number; verifiedAt: Date }
  | { ok: false; count: number; reason: ChainBreakReason | "seq-gap"; brokenAt: BrokenEvent; verifiedAt: Date };

const REASON_WORDS: Record<ChainBreakReason | "seq-gap", string> = {
  "hash-mismatch": "its content no longer matches the hash sealed when it was recorded (altered after the fact)",
  "prev-mismatch": "it does not link to the event before it (an event before it was removed, inserted or altered and re-sealed)",
  "seq-gap": "its position number does not follow the event before it (an event is missing)",
};
export const describeBreak = (reason: ChainBreakReason | "seq-gap") => REASON_WORDS[reason];

async function* pages(organisationId: string, pageSize: number, database: DbOrTx): AsyncGenerator<CustodyEvent[]> {
  const fetchAfter = (after: number) =>
    database
      .select()
      .from(custodyEvents)
      .where(and(eq(custodyEvents.organisationId, organisationId), gt(custodyEvents.seq, after)))
      .orderBy(asc(custodyEvents.seq))
      .limit(pageSize);
  // the next page is asked for before this one is hashed, so the database works while we hash
  let next: Promise<CustodyEvent[]> | null = fetchAfter(0);
  try {
    while (next) {
      const rows: CustodyEvent[] = await next;
      if (rows.length === 0) return;
      next = rows.length < pageSize ? null : fetchAfter(rows[rows.length - 1].seq);
      yield rows;
    }
  } finally {
    // a caller that stops early (a broken chain) leaves a page in flight: never an unhandled rejection
    next?.catch(() => {});
  }
}

export async function verifyOrganisationChain(
  organisationId: string,
  options: { pageSize?: number; database?: DbOrTx } = {},
): Promise<OrganisationChainVerification> {
  const verifier = new ChainVerifier<CustodyEvent>();
  let expectedSeq = 1;
  let count = 0;
  let head: CustodyEvent | null = null;
  const broken = (e: CustodyEvent, reason: ChainBreakReason | "seq-gap"): OrganisationChainVerification => ({
    ok: false,
    count,
    reason,
    brokenAt: { seq: e.seq, id: e.id, eventType: e.eventType, evidenceType: e.evidenceType, evidenceId: e.evidenceId, occurredAt: e.occurredAt },
    verifiedAt: new Date(),
  });
  for await (const page of pages(organisationId, options.pageSize ?? VERIFY_PAGE_SIZE, options.database ?? db())) {
    for (const event of page) {
      if (!verifier.push(event)) {
        const r = verifier.result();
        return broken(event, r.ok ? "hash-mismatch" : r.reason);
      }
      // the hashes already cover seq; this names a missing event by position when the hashes
      // around it were rewritten consistently
      if (event.seq !== expectedSeq) return broken(event, "seq-gap");
      expectedSeq++;
      count++;
      head = event;
    }
  }
  const r = verifier.result();
  if (!r.ok) throw new Error("unreachable: a failed push returns above");
  return { ok: true, count, headHash: r.headHash, headSeq: head?.seq ?? 0, verifiedAt: new Date() };
}
