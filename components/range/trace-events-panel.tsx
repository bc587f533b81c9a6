"use client";
// The link events found in the flight's signal traces, each one click away from a range check.
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { formatMomentSec } from "@/components/trace/trace-summary";
import { LinkEventMark } from "./link-event-mark";
import { LINK_EVENT_META } from "@/lib/range-checks/link-events";
import type { TraceEventItem, TraceEventsAnswer } from "./range-check-types";

export function TraceEventsPanel({
  flightId,
  canWrite,
  onLog,
}: {
  flightId: string;
  canWrite: boolean;
  onLog: (event: TraceEventItem, prefill: TraceEventsAnswer["prefill"]) => void;
}) {
  const query = useQuery({
    queryKey: ["trace-events", flightId],
    queryFn: () => fetchJson<TraceEventsAnswer>(`/api/range-checks/trace-events?flightId=${flightId}`),
  });
  const data = query.data;
  return (
    <section aria-labelledby="trace-events-title" className="flex flex-col gap-2">
      <h2 id="trace-events-title" className="text-lg font-semibold">
        Link events in the signal trace
      </h2>
      <p className="max-w-3xl text-sm text-ink-2">
        Where the flight&apos;s recordings show the picture breaking up or the video lost, each change is listed here. “Log range check” opens the form with the event and its time
        filled in from the trace and the height prefilled from the flight; you add where the aircraft was.
      </p>
      {query.isError ? (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          Could not load the signal trace: {(query.error as Error).message}
        </p>
      ) : !data ? (
        <div className="h-16 animate-pulse rounded-md bg-paper-2" role="status" aria-label="Loading" />
      ) : data.items.length === 0 ? (
        <p className="rounded-md border border-dashed border-line px-4 py-4 text-sm text-ink-2">
          {data.tracedRecordings === 0
            ? "No signal trace for this flight yet: traces appear once its recordings have been processed. You can still log range checks by hand."
            : "The signal traces of this flight show intact video throughout: no link event to log."}
        </p>
      ) : (
        <ul className="divide-y divide-line/60 rounded-md border border-line" data-testid="trace-events">
          {data.items.map((ev) => (
            <li key={`${ev.recordingId}-${ev.intervalIndex}`} className="flex flex-wrap items-center gap-3 px-3 py-2 text-sm">
              <LinkEventMark event={ev.event} />
              <span className="font-mono tabular">
                at {formatMomentSec(ev.atSec)} <span className="text-ink-2">frame {ev.atFrame}</span>
              </span>
              <span className="text-ink-2">
                of <span className="font-mono">{ev.recordingName}</span>
                {ev.state !== "intact" && <> · {ev.state === "lost" ? "video lost" : "picture breaking up"} for {ev.durationSec.toFixed(3)} s</>}
              </span>
              <span className="ml-auto">
                {ev.rangeCheckId ? (
                  <span className="inline-flex items-center gap-1 text-ink-2">
                    <span aria-hidden>✓</span> Logged
                  </span>
                ) : canWrite ? (
                  <button
                    type="button"
                    onClick={() => onLog(ev, data.prefill)}
                    className="min-h-10 rounded-md border border-lake px-3 font-medium text-lake hover:bg-lake-soft"
                    aria-label={`Log range check: ${LINK_EVENT_META[ev.event].label} at ${formatMomentSec(ev.atSec)} of ${ev.recordingName}`}
                  >
                    Log range check
                  </button>
                ) : (
                  <span className="text-ink-2">Not logged</span>
                )}
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
