// The exact text a custody checkpoint signs and time-stamps: canonical JSON (RFC 8785, as the events
// themselves: canonical-serialize.ts) of the organisation, the checkpoint number, the chain head (its
// position, event id and hash) and the previous checkpoint's statement digest, which chains the
// checkpoints so none can be taken out of the middle. The time-stamp token stamps SHA-256 of these
// UTF-8 bytes, so `openssl ts -verify -data statement.json` checks it from outside.
import { createHash } from "node:crypto";
import { canonicalSerialize } from "./canonical-serialize";

export const CHECKPOINT_STATEMENT_KIND = "cairn.custody-checkpoint.v1";

export type CheckpointFields = {
  organisationId: string;
  number: number;
  headSeq: number;
  headEventId: string;
  headHash: string;
  previousStatementSha256: string;
  signedAt: Date;
};

export function checkpointStatement(c: CheckpointFields): string {
  return canonicalSerialize({
    kind: CHECKPOINT_STATEMENT_KIND,
    organisationId: c.organisationId,
    number: c.number,
    headSeq: c.headSeq,
    headEventId: c.headEventId,
    headHash: c.headHash,
    previousStatementSha256: c.previousStatementSha256,
    signedAt: c.signedAt,
  });
}

export const statementSha256 = (statement: string) => createHash("sha256").update(statement, "utf8").digest();
