"use client";
// A link to a job's custody log (its own page, /custody/jobs/:id) with the number of events and the
// newest one, instead of the whole log on the job's page.
// Embed: <CustodyLogLink jobId={id} /> (custody.read).
import { countPhrase } from "@/components/ui/count-phrase";
import Link from "next/link";
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import type { CustodyListItem } from "@/lib/custody/list-custody-events";
import { custodyEventLabel, describeCustodySubject } from "./custody-event-labels";

export function CustodyLogLink({ jobId }: { jobId: string }) {
  const latest = useQuery({
    queryKey: ["custody", `jobId=${jobId}&pageSize=1`],
    queryFn: () => fetchJson<{ items: CustodyListItem[]; total: number; totalIsLowerBound?: boolean }>(`/api/custody?jobId=${jobId}&pageSize=1`),
  });
  const newest = latest.data?.items[0];
  return (
    <div className="flex flex-col gap-1 rounded-md border border-line p-4" data-testid="custody-log-link">
      <Link href={`/custody/jobs/${jobId}`} className="font-medium text-lake underline">
        Open the job&apos;s custody log and share links
      </Link>
      <p className="text-sm text-ink-2">
        {latest.isLoading
          ? "Counting events…"
          : latest.error
            ? latest.error.message
            : latest.data && latest.data.total > 0 && newest
              ? `${countPhrase(latest.data, "event", "events")}; the newest: ${custodyEventLabel(newest.eventType)}, ${describeCustodySubject(newest)}, ${newest.occurredAt.slice(0, 16).replace("T", " ")} UTC.`
              : "No custody events yet."}
      </p>
    </div>
  );
}
