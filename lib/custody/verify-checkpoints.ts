// Checks an organisation's custody checkpoints on their own (numbering, the digest chain between them,
// the Ed25519 signature under THIS installation's key, and the time-stamp token being for this
// statement), and describes what the chain verification can claim with them. The comparison of each
// checkpoint's head with the stored events happens while the chain is read (verify-organisation-chain.ts).
import type { CustodyCheckpoint } from "@/db/schema/types";
import { keyIdOf, verifyStatement } from "./checkpoint-key";
import { checkpointStatement, statementSha256 } from "./checkpoint-statement";
import { previousDigestOf } from "./make-checkpoint";
import { readTimestampResponse } from "./request-timestamp";

export type CheckpointBreakReason =
  | "checkpoint-missing" // a checkpoint number is skipped or the digest chain between checkpoints is broken
  | "checkpoint-signature" // the signature does not verify, or was made with another key than this installation's
  | "checkpoint-timestamp" // the time-stamp token is not for this statement
  | "checkpoint-mismatch" // the stored event at the checkpoint's head is not the one signed (altered and re-sealed)
  | "truncated"; // the log ends before the head of a signed checkpoint (events removed from the end)

export type CheckpointRef = { number: number; headSeq: number; headEventId: string; signedAt: Date; stampedAt: Date | null };

export const checkpointRef = (c: CustodyCheckpoint): CheckpointRef => ({
  number: c.number,
  headSeq: c.headSeq,
  headEventId: c.headEventId,
  signedAt: c.signedAt,
  stampedAt: c.stampedAt,
});

/** What the checkpoints prove about a chain that verified: complete up to checkpoint N, K events after it. */
export type Anchor = {
  checkpoints: number;
  number: number;
  headSeq: number;
  signedAt: Date;
  stampedAt: Date | null;
  tsaUrl: string | null;
  keyId: string;
  /** events after the last checkpoint: their order is proven, that none was cut from the end is not yet */
  unanchored: number;
  /** the oldest event not yet anchored, when there is one */
  oldestUnanchoredAt: Date | null;
  /**
   * checkpoints have not kept up: an event has waited for one longer than two checkpoint periods. The
   * worker is not making them, or the newest checkpoint was removed (which, with the events after the
   * one before it, the chain alone cannot show).
   */
  stale: boolean;
} | null;

export type CheckpointProblem = { reason: CheckpointBreakReason; checkpoint: CheckpointRef };

/** The first problem among the checkpoints themselves, or null. `trustedKeys`: this installation's public key and earlier ones. */
export function checkCheckpoints(checkpoints: readonly CustodyCheckpoint[], trustedKeys: readonly string[]): CheckpointProblem | null {
  let previous: CustodyCheckpoint | undefined;
  for (const c of checkpoints) {
    const fail = (reason: CheckpointBreakReason): CheckpointProblem => ({ reason, checkpoint: checkpointRef(c) });
    if (c.number !== (previous?.number ?? 0) + 1 || c.previousStatementSha256 !== previousDigestOf(previous) || c.headSeq < (previous?.headSeq ?? 0)) {
      return fail("checkpoint-missing");
    }
    const statement = checkpointStatement(c);
    if (!trustedKeys.includes(c.publicKey) || !verifyStatement(c.publicKey, statement, c.signature)) return fail("checkpoint-signature");
    if (c.tsaResponse) {
      try {
        const info = readTimestampResponse(Buffer.from(c.tsaResponse, "base64"));
        if (info.imprintSha256 !== statementSha256(statement).toString("hex") || info.genTime.getTime() !== c.stampedAt?.getTime()) return fail("checkpoint-timestamp");
      } catch {
        return fail("checkpoint-timestamp");
      }
    } else if (c.stampedAt) return fail("checkpoint-timestamp");
    previous = c;
  }
  return null;
}

export function anchorOf(checkpoints: readonly CustodyCheckpoint[], headSeq: number, oldestUnanchoredAt: Date | null, everyMs: number, now = Date.now()): Anchor {
  const last = checkpoints[checkpoints.length - 1];
  if (!last) return null;
  const unanchored = headSeq - last.headSeq;
  return {
    checkpoints: checkpoints.length,
    number: last.number,
    headSeq: last.headSeq,
    signedAt: last.signedAt,
    stampedAt: last.stampedAt,
    tsaUrl: last.tsaUrl,
    keyId: keyIdOf(last.publicKey),
    unanchored,
    oldestUnanchoredAt: unanchored > 0 ? oldestUnanchoredAt : null,
    stale: unanchored > 0 && oldestUnanchoredAt !== null && now - oldestUnanchoredAt.getTime() > 2 * everyMs,
  };
}

const WORDS: Record<CheckpointBreakReason, string> = {
  "checkpoint-missing": "a signed checkpoint is missing or out of order (checkpoints were removed or rewritten)",
  "checkpoint-signature": "its signature does not verify with this installation's custody key or an earlier one it trusts (the checkpoint was forged or altered)",
  "checkpoint-timestamp": "its time-stamp token is not for this checkpoint (the token was replaced or the checkpoint altered)",
  "checkpoint-mismatch": "the event stored at the checkpoint's head is not the one that was signed (events up to it were altered and the chain re-sealed)",
  truncated: "the log ends before the last event a signed checkpoint covers (events were removed from the end)",
};
export const describeCheckpointBreak = (reason: CheckpointBreakReason) => WORDS[reason];
