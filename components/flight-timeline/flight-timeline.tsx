"use client";
// One flight as one timeline across its files, with the gaps between files marked, the link summary
// for the whole flight, and (for pilots) the order of the files to correct. Embeddable: give it a
// flight id; the open recording is highlighted when given.
import { useState } from "react";
import Link from "next/link";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { Button } from "@/components/ui/button";
import { formatMomentSec, TraceSummaryLine } from "@/components/trace/trace-summary";
import { GAP_TOLERANCE_SEC, type FlightTimeline, type TimelineGap, type TimelineSegment } from "@/lib/flight-timeline/build-flight-timeline";
import { layoutFlightTimeline } from "./layout-flight-timeline";
import { formatClockTime } from "@/lib/timecode/format-clock-time";

// the API's answer: the server's timeline (no dates in it) and the flight it belongs to
type Segment = TimelineSegment;
type Gap = TimelineGap;
type Timeline = FlightTimeline & { flightId: string };

const STATE_WORDS: Record<Segment["state"], string> = { waiting: "Waiting", processing: "Processing", ready: "Ready", failed: "Failed" };

// a gap longer than the tolerance is an outage: the video was lost between the files (the flight
// summary counts it as loss, lib/flight-timeline/build-flight-timeline.ts)
const isOutage = (g: Gap) => g.seconds !== null && g.seconds > GAP_TOLERANCE_SEC;

export function gapWords(g: Gap): string {
  if (g.seconds === null) return `Gap, length unknown (${g.reason ?? "no file times"})`;
  return isOutage(g) ? `Video lost between files for about ${g.seconds.toFixed(1)} s (estimated from the recorder's file times)` : `Gap of ${g.seconds.toFixed(1)} s between files`;
}

export function firstDegradationLabel(t: Pick<Timeline, "summary">): string | undefined {
  const fd = t.summary.firstDegradation;
  if (!fd) return undefined;
  const when = fd.flightSec !== null ? `${formatMomentSec(fd.flightSec)} (flight time)` : `${formatMomentSec(fd.atSec)} in file ${fd.index + 1}`;
  return fd.between ? `${when}: video lost between files ${fd.index + 1} and ${fd.index + 2}` : when;
}

function segmentPattern(s: Segment): string {
  if (!s.trace) return "bg-paper-2";
  if (s.trace.longestLossSec > 0) return "band-damaged";
  return s.trace.intactShare < 1 ? "band-damaged" : "band-intact";
}

