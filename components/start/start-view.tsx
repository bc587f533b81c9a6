"use client";
// The start page's body: one card per kind of thing that needs attention (only the kinds the role may
// see), each with its count and its first few items, every item a link to where it is handled. The
// numbers refresh every REFRESH_MS without a reload (react-query polling /api/attention); the server
// renders the first answer so nothing flickers on arrival.
// Embed: <StartView initial={await listAttention(member)} greeting="…" />.
import Link from "next/link";
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import type { Attention, AttentionGroup, AttentionKind } from "@/lib/attention/list-attention";

/** How often the numbers are asked for again, in milliseconds (ours: fresh enough for a crew, light on the server). */
export const REFRESH_MS = 15_000;

const GROUP_TEXT: Record<AttentionKind, { title: string; none: string; mark: string; tone: "bad" | "warn" | "calm"; more?: { href: string; label: string } }> = {
  recordings_failed: {
    title: "Recordings that failed processing",
    none: "No recording has failed.",
    mark: "✕",
    tone: "bad",
  },
  recordings_processing: {
    title: "Recordings still processing",
    none: "Nothing is waiting or processing.",
    mark: "◔",
    tone: "calm",
  },
  findings_unreported: {
    title: "Findings not yet in a report",
    none: "Every finding is in a report.",
    mark: "◆",
    tone: "warn",
    more: { href: "/jobs", label: "All jobs" },
  },
  reports_awaiting_approval: {
    title: "Reports waiting for approval",
    none: "No report is waiting for approval.",
    mark: "✎",
    tone: "warn",
    more: { href: "/jobs", label: "All jobs" },
  },
  shares_expiring: {
    title: "Share links expiring within 7 days",
    none: "No share link expires this week.",
    mark: "◷",
    tone: "warn",
    more: { href: "/custody", label: "Custody log" },
  },
  flights_without_recording: {
    title: "Flights with no recording",
    none: "Every flown flight has a recording.",
    mark: "↑",
    tone: "calm",
    more: { href: "/flights", label: "All flights" },
  },
};

const ORDER: AttentionKind[] = ["recordings_failed", "reports_awaiting_approval", "findings_unreported", "shares_expiring", "flights_without_recording", "recordings_processing"];

const timeOf = (iso: string) => `${iso.slice(11, 19)} UTC`;

function GroupCard({ group }: { group: AttentionGroup }) {
  const text = GROUP_TEXT[group.kind];
  const active = group.count > 0;
  const border = !active ? "border-line" : text.tone === "bad" ? "border-2 border-bad" : text.tone === "warn" ? "border-2 border-warn" : "border-2 border-lake";
  const headingId = `attention-${group.kind}-title`;
  return (
    <section aria-labelledby={headingId} data-testid={`attention-${group.kind}`} className={`flex min-w-0 flex-col gap-3 rounded-lg ${border} bg-paper p-4`}>
      <div className="flex items-start gap-3">
        <span className="font-mono text-3xl font-semibold tabular leading-none" data-testid="attention-count">
          {group.count.toLocaleString("en-US")}
        </span>
        <h2 id={headingId} className="font-semibold leading-snug">
          <span aria-hidden className="mr-1">
            {text.mark}
          </span>
          {text.title}
        </h2>
      </div>
      {!active ? (
        <p className="text-sm text-ink-2">{text.none}</p>
      ) : (
        <ul className="flex flex-col divide-y divide-line/70 text-sm">
          {group.items.map((item) => (
            <li key={item.id}>
              <Link href={item.href} className="flex flex-col gap-0.5 rounded-md px-1 py-2 hover:bg-paper-2 focus-visible:bg-paper-2">
                <span className="break-words font-medium text-lake underline-offset-2 hover:underline">{item.title}</span>
                <span className="text-xs text-ink-2">
                  {item.detail}
                  {item.title !== item.jobTitle && !item.title.includes(item.jobTitle) ? ` · ${item.jobTitle}` : ""}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
      {active && group.count > group.items.length && (
        <p className="text-xs text-ink-2">
          and {(group.count - group.items.length).toLocaleString("en-US")} more
          {text.more && (
            <>
              {" · "}
              <Link href={text.more.href} className="text-lake underline">
                {text.more.label}
              </Link>
            </>
          )}
        </p>
      )}
    </section>
  );
}

export function StartView({ initial }: { initial: Attention }) {
  const query = useQuery({
    queryKey: ["attention"],
    queryFn: () => fetchJson<Attention>("/api/attention"),
    initialData: initial,
    refetchInterval: REFRESH_MS,
    refetchIntervalInBackground: false,
  });
  const data = query.data;
  const groups = [...data.groups].sort((a, b) => ORDER.indexOf(a.kind) - ORDER.indexOf(b.kind));
  const open = groups.reduce((n, g) => n + g.count, 0);

  return (
    <div className="flex flex-col gap-4">
      <p className="text-sm text-ink-2" aria-live="polite" data-testid="attention-updated">
        {query.isFetching ? "Checking…" : `As of ${timeOf(data.generatedAt)}`} · updates every {REFRESH_MS / 1000} s
        {query.isError && <span className="ml-2 text-bad">Could not refresh: {(query.error as Error).message}. The numbers shown may be old.</span>}
      </p>
      {groups.length === 0 ? (
        <p className="rounded-lg border border-dashed border-line px-6 py-10 text-center text-sm text-ink-2">Nothing on this page applies to your role. Open the jobs list to see the work shared with you.</p>
      ) : (
        <>
          {open === 0 && (
            <p role="status" className="rounded-md border border-good px-3 py-2 text-sm" data-testid="attention-clear">
              <span aria-hidden>✓ </span>Nothing needs attention right now.
            </p>
          )}
          <div className="grid grid-cols-1 gap-4 md:grid-cols-2 xl:grid-cols-3">
            {groups.map((g) => (
              <GroupCard key={g.kind} group={g} />
            ))}
          </div>
        </>
      )}
    </div>
  );
}

export function StartViewLoading() {
  return (
    <div className="grid grid-cols-1 gap-4 md:grid-cols-2 xl:grid-cols-3" aria-label="Loading what needs attention" role="status">
      {[0, 1, 2].map((i) => (
        <div key={i} className="h-40 animate-pulse rounded-lg bg-paper-2" />
      ))}
    </div>
  );
}
