// Makes custody checkpoints: for an organisation whose log has grown since its last checkpoint, a
// statement of the chain head (checkpoint-statement.ts), signed with the installation's Ed25519 key
// (checkpoint-key.ts) and time-stamped by an RFC 3161 authority (request-timestamp.ts). Run by the
// worker (job "custody-checkpoints", every few minutes) and on demand (`npm run custody:checkpoint`),
// never on a request's path. Two workers at once: the unique (organisation, number) index lets one win.
import "server-only";
import { desc, eq, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { custodyCheckpoints, custodyEvents } from "@/db/schema";
import type { CustodyCheckpoint } from "@/db/schema/types";
import { GENESIS_HASH } from "./chain-hash";
import { custodySigner, signStatement } from "./checkpoint-key";
import { checkpointStatement, statementSha256 } from "./checkpoint-statement";
import { checkpointSettings } from "./checkpoint-settings";
import { requestTimestamp } from "./request-timestamp";

export type MakeCheckpointOutcome = { outcome: "made"; checkpoint: CustodyCheckpoint } | { outcome: "up-to-date" | "raced" };

export const previousDigestOf = (c: CustodyCheckpoint | undefined) => (c ? statementSha256(checkpointStatement(c)).toString("hex") : GENESIS_HASH);

export async function makeCheckpoint(organisationId: string, options: { tsaUrl?: string | null } = {}): Promise<MakeCheckpointOutcome> {
  const tsaUrl = options.tsaUrl === undefined ? checkpointSettings().tsaUrl : options.tsaUrl;
  const [last] = await db()
    .select()
    .from(custodyCheckpoints)
    .where(eq(custodyCheckpoints.organisationId, organisationId))
    .orderBy(desc(custodyCheckpoints.number))
    .limit(1);
  const [head] = await db()
    .select({ seq: custodyEvents.seq, id: custodyEvents.id, hash: custodyEvents.hash })
    .from(custodyEvents)
    .where(eq(custodyEvents.organisationId, organisationId))
    .orderBy(desc(custodyEvents.seq))
    .limit(1);
  if (!head || (last && head.seq <= last.headSeq)) return { outcome: "up-to-date" };

  const signer = custodySigner();
  const fields = {
    organisationId,
    number: (last?.number ?? 0) + 1,
    headSeq: head.seq,
    headEventId: head.id,
    headHash: head.hash,
    previousStatementSha256: previousDigestOf(last),
    // the column keeps milliseconds: sign exactly what will be read back
    signedAt: new Date(Math.floor(Date.now())),
  };
  const statement = checkpointStatement(fields);
  const signature = signStatement(signer, statement);
  const stamp = tsaUrl ? await requestTimestamp(tsaUrl, statementSha256(statement)) : null;

  const [row] = await db()
    .insert(custodyCheckpoints)
    .values({
      ...fields,
      publicKey: signer.publicKey,
      signature,
      tsaUrl,
      tsaResponse: stamp ? stamp.response.toString("base64") : null,
      stampedAt: stamp ? stamp.info.genTime : null,
    })
    .onConflictDoNothing()
    .returning();
  return row ? { outcome: "made", checkpoint: row } : { outcome: "raced" };
}

/** Checkpoints every organisation whose log has events after its last checkpoint. */
export async function makeDueCheckpoints(options: { tsaUrl?: string | null } = {}): Promise<{ made: number; failed: { organisationId: string; error: string }[] }> {
  // each max() is one step down an index ((organisation_id, seq) and (organisation_id, number))
  const due = await db().execute<{ organisation_id: string }>(sql`
    select o.id as organisation_id from organisations o
    where (select max(e.seq) from custody_events e where e.organisation_id = o.id)
        > coalesce((select c.head_seq from custody_checkpoints c where c.organisation_id = o.id order by c.number desc limit 1), 0)`);
  let made = 0;
  const failed: { organisationId: string; error: string }[] = [];
  for (const { organisation_id: organisationId } of due) {
    try {
      if ((await makeCheckpoint(organisationId, options)).outcome === "made") made++;
    } catch (err) {
      failed.push({ organisationId, error: (err as Error).message });
    }
  }
  return { made, failed };
}

/** The organisation's checkpoints in order (few: one per interval with new events). */
export function listCheckpoints(organisationId: string, database: DbOrTx = db()) {
  return database.select().from(custodyCheckpoints).where(eq(custodyCheckpoints.organisationId, organisationId)).orderBy(custodyCheckpoints.number);
}
