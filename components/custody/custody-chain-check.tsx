"use client";
// "Verify chain" and the exports of a custody log: verifying recomputes the organisation's whole chain
// and names the first broken event; the exports download the trail (or the whole log) as CSV or JSON.
// Embed: <CustodyChainCheck filter="jobId=…" onBroken={(id) => …} /> (custody.read).
import { useEffect } from "react";
import { useMutation } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { HashText } from "@/components/ui/hash-text";
import { fetchJson } from "@/components/fetch-json";
import { custodyEventLabel } from "./custody-event-labels";

type Anchor = { checkpoints: number; number: number; headSeq: number; signedAt: string; stampedAt: string | null; keyId: string; unanchored: number; oldestUnanchoredAt: string | null; stale: boolean } | null;
type CheckpointRef = { number: number; headSeq: number; signedAt: string; stampedAt: string | null };
export type Verification =
  | { ok: true; count: number; headHash: string; headSeq: number; verifiedAt: string; anchor: Anchor }
  | { ok: false; count: number; reason: string; explanation: string; brokenAt: { seq: number; id: string; eventType: string; evidenceType: string; evidenceId: string | null; occurredAt: string } | null; checkpoint?: CheckpointRef; verifiedAt: string };

const when = (iso: string) => iso.replace("T", " ").replace("Z", " UTC");

export function CustodyChainCheck({ filter, onBroken }: { filter: string; onBroken?: (eventId: string | null) => void }) {
  const verify = useMutation({ mutationFn: () => fetchJson<Verification>("/api/custody/verify", { method: "POST" }) });
  const result = verify.data;
  const brokenId = result && !result.ok ? (result.brokenAt?.id ?? null) : null;
  useEffect(() => onBroken?.(brokenId), [brokenId, onBroken]);
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-2">
        <Button onClick={() => verify.mutate()} busy={verify.isPending}>
          Verify chain
        </Button>
        <a className="inline-flex min-h-10 items-center rounded-md border border-line px-3 text-sm hover:bg-paper-2" href={`/api/custody/export?format=csv${filter ? `&${filter}` : ""}`} download>
          Export CSV
        </a>
        <a className="inline-flex min-h-10 items-center rounded-md border border-line px-3 text-sm hover:bg-paper-2" href={`/api/custody/export?format=json${filter ? `&${filter}` : ""}`} download>
          Export JSON
        </a>
        <p className="text-xs text-ink-2">Verifying recomputes every hash of the organisation&apos;s log, not only the events listed here. Exports hold every event of this log in chain order.</p>
      </div>
      {verify.error && (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          {verify.error.message}
        </p>
      )}
      {result?.ok && (
        <div role="status" data-testid="chain-verified" className="rounded-md border border-good px-3 py-2 text-sm">
          <p className="font-medium">
            <span aria-hidden>✓ </span>Chain intact: all {result.count.toLocaleString("en-US")} events recompute to their stored hashes.
          </p>
          <p className="mt-1 text-xs text-ink-2">
            Head event #{result.headSeq}, hash <HashText value={result.headHash} label="Head hash" /> · verified {when(result.verifiedAt)}
          </p>
          <p className="mt-1" data-testid="chain-anchor">
            {result.anchor
              ? `Complete up to checkpoint ${result.anchor.number} (event #${result.anchor.headSeq}), signed ${when(result.anchor.signedAt)}${result.anchor.stampedAt ? `, time-stamped ${when(result.anchor.stampedAt)}` : ", not time-stamped"}; ${result.anchor.unanchored === 0 ? "every event is anchored" : `${result.anchor.unanchored.toLocaleString("en-US")} event${result.anchor.unanchored === 1 ? " after it is" : "s after it are"} not yet anchored`}.`
              : "No checkpoint yet: the order of events is proven, that none was removed from the end is not yet."}
          </p>
          {result.anchor?.stale && result.anchor.oldestUnanchoredAt && (
            <p className="mt-1 font-medium text-bad" data-testid="chain-anchor-stale">
              Checkpoints have not kept up: an event from {when(result.anchor.oldestUnanchoredAt)} is still waiting for one. Either the worker is not making checkpoints, or the newest checkpoint was removed.
            </p>
          )}
        </div>
      )}
      {result && !result.ok && result.checkpoint && (
        <div role="alert" data-testid="chain-broken" className="rounded-md border-2 border-bad bg-bad-soft px-3 py-2 text-sm">
          <p className="font-medium">
            <span aria-hidden>✕ </span>Not complete: checkpoint {result.checkpoint.number} (event #{result.checkpoint.headSeq}, signed {when(result.checkpoint.signedAt)}) does not hold.
          </p>
          <p className="mt-1">{result.explanation}.</p>
          {result.brokenAt && <p className="mt-1 font-mono text-xs">event #{result.brokenAt.seq}, id {result.brokenAt.id}</p>}
        </div>
      )}
      {result && !result.ok && !result.checkpoint && result.brokenAt && (
        <div role="alert" data-testid="chain-broken" className="rounded-md border-2 border-bad bg-bad-soft px-3 py-2 text-sm">
          <p className="font-medium">
            <span aria-hidden>✕ </span>Chain broken at event #{result.brokenAt.seq}: {custodyEventLabel(result.brokenAt.eventType)} ({result.brokenAt.evidenceType}) of {when(result.brokenAt.occurredAt)}.
          </p>
          <p className="mt-1">The first {result.count.toLocaleString("en-US")} events verify; this one does not: {result.explanation}.</p>
          <p className="mt-1 font-mono text-xs">event id {result.brokenAt.id}</p>
        </div>
      )}

    </div>
  );
}
