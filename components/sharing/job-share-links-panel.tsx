"use client";
// A job's share links: who got what, until when, in what state, how often opened and downloaded;
// "Share with client" to create one (the address is shown once: Cairn keeps only its hash) and
// "Revoke" to withdraw one from the next request on.
// Embed: <JobShareLinksPanel jobId={id} canManage={can(role, "shares.manage")} />.
import { useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import type { ColumnDef } from "@tanstack/react-table";
import { EmptyState } from "@/components/ui/empty-state";
import { DataTable } from "@/components/ui/resource-table";
import { fetchJson } from "@/components/fetch-json";
import { SHARE_STATUS_LABELS, type ShareLinkStatus } from "@/lib/sharing/share-link-status";
import { SHARE_SCOPE_LABELS, type ShareScope } from "@/lib/sharing/share-link-input";
import { ShareLinkForm } from "./share-link-form";

export type ShareLinkListItem = {
  id: string;
  label: string;
  scope: ShareScope;
  recipientEmails: string[];
  expiresAt: string;
  revokedAt: string | null;
  allowOriginals: boolean;
  hasPasscode: boolean;
  lockedUntil: string | null;
  createdAt: string;
  createdByName: string | null;
  status: ShareLinkStatus;
  opens: number;
  downloads: number;
  lastOpenedAt: string | null;
};

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : "—");

function StatusWord({ status }: { status: ShareLinkStatus }) {
  const s = SHARE_STATUS_LABELS[status];
  return (
    <span title={s.meaning} className={`inline-flex items-center gap-1 rounded border px-2 py-0.5 text-xs font-semibold ${status === "active" ? "border-lake text-lake" : "border-ink-2 text-ink-2"}`} data-status={status}>
      <span aria-hidden>{s.symbol}</span>
      {s.label}
    </span>
  );
}

function RevokeButton({ link, jobId }: { link: ShareLinkListItem; jobId: string }) {
  const qc = useQueryClient();
  const [confirming, setConfirming] = useState(false);
  const revoke = useMutation({
    mutationFn: () => fetchJson(`/api/share-links/${link.id}`, { method: "DELETE" }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["share-links", jobId] }),
  });
  if (link.status !== "active") return null;
  if (!confirming)
    return (
      <Button variant="secondary" onClick={() => setConfirming(true)} aria-label={`Revoke ${link.label}`}>
        Revoke
      </Button>
    );
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <Button variant="danger" busy={revoke.isPending} onClick={() => revoke.mutate()}>
        Revoke now
      </Button>
      <Button variant="quiet" onClick={() => setConfirming(false)}>
        Keep
      </Button>
      {revoke.error && <span role="alert" className="text-xs text-bad">{revoke.error.message}</span>}
    </span>
  );
}

function columns(jobId: string): ColumnDef<ShareLinkListItem, unknown>[] {
  return [
    {
      id: "link",
      header: "Link",
      cell: ({ row: { original: l } }) => (
        <>
          <span className="font-medium">{l.label}</span>
          <span className="block text-xs text-ink-2">{l.recipientEmails.length ? `To ${l.recipientEmails.join(", ")}` : "No recipients mailed"}</span>
          <span className="block text-xs text-ink-2">
            {l.hasPasscode ? "Passcode" : "No passcode"} · {l.allowOriginals ? "originals downloadable" : "no originals"}
            {l.createdByName ? ` · by ${l.createdByName}, ${day(l.createdAt)}` : ""}
          </span>
        </>
      ),
    },
    { id: "shares", header: "Shares", meta: { hideBelow: "md" }, cell: (c) => SHARE_SCOPE_LABELS[c.row.original.scope].label },
    {
      id: "state",
      header: "State",
      cell: ({ row: { original: l } }) => (
        <>
          <StatusWord status={l.status} />
          {l.lockedUntil && new Date(l.lockedUntil) > new Date() && <span className="mt-1 block text-xs text-warn">Passcode locked after wrong tries</span>}
        </>
      ),
    },
    {
      id: "expires",
      header: "Expires",
      meta: { hideBelow: "sm", className: "font-mono text-xs whitespace-nowrap" },
      cell: (c) => (c.row.original.revokedAt ? `revoked ${day(c.row.original.revokedAt)}` : day(c.row.original.expiresAt)),
    },
    {
      id: "opens",
      header: "Opens",
      meta: { hideBelow: "lg", className: "text-right font-mono" },
      cell: (c) => <span data-testid="share-opens">{c.row.original.opens}</span>,
    },
    {
      id: "downloads",
      header: "Downloads",
      meta: { hideBelow: "lg", className: "text-right font-mono" },
      cell: (c) => <span data-testid="share-downloads">{c.row.original.downloads}</span>,
    },
    {
      id: "lastOpened",
      header: "Last opened",
      meta: { hideBelow: "lg", className: "font-mono text-xs whitespace-nowrap" },
      cell: (c) => (c.row.original.lastOpenedAt ? `${c.row.original.lastOpenedAt.slice(0, 16).replace("T", " ")} UTC` : "never"),
    },
    {
      id: "actions",
      header: () => <span className="sr-only">Revoke</span>,
      meta: { label: "Revoke", className: "text-right" },
      cell: (c) => <RevokeButton link={c.row.original} jobId={jobId} />,
    },
  ];
}

export function JobShareLinksPanel({ jobId, canManage }: { jobId: string; canManage: boolean }) {
  const [creating, setCreating] = useState(false);
  const list = useQuery({
    queryKey: ["share-links", jobId],
    queryFn: () => fetchJson<{ items: ShareLinkListItem[]; total: number }>(`/api/share-links?jobId=${jobId}`),
    enabled: canManage,
    refetchInterval: 30_000,
  });
  if (!canManage) return <p className="text-sm text-ink-2">Owners share evidence with clients and see who opened it.</p>;
  return (
    <div className="flex flex-col gap-3" data-testid="share-links">
      <div className="flex flex-wrap items-center gap-2">
        <p className="text-sm text-ink-2">A share link opens chosen evidence to a client without an account. Every opening and download is logged.</p>
        <Button className="ml-auto" onClick={() => setCreating(true)}>
          Share with client
        </Button>
      </div>
      {list.error && <p role="alert" className="text-sm text-bad">{list.error.message}</p>}
      {list.data && list.data.total === 0 && <EmptyState title="Nothing shared yet" next="Share a recording, chosen findings, a report version or the whole job with the client." />}
      {list.data && list.data.total > 0 && (
        <DataTable<ShareLinkListItem>
          data={list.data.items}
          columns={columns(jobId)}
          caption="Share links of this job"
          getRowId={(l) => l.id}
          rowAttributes={() => ({ "data-testid": "share-link-row" })}
        />
      )}
      {creating && <ShareLinkForm jobId={jobId} onClose={() => setCreating(false)} />}
    </div>
  );
}
