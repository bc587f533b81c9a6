// Verifies an organisation's whole custody chain as stored, reading it from Postgres in pages
// (keyset on seq) and feeding the pure ChainVerifier, so a log of millions of events never sits in
// memory at once. Names the first broken event by its position in the chain (seq) and id.
// With custody checkpoints (make-checkpoint.ts) it also proves completeness: each checkpoint's signed
// head must be the stored event at that position, and the log must reach the last checkpoint's head;
// events after the last checkpoint are reported as not yet anchored.
import "server-only";
import { and, asc, eq, gt } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { custodyEvents } from "@/db/schema";
import type { CustodyEvent } from "@/db/schema/types";
import { ChainVerifier, type ChainBreakReason } from "./verify-chain";
import { custodySigner } from "./checkpoint-key";
import { checkpointSettings } from "./checkpoint-settings";
import { listCheckpoints } from "./make-checkpoint";
import { anchorOf, checkCheckpoints, checkpointRef, describeCheckpointBreak, type Anchor, type CheckpointBreakReason, type CheckpointRef } from "./verify-checkpoints";

export const VERIFY_PAGE_SIZE = 5000;

export type BrokenEvent = { seq: number; id: string; eventType: string; evidenceType: string; evidenceId: string | null; occurredAt: Date };

export type OrganisationChainVerification =
  | { ok: true; count: number; headHash: string; headSeq: number; verifiedAt: Date; anchor: Anchor }
  | { ok: false; count: number; reason: ChainBreakReason | "seq-gap"; brokenAt: BrokenEvent; verifiedAt: Date; checkpoint?: undefined }
  | { ok: false; count: number; reason: CheckpointBreakReason; brokenAt: BrokenEvent | null; checkpoint: CheckpointRef; verifiedAt: Date };

const REASON_WORDS: Record<ChainBreakReason | "seq-gap", string> = {
  "hash-mismatch": "its content no longer matches the hash sealed when it was recorded (altered after the fact)",
  "prev-mismatch": "it does not link to the event before it (an event before it was removed, inserted or altered and re-sealed)",
  "seq-gap": "its position number does not follow the event before it (an event is missing)",
};
export const describeBreak = (reason: ChainBreakReason | "seq-gap" | CheckpointBreakReason) =>
  reason in REASON_WORDS ? REASON_WORDS[reason as ChainBreakReason] : describeCheckpointBreak(reason as CheckpointBreakReason);

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
  const database = options.database ?? db();
  const checkpoints = await listCheckpoints(organisationId, database);
  const checkpointAt = new Map(checkpoints.map((c) => [c.headSeq, c]));
  let mismatch: { event: CustodyEvent; checkpoint: (typeof checkpoints)[number] } | null = null;
  const lastSigned = checkpoints.length ? checkpoints[checkpoints.length - 1].headSeq : 0;
  let oldestUnanchoredAt: Date | null = null;
  let expectedSeq = 1;
  let count = 0;
  let head: CustodyEvent | null = null;
  const brokenEvent = (e: CustodyEvent): BrokenEvent => ({ seq: e.seq, id: e.id, eventType: e.eventType, evidenceType: e.evidenceType, evidenceId: e.evidenceId, occurredAt: e.occurredAt });
  const broken = (e: CustodyEvent, reason: ChainBreakReason | "seq-gap"): OrganisationChainVerification => ({
    ok: false,
    count,
    reason,
    brokenAt: brokenEvent(e),
    verifiedAt: new Date(),
  });
  for await (const page of pages(organisationId, options.pageSize ?? VERIFY_PAGE_SIZE, database)) {
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
      if (event.seq === lastSigned + 1) oldestUnanchoredAt = event.occurredAt;
      const signed = checkpointAt.get(event.seq);
      if (signed && !mismatch && (signed.headHash !== event.hash || signed.headEventId !== event.id)) mismatch = { event, checkpoint: signed };
    }
  }
  const r = verifier.result();
  if (!r.ok) throw new Error("unreachable: a failed push returns above");
  const headSeq = head?.seq ?? 0;
  const checkpointFailure = (reason: CheckpointBreakReason, checkpoint: CheckpointRef, at: CustodyEvent | null): OrganisationChainVerification => ({
    ok: false,
    count,
    reason,
    brokenAt: at ? brokenEvent(at) : null,
    checkpoint,
    verifiedAt: new Date(),
  });
  if (checkpoints.length) {
    // the checkpoints themselves first: a forged checkpoint must not vouch for anything
    const problem = checkCheckpoints(checkpoints, [custodySigner().publicKey, ...checkpointSettings().previousPublicKeys]);
    if (problem) return checkpointFailure(problem.reason, problem.checkpoint, null);
    if (mismatch) return checkpointFailure("checkpoint-mismatch", checkpointRef(mismatch.checkpoint), mismatch.event);
    const last = checkpoints[checkpoints.length - 1];
    if (headSeq < last.headSeq) return checkpointFailure("truncated", checkpointRef(last), head);
  }
  return { ok: true, count, headHash: r.headHash, headSeq, verifiedAt: new Date(), anchor: anchorOf(checkpoints, headSeq, oldestUnanchoredAt, checkpointSettings().everyMs) };
}
