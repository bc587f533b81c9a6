// Appends one event to the organisation's custody chain inside a transaction. A per-organisation
// advisory lock serialises appends, so two requests can never both link to the same previous event.
import "server-only";
import { clientAddress, UNKNOWN_ADDRESS } from "@/lib/http/client-address";
import { randomUUID } from "node:crypto";
import { desc, eq, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { custodyEvents } from "@/db/schema";
import type { Role } from "@/db/schema/types";
import { linkCustodyEvent } from "./link-custody-event";

export const CUSTODY_EVENT_TYPES = [
  "upload",
  "duplicate_upload",
  "processing",
  "derived",
  "view",
  "download",
  "share",
  "share_open",
  "revoke",
  "finding_created",
  "finding_updated",
  "finding_deleted",
  "report_built",
  "report_approved",
  "hold_set",
  "hold_released",
  "deletion_refused",
  "deletion",
  "package_built",
  "disposal_refused",
  "disposal",
  "track_imported",
  "track_aligned",
] as const;
export type CustodyEventType = (typeof CUSTODY_EVENT_TYPES)[number];

export type CustodyInput = {
  organisationId: string;
  eventType: CustodyEventType;
  evidenceType: "recording" | "rendition" | "still" | "finding" | "report" | "share_link" | "job" | "evidence_package" | "track";
  evidenceId?: string | null;
  jobId?: string | null;
  originalSha256?: string | null;
  originalSize?: number | null;
  actor?: { userId?: string | null; role?: Role | null; shareLinkId?: string | null };
  clientAddress?: string | null;
  userAgent?: string | null;
  storageLocation?: string | null;
  purpose?: string | null;
  tool?: string | null;
  toolArgs?: string[] | null;
  outputSha256?: string | null;
  details?: Record<string, unknown> | null;
};

/** Every stored column except the chain fields, all present (null when absent): exactly what is hashed. */
function payloadOf(input: CustodyInput, seq: number) {
  return {
    id: randomUUID(),
    organisationId: input.organisationId,
    seq,
    eventType: input.eventType,
    evidenceType: input.evidenceType,
    evidenceId: input.evidenceId ?? null,
    jobId: input.jobId ?? null,
    originalSha256: input.originalSha256 ?? null,
    originalSize: input.originalSize ?? null,
    actorUserId: input.actor?.userId ?? null,
    actorRole: input.actor?.role ?? null,
    actorShareLinkId: input.actor?.shareLinkId ?? null,
    // the column keeps milliseconds: hash exactly what will be read back
    occurredAt: new Date(Math.floor(Date.now())),
    clientAddress: input.clientAddress ?? null,
    userAgent: input.userAgent ?? null,
    storageLocation: input.storageLocation ?? null,
    purpose: input.purpose ?? null,
    tool: input.tool ?? null,
    toolArgs: input.toolArgs ?? null,
    outputSha256: input.outputSha256 ?? null,
    details: input.details ?? null,
  };
}

export async function recordCustodyEvent(input: CustodyInput, tx?: DbOrTx) {
  const run = async (t: DbOrTx) => {
    await t.execute(sql`select pg_advisory_xact_lock(hashtextextended(${"custody:" + input.organisationId}, 0))`);
    const [last] = await t
      .select({ seq: custodyEvents.seq, hash: custodyEvents.hash })
      .from(custodyEvents)
      .where(eq(custodyEvents.organisationId, input.organisationId))
      .orderBy(desc(custodyEvents.seq))
      .limit(1);
    const sealed = linkCustodyEvent(last?.hash ?? null, payloadOf(input, (last?.seq ?? 0) + 1));
    const [row] = await t.insert(custodyEvents).values(sealed).returning();
    return row;
  };
  return tx ? run(tx) : db().transaction(run);
}

/** Request facts worth keeping with an event: client address and user agent. */
export type RequestFacts = { clientAddress: string | null; userAgent: string | null };

export function requestFacts(req: Request): RequestFacts {
  return factsFromHeaders(req.headers);
}

/** The same from plain headers (server components have headers, not a Request). */
export function factsFromHeaders(h: Headers): RequestFacts {
  // the socket address, or X-Forwarded-For only behind trusted proxies (lib/http/client-address.ts)
  const address = clientAddress(h);
  return {
    clientAddress: address === UNKNOWN_ADDRESS ? null : address,
    userAgent: h.get("user-agent")?.slice(0, 400) ?? null,
  };
}
