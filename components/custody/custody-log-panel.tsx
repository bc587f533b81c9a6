"use client";
// The custody log of a recording, a job or the whole organisation: every event in chain order with
// who, when, from where and its hash; a "Verify chain" action that recomputes the organisation's
// whole chain and names the first broken event; exports as CSV and JSON.
// Embed: <CustodyLogPanel recordingId={id} /> or <CustodyLogPanel jobId={id} /> (custody.read).
import { useState } from "react";
import { useMutation, useQuery } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { HashText } from "@/components/ui/hash-text";
import { EmptyState } from "@/components/ui/empty-state";
import { fetchJson } from "@/components/fetch-json";
import { custodyEventLabel } from "./custody-event-labels";

type EventRow = {
  id: string;
  seq: number;
  eventType: string;
  evidenceType: string;
  evidenceId: string | null;
  originalSha256: string | null;
  actorUserId: string | null;
  actorName: string | null;
  actorRole: string | null;
  actorShareLinkId: string | null;
  occurredAt: string;
  clientAddress: string | null;
  userAgent: string | null;
  storageLocation: string | null;
  purpose: string | null;
  tool: string | null;
  outputSha256: string | null;
  hash: string;
};
type Anchor = { checkpoints: number; number: number; headSeq: number; signedAt: string; stampedAt: string | null; keyId: string; unanchored: number; oldestUnanchoredAt: string | null; stale: boolean } | null;
type CheckpointRef = { number: number; headSeq: number; signedAt: string; stampedAt: string | null };
type Verification =
  | { ok: true; count: number; headHash: string; headSeq: number; verifiedAt: string; anchor: Anchor }
  | { ok: false; count: number; reason: string; explanation: string; brokenAt: { seq: number; id: string; eventType: string; evidenceType: string; evidenceId: string | null; occurredAt: string } | null; checkpoint?: CheckpointRef; verifiedAt: string };

const PAGE_SIZE = 100;
const when = (iso: string) => iso.replace("T", " ").replace("Z", " UTC");

function actorOf(e: EventRow): string {
  if (e.actorShareLinkId) return "Client, through a share link";
  if (e.actorName) return `${e.actorName}${e.actorRole ? ` (${e.actorRole})` : ""}`;
  if (e.actorUserId) return `Former member${e.actorRole ? ` (${e.actorRole})` : ""}`;
  return "Cairn (system)";
}

export function CustodyLogPanel({ recordingId, jobId }: { recordingId?: string; jobId?: string }) {
  const [page, setPage] = useState(1);
  const filter = recordingId ? `recordingId=${recordingId}` : jobId ? `jobId=${jobId}` : "";
  const list = useQuery({
    queryKey: ["custody", filter, page],
    queryFn: () => fetchJson<{ items: EventRow[]; total: number }>(`/api/custody?${filter}&page=${page}&pageSize=${PAGE_SIZE}`),
  });
  const verify = useMutation({ mutationFn: () => fetchJson<Verification>("/api/custody/verify", { method: "POST" }) });
  const result = verify.data;
  const brokenId = result && !result.ok ? (result.brokenAt?.id ?? null) : null;
  const pages = Math.max(1, Math.ceil((list.data?.total ?? 0) / PAGE_SIZE));

  return (
    <div className="flex flex-col gap-3" data-testid="custody-log">
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
        <p className="text-xs text-ink-2">Verifying recomputes every hash of the organisation&apos;s log, not only the events listed here.</p>
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

      {list.isLoading && <p className="text-sm text-ink-2">Loading the custody log…</p>}
      {list.error && <p role="alert" className="text-sm text-bad">{list.error.message}</p>}
      {list.data && list.data.total === 0 && <EmptyState title="No custody events yet" next="Uploading, processing, viewing, sharing and deleting evidence each add an event here." />}
      {list.data && list.data.total > 0 && (
        <div className="overflow-x-auto rounded-md border border-line">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Custody events in chain order</caption>
            <thead className="bg-paper-2 text-xs uppercase tracking-wide text-ink-2">
              <tr>
                <th className="px-3 py-2">#</th>
                <th className="px-3 py-2">When (UTC)</th>
                <th className="px-3 py-2">Event</th>
                <th className="px-3 py-2">Who, from where</th>
                <th className="px-3 py-2">Purpose and detail</th>
                <th className="px-3 py-2">Hash</th>
              </tr>
            </thead>
            <tbody>
              {list.data.items.map((e) => (
                <tr key={e.id} className={`border-t border-line align-top ${e.id === brokenId ? "bg-bad-soft" : ""}`} data-event-type={e.eventType}>
                  <td className="px-3 py-2 font-mono tabular">
                    {e.seq}
                    {e.id === brokenId && <span className="ml-1 font-sans text-xs font-semibold text-bad">Broken here</span>}
                  </td>
                  <td className="whitespace-nowrap px-3 py-2 font-mono text-xs tabular">{when(e.occurredAt)}</td>
                  <td className="px-3 py-2">
                    <span className="font-medium">{custodyEventLabel(e.eventType)}</span>
                    <span className="block text-xs text-ink-2">
                      {e.evidenceType}
                      {e.evidenceId ? ` ${e.evidenceId.slice(0, 8)}` : ""}
                    </span>
                  </td>
                  <td className="px-3 py-2">
                    {actorOf(e)}
                    {(e.clientAddress || e.userAgent) && (
                      <span className="block max-w-[16rem] truncate text-xs text-ink-2" title={e.userAgent ?? undefined}>
                        {e.clientAddress ?? "address unknown"}
                        {e.userAgent ? ` · ${e.userAgent}` : ""}
                      </span>
                    )}
                  </td>
                  <td className="px-3 py-2">
                    {e.purpose ?? <span className="text-ink-2">—</span>}
                    {e.tool && <span className="block font-mono text-xs text-ink-2">{e.tool}</span>}
                    {e.originalSha256 && (
                      <span className="block text-xs">
                        {e.evidenceType === "report" ? "report PDF" : "original"} SHA-256 <HashText value={e.originalSha256} />
                      </span>
                    )}
                  </td>
                  <td className="px-3 py-2">
                    <HashText value={e.hash} label="Event hash" />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {pages > 1 && (
        <div className="flex items-center gap-2 text-sm">
          <Button variant="secondary" disabled={page <= 1} onClick={() => setPage(page - 1)}>
            Earlier
          </Button>
          <span>
            Page {page} of {pages}
          </span>
          <Button variant="secondary" disabled={page >= pages} onClick={() => setPage(page + 1)}>
            Later
          </Button>
        </div>
      )}
    </div>
  );
}