export function FlightTimeline({ flightId, currentRecordingId, canReorder = false }: { flightId: string; currentRecordingId?: string; canReorder?: boolean }) {
  const qc = useQueryClient();
  const key = ["flight-timeline", flightId];
  const q = useQuery({ queryKey: key, queryFn: () => fetchJson<Timeline>(`/api/flights/${flightId}/timeline`) });
  const [draft, setDraft] = useState<string[] | null>(null);
  const save = useMutation({
    mutationFn: (body: { recordingIds: string[] } | { recorderOrder: true }) => fetchJson<Timeline>(`/api/flights/${flightId}/order`, { method: "PATCH", json: body }),
    onSuccess: (t) => {
      qc.setQueryData(key, t);
      setDraft(null);
    },
  });

  if (q.isPending) return <p className="text-sm text-ink-2">Loading the flight timeline…</p>;
  if (q.isError) return <p className="text-sm text-bad">The flight timeline could not be loaded: {q.error.message}</p>;
  const t = q.data;
  if (t.segments.length === 0) return <p className="text-sm text-ink-2">No recordings in this flight yet. Upload the recorder&apos;s files to see the flight as one timeline.</p>;

  const byId = new Map(t.segments.map((s) => [s.recordingId, s]));
  const order = draft ?? t.segments.map((s) => s.recordingId);
  const pieces = t.segments.flatMap((s, i) => [
    ...(i > 0 ? [{ kind: "gap" as const, seconds: t.gaps[i - 1].seconds }] : []),
    { kind: "file" as const, seconds: s.lengthSec },
  ]);
  const widths = layoutFlightTimeline(pieces);
  const move = (from: number, to: number) => {
    const next = [...order];
    const [id] = next.splice(from, 1);
    next.splice(to, 0, id);
    setDraft(next);
  };

  return (
    <section aria-label="Flight timeline" className="flex flex-col gap-3">
      <div className="flex h-10 w-full items-stretch" aria-hidden>
        {t.segments.flatMap((s, i) => {
          const gapIndex = 2 * i - 1;
          const out = [];
          if (i > 0) {
            const g = t.gaps[i - 1];
            out.push(
              <div
                key={`gap-${i}`}
                title={gapWords(g)}
                className={`mx-px flex items-center justify-center text-[10px] text-ink-2 ${g.seconds === null || isOutage(g) ? "band-lost" : ""} ${isOutage(g) ? "bg-bad-soft" : ""}`}
                style={{ width: `${widths[gapIndex]}%` }}
              >
                {g.seconds === null ? "?" : isOutage(g) ? "▲" : ""}
              </div>,
            );
          }
          out.push(
            <Link
              key={s.recordingId}
              href={`/recordings/${s.recordingId}`}
              tabIndex={-1}
              title={`${i + 1}. ${s.originalName}: ${STATE_WORDS[s.state]}${s.lengthSec ? `, ${formatClockTime(s.lengthSec)}` : ""}${s.trace ? `, ${(s.trace.intactShare * 100).toFixed(1)} % intact` : ""}`}
              className={`flex items-end overflow-hidden rounded-sm border ${s.recordingId === currentRecordingId ? "border-lake ring-2 ring-lake" : "border-line"} ${segmentPattern(s)}`}
              style={{ width: `${widths[2 * i]}%` }}
            >
              <span className="m-0.5 truncate rounded bg-paper px-1 text-[10px] text-ink">{i + 1}</span>
            </Link>,
          );
          return out;
        })}
      </div>

      <TraceSummaryLine
        scope="flight"
        intactShare={t.summary.intactShare}
        firstDegradationSec={t.summary.firstDegradation ? (t.summary.firstDegradation.flightSec ?? t.summary.firstDegradation.atSec) : null}
        firstDegradationLabel={firstDegradationLabel(t)}
        longestLossSec={t.summary.longestLossSec}
        longestLossEstimated={t.summary.longestLossEstimated}
        lost={
          t.summary.tracedFiles > 0 && (t.summary.lostFrames > 0 || t.summary.lostIsLowerBound || t.summary.outages === 0)
            ? { frames: t.summary.lostFrames, isLowerBound: t.summary.lostIsLowerBound }
            : null
        }
      />
      <p className="text-xs text-ink-2">
        {t.summary.files} file{t.summary.files === 1 ? "" : "s"}, {formatClockTime(t.summary.recordedSec)} recorded
        {t.summary.spanSec !== null ? `, ${t.summary.spanSec.toFixed(1)} s from first to last frame` : ""}
        {t.summary.longestGapSec !== null ? `; longest gap between files ${t.summary.longestGapSec.toFixed(1)} s` : ""}
        {t.summary.unknownGaps > 0 ? `; ${t.summary.unknownGaps} gap${t.summary.unknownGaps === 1 ? "" : "s"} of unknown length` : ""}
        {t.summary.outages > 0
          ? `; video lost between files ${t.summary.outages} time${t.summary.outages === 1 ? "" : "s"}, about ${t.summary.outageSec.toFixed(1)} s in all (counted as loss above)`
          : ""}
        . Gaps are estimated from the recorder&apos;s file times.
      </p>

      <ol className="flex flex-col gap-1 text-sm" aria-label="Files of this flight, in order">
        {order.map((id, i) => {
          const s = byId.get(id)!;
          const gap = draft === null && i > 0 ? t.gaps[i - 1] : null;
          return (
            <li key={id} className="flex flex-col">
              {gap && <span className="ml-8 text-xs text-ink-2">{gapWords(gap)}</span>}
              <span className="flex items-center gap-2">
                <span className="w-6 text-right font-mono tabular text-ink-2">{i + 1}.</span>
                <Link href={`/recordings/${id}`} aria-current={id === currentRecordingId ? "page" : undefined} className="truncate underline-offset-2 hover:underline">
                  {s.originalName}
                </Link>
                <span className="text-xs text-ink-2">
                  {STATE_WORDS[s.state]}
                  {s.lengthSec ? `, ${formatClockTime(s.lengthSec)}` : ""}
                  {s.trace ? `, ${(s.trace.intactShare * 100).toFixed(1)} % intact` : ""}
                </span>
                {canReorder && (
                  <span className="ml-auto flex gap-1">
                    <button type="button" className="rounded border border-line px-2 py-1 text-xs disabled:opacity-40" disabled={i === 0} onClick={() => move(i, i - 1)} aria-label={`Move ${s.originalName} earlier`}>
                      Earlier
                    </button>
                    <button type="button" className="rounded border border-line px-2 py-1 text-xs disabled:opacity-40" disabled={i === order.length - 1} onClick={() => move(i, i + 1)} aria-label={`Move ${s.originalName} later`}>
                      Later
                    </button>
                  </span>
                )}
              </span>
            </li>
          );
        })}
      </ol>
      {canReorder && (
        <div className="flex flex-wrap items-center gap-2">
          <Button type="button" disabled={!draft} busy={save.isPending} onClick={() => draft && save.mutate({ recordingIds: draft })}>
            Save file order
          </Button>
          {draft && (
            <Button type="button" variant="quiet" onClick={() => setDraft(null)}>
              Discard changes
            </Button>
          )}
          <Button type="button" variant="secondary" busy={save.isPending} onClick={() => save.mutate({ recorderOrder: true })}>
            Use the recorder&apos;s order
          </Button>
          {save.isError && <span className="text-sm text-bad" role="alert">{save.error.message}</span>}
        </div>
      )}
    </section>
  );
}
