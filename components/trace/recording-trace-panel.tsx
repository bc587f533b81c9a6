"use client";
// The signal trace of one recording, embeddable under a player: fetches /api/recordings/:id/trace and
// shows the band on the playable's clock, the summary, and why there is no trace when there is none.
import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { TraceBand } from "./trace-band";
import { TraceSummaryLine } from "./trace-summary";
import type { BandInterval } from "./layout-trace-band";

type TraceView =
  | {
      applicable: true;
      fps: number;
      intervals: Array<BandInterval & { frames: number; playableStartSec: number; playableEndSec: number }>;
      summary: { intactShare: number; firstDegradationSec: number | null; longestLossSec: number; lostFrames: number; damagedFrames: number };
      decoderErrorFrameCount: number;
    }
  | { applicable: false; reason: string; state: string };

export function RecordingTracePanel({
  recordingId,
  playableDurationSec,
  currentSec,
  onSeek,
}: {
  recordingId: string;
  /** The playable's duration: the band lines up with the player's timeline. */
  playableDurationSec: number | null;
  currentSec?: number;
  onSeek?: (sec: number) => void;
}) {
  const q = useQuery({
    queryKey: ["recording-trace", recordingId],
    queryFn: () => fetchJson<TraceView>(`/api/recordings/${recordingId}/trace`),
  });
  if (q.isPending) return <p className="text-sm text-ink-2">Loading the signal trace…</p>;
  if (q.isError) return <p className="text-sm text-bad">The signal trace could not be loaded: {q.error.message}</p>;
  const t = q.data;
  if (!t.applicable) return <p className="text-sm text-ink-2">Signal trace: {t.reason}</p>;
  const total = playableDurationSec ?? Math.max(0, ...t.intervals.map((i) => i.playableEndSec));
  return (
    <section aria-label="Signal trace" className="flex flex-col gap-2">
      <TraceBand intervals={t.intervals} totalSec={total} clock="playable" currentSec={currentSec} onSeek={onSeek} />
      <TraceSummaryLine intactShare={t.summary.intactShare} firstDegradationSec={t.summary.firstDegradationSec} longestLossSec={t.summary.longestLossSec} />
      <p className="text-xs text-ink-2">
        From the H.264 stream itself (frame_num gaps, unreadable slices, recovery), cross-checked with ffmpeg&apos;s decoder
        {t.decoderErrorFrameCount > 0 ? `, which reported errors in ${t.decoderErrorFrameCount} frame${t.decoderErrorFrameCount === 1 ? "" : "s"}` : ""}. Times of
        first degradation and longest loss are on the recorder&apos;s clock (lost frames count); the band follows the player.
      </p>
    </section>
  );
}
