"use client";
// The signal trace of one recording, embeddable under a player: fetches /api/recordings/:id/trace and
// shows the band, the numbered link events and the summary, or why there is no trace. With the stored
// figures (lib/recordings/recording-figures.ts) the rendition keeps the recorder's time, so band, player and
// list share one clock and the summary is the stored one; a recording processed before figures existed
// keeps the older mapping onto the playable's clock.
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import type { RecordingFigures } from "@/lib/recordings/recording-figures";
import type { FrameRate } from "@/lib/timecode/frame-rate";
import { formatFrameClockTime } from "@/lib/timecode/format-frame-clock-time";
import { TraceBand } from "./trace-band";
import { TraceSummaryLine } from "./trace-summary";
import type { BandInterval } from "./layout-trace-band";

export type TraceView =
  | {
      applicable: true;
      fps: number;
      intervals: Array<BandInterval & { frames: number; playableStartSec: number; playableEndSec: number }>;
      summary: { intactShare: number; firstDegradationSec: number | null; longestLossSec: number; lostFrames: number; damagedFrames: number };
      decoderErrorFrameCount: number;
    }
  | { applicable: false; reason: string; state: string };

/** The recording's trace, fetched once per page (the readout and the panel share the query). */
export function useRecordingTrace(recordingId: string) {
  return useQuery({
    queryKey: ["recording-trace", recordingId],
    queryFn: () => fetchJson<TraceView>(`/api/recordings/${recordingId}/trace`),
  });
}

/** The link state at recorder frame slot `frame`, when the trace is known. */
export function linkStateAt(trace: TraceView | undefined, frame: number): "intact" | "damaged" | "lost" | null {
  if (!trace?.applicable) return null;
  return trace.intervals.find((i) => frame >= i.startFrame && frame < i.endFrame)?.state ?? null;
}

export function RecordingTracePanel({
  recordingId,
  playableDurationSec,
  currentSec,
  onSeek,
  figures = null,
  rate,
}: {
  recordingId: string;
  /** The playable's duration: the band lines up with the player's timeline. */
  playableDurationSec: number | null;
  currentSec?: number;
  onSeek?: (sec: number) => void;
  figures?: RecordingFigures | null;
  rate?: FrameRate;
}) {
  const q = useRecordingTrace(recordingId);
  if (q.isPending) return <p className="text-sm text-ink-2">Loading the signal trace…</p>;
  if (q.isError) return <p className="text-sm text-bad">The signal trace could not be loaded: {q.error.message}</p>;
  const t = q.data;
  if (!t.applicable) return <p className="text-sm text-ink-2">Signal trace: {t.reason}</p>;
  const recorderClock = !!figures;
  const total = figures ? figures.durationSeconds : (playableDurationSec ?? Math.max(0, ...t.intervals.map((i) => i.playableEndSec)));
  // the first interval that is not intact: the summary's first degradation can never say "none" beside a loss
  const firstTrouble = t.intervals.find((i) => i.state !== "intact");
  const firstSlot = figures?.firstDegradationSlot ?? firstTrouble?.startFrame ?? null;
  const summary = figures
    ? {
        intactShare: figures.intactShare,
        firstDegradationSec: figures.firstDegradationSeconds ?? firstTrouble?.startSec ?? null,
        longestLossSec: figures.longestLossSeconds,
        lost: { frames: figures.framesLost, isLowerBound: figures.framesLostIsLowerBound },
        damagedFrames: figures.framesDamaged,
        firstDegradationLabel: rate && firstSlot !== null ? formatFrameClockTime(firstSlot, rate) : undefined,
      }
    : {
        intactShare: t.summary.intactShare,
        firstDegradationSec: t.summary.firstDegradationSec ?? firstTrouble?.startSec ?? null,
        longestLossSec: t.summary.longestLossSec,
        lost: { frames: t.summary.lostFrames, isLowerBound: false },
        damagedFrames: t.summary.damagedFrames,
        firstDegradationLabel: undefined,
      };
  return (
    <section aria-label="Signal trace" className="flex flex-col gap-2">
      <TraceBand
        intervals={t.intervals}
        totalSec={total}
        clock={recorderClock ? "recorder" : "playable"}
        currentSec={currentSec}
        onSeek={onSeek}
        rate={rate}
        lostIsLowerBound={figures?.framesLostIsLowerBound ?? false}
      />
      <TraceSummaryLine {...summary} />
      <p className="text-xs text-ink-2">
        From the H.264 stream itself (frame_num gaps, unreadable slices, recovery), cross-checked with ffmpeg&apos;s decoder
        {t.decoderErrorFrameCount > 0 ? `, which reported errors in ${t.decoderErrorFrameCount} frame${t.decoderErrorFrameCount === 1 ? "" : "s"}` : ""}.{" "}
        {recorderClock
          ? "All times are on the recorder's clock: lost frames keep their place, and the player holds the last frame for their length."
          : "Times of first degradation and longest loss are on the recorder's clock (lost frames count); the band follows the player."}
        {figures?.framesLostIsLowerBound ? " Some frames were lost where the stream cannot tell how many: the lost count is a lower bound." : ""}
      </p>
    </section>
  );
}
