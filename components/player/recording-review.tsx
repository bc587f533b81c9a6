"use client";
// The review room for one recording: the player with frame-exact stepping and timecodes, the
// findings timeline, the flight's other files, the finding form and list, and who has watched.
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";
import { HashText } from "@/components/ui/hash-text";
import { EmptyState } from "@/components/ui/empty-state";
import { FindingForm, draftFrom, emptyDraft, type FindingDraft } from "@/components/findings/finding-form";
import { FindingList } from "@/components/findings/finding-list";
import { FindingMarkers } from "@/components/findings/finding-markers";
import { FindingHistory } from "@/components/findings/finding-history";
import { CategoriesEditor } from "@/components/findings/categories-editor";
import { useCategories, useFindings } from "@/components/findings/use-findings";
import type { FindingItem } from "@/components/findings/finding-types";
import type { RecordingPageData } from "@/lib/recordings/load-recording-page";
import { ReviewPlayer, type ReviewPlayerHandle } from "./review-player";
import { BoxOverlay } from "./box-overlay";
import { TimecodeReadout } from "./timecode-readout";
import { ShortcutHelp } from "./shortcut-help";
import { PlaybackViews } from "./playback-views";
import { linkStateAt, RecordingTracePanel, useRecordingTrace } from "@/components/trace/recording-trace-panel";
import { FlightTimeline } from "@/components/flight-timeline/flight-timeline";
import { PLAYBACK_RATES, shortcutFor } from "./review-shortcuts";
import { useProcessingProgress, type LiveProgress } from "./use-processing-progress";

type Viewer = { userId: string; canWrite: boolean };

export function RecordingReview({ data, viewer, initialFrame, initialFindingId }: { data: RecordingPageData; viewer: Viewer; initialFrame: number | null; initialFindingId: string | null }) {
  const { recording, timing, media } = data;
  const router = useRouter();
  // processing shows live progress (server-sent events); the page refreshes once it is ready or failed
  const live = useProcessingProgress(recording.id, recording, () => router.refresh());

  return (
    <div className="flex flex-col gap-4">
      <header className="flex flex-wrap items-end gap-x-6 gap-y-2">
        <div className="min-w-0">
          <p className="text-sm text-ink-2">
            <Link href={`/jobs/${recording.jobId}`} className="underline">
              {recording.jobTitle}
            </Link>{" "}
            · flight of <span className="font-mono">{recording.flownOn}</span>
          </p>
          <h1 className="truncate text-2xl font-semibold tracking-tight">{recording.name}</h1>
        </div>
        <div className="text-sm">
          <span className="text-ink-2">Original SHA-256 </span>
          <HashText value={recording.sha256} />
        </div>
        <Link href={`/jobs/${recording.jobId}/report`} className="ml-auto text-sm text-lake underline">
          Job report
        </Link>
      </header>
      {data.flightFiles.length > 1 && <FlightTimeline flightId={recording.flightId} currentRecordingId={recording.id} />}
      {recording.state !== "ready" || !timing || !media.playable ? (
        <ProcessingState live={live} />
      ) : (
        <ReviewRoom data={data} timing={timing} playable={media.playable} viewer={viewer} initialFrame={initialFrame} initialFindingId={initialFindingId} />
      )}
    </div>
  );
}

function ReviewRoom({
  data,
  timing,
  playable,
  viewer,
  initialFrame,
  initialFindingId,
}: {
  data: RecordingPageData;
  timing: NonNullable<RecordingPageData["timing"]>;
  playable: string;
  viewer: Viewer;
  initialFrame: number | null;
  initialFindingId: string | null;
}) {
  const { recording, media } = data;
  const { rate, frameCount, durationSec, fps } = timing;
  const player = useRef<ReviewPlayerHandle>(null);
  const [frame, setFrame] = useState(initialFrame ?? 0);
  const [playbackRate, setPlaybackRate] = useState(1);
  const [selectedId, setSelectedId] = useState<string | null>(initialFindingId);
  const [draft, setDraft] = useState<FindingDraft | null>(null);
  const [drawing, setDrawing] = useState(false);
  const [help, setHelp] = useState(false);
  const [historyFor, setHistoryFor] = useState<string | null>(null);
  const [categoriesOpen, setCategoriesOpen] = useState(false);
  const findings = useFindings({ recordingId: recording.id });
  const categories = useCategories(recording.assetKind);
  const items = useMemo(() => findings.data?.items ?? [], [findings.data]);
  const selected = items.find((f) => f.id === selectedId) ?? null;
  const formRef = useRef<HTMLDivElement>(null);
  const trace = useRecordingTrace(recording.id);

  const jumpTo = useCallback((f: FindingItem) => {
    setSelectedId(f.id);
    player.current?.pause();
    player.current?.seekToFrame(f.startFrame);
    setFrame(f.startFrame);
  }, []);
  const startMarking = useCallback(() => {
    if (!viewer.canWrite) return;
    player.current?.pause();
    setDraft((d) => d ?? emptyDraft(player.current?.frame() ?? frame));
    setTimeout(() => formRef.current?.querySelector<HTMLElement>("input[name=severity]")?.focus(), 0);
  }, [viewer.canWrite, frame]);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape" && drawing) {
        setDrawing(false);
        return;
      }
      const action = shortcutFor(e);
      if (!action || help || historyFor || categoriesOpen) return;
      const p = player.current;
      if (!p) return;
      e.preventDefault();
      const current = p.frame();
      switch (action) {
        case "toggle-play":
          return p.togglePlay();
        case "frame-back":
          return p.stepFrames(-1);
        case "frame-forward":
          return p.stepFrames(1);
        case "second-back":
          return p.seekBySeconds(-1);
        case "second-forward":
          return p.seekBySeconds(1);
        case "jump-back":
          return p.seekBySeconds(-10);
        case "jump-forward":
          return p.seekBySeconds(10);
        case "first-frame":
          return p.stepFrames(-current);
        case "last-frame":
          return p.stepFrames(frameCount - 1 - current);
        case "slower":
          return p.changeRate(-1);
        case "faster":
          return p.changeRate(1);
        case "mark":
          return startMarking();
        case "range-start":
          if (!viewer.canWrite) return;
          return setDraft((d) => ({ ...(d ?? emptyDraft(current)), startFrame: current, ...(d && d.endFrame !== null && d.endFrame <= current ? { endFrame: null } : {}) }));
        case "range-end":
          if (!viewer.canWrite) return;
          return setDraft((d) => {
            const base = d ?? emptyDraft(0);
            return current > base.startFrame ? { ...base, endFrame: current } : base;
          });
        case "draw-box":
          if (!viewer.canWrite) return;
          p.pause();
          setDraft((d) => d ?? emptyDraft(current));
          return setDrawing((v) => !v);
        case "help":
          return setHelp(true);
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [drawing, help, historyFor, categoriesOpen, frameCount, startMarking, viewer.canWrite]);

  const shownBox = drawing || draft ? (draft?.box ?? null) : selected && frame >= selected.startFrame && frame <= (selected.endFrame ?? selected.startFrame) ? selected.box : null;

  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_400px]">
      <div className="flex min-w-0 flex-col gap-3">
        <ReviewPlayer
          ref={player}
          src={playable}
          poster={media.poster}
          thumbnailsUrl={media.thumbnails}
          rate={rate}
          frameCount={frameCount}
          durationSec={durationSec}
          title={recording.name}
          analytics={{ recordingId: recording.id, viewerUserId: viewer.userId }}
          startFrame={initialFrame ?? undefined}
          onFrame={setFrame}
          onRate={setPlaybackRate}
          renderOverlay={() => (
            <BoxOverlay
              box={shownBox}
              drawing={drawing}
              onDrawn={(box) => {
                setDraft((d) => ({ ...(d ?? emptyDraft(frame)), box }));
                setDrawing(false);
              }}
            />
          )}
        />
        <div className="flex flex-wrap items-center gap-3 rounded-md border border-line bg-paper-2 px-3 py-2">
          <TimecodeReadout frame={frame} rate={rate} frameCount={frameCount} fps={fps} playbackRate={playbackRate} durationSec={durationSec} lost={timing.lost} linkState={timing.recorderClock ? linkStateAt(trace.data, frame) : null} />
          <div className="ml-auto flex flex-wrap items-center gap-1">
            <Button type="button" variant="secondary" className="px-3" onClick={() => player.current?.stepFrames(-1)} aria-label="One frame back">
              ◀︎ Frame
            </Button>
            <Button type="button" variant="secondary" className="px-3" onClick={() => player.current?.stepFrames(1)} aria-label="One frame forward">
              Frame ▶︎
            </Button>
            <label className="flex items-center gap-1 text-sm">
              <span className="sr-only">Playback speed</span>
              <select
                className="min-h-10 rounded-md border border-line bg-white px-2 text-sm dark:bg-paper"
                value={playbackRate}
                onChange={(e) => player.current?.setRate(Number(e.target.value))}
                aria-label="Playback speed"
              >
                {PLAYBACK_RATES.map((r) => (
                  <option key={r} value={r}>
                    {r}×
                  </option>
                ))}
              </select>
            </label>
            {viewer.canWrite && (
              <Button type="button" onClick={startMarking}>
                Mark finding
              </Button>
            )}
            <Button type="button" variant="quiet" onClick={() => setHelp(true)} aria-haspopup="dialog">
              Shortcuts (?)
            </Button>
          </div>
        </div>
        <FindingMarkers
          findings={items}
          frameCount={frameCount}
          rate={rate}
          currentFrame={frame}
          selectedId={selectedId}
          draft={draft}
          onSeekFrame={(f) => {
            player.current?.seekToFrame(f);
            setFrame(f);
          }}
          onSelect={jumpTo}
        />
        <RecordingTracePanel
          recordingId={recording.id}
          playableDurationSec={durationSec}
          currentSec={(frame * rate.den) / rate.num}
          figures={data.figures}
          rate={rate}
          onSeek={(sec) => {
            const f = Math.min(frameCount - 1, Math.floor((sec * rate.num) / rate.den + 1e-6));
            player.current?.seekToFrame(f);
            setFrame(f);
          }}
        />
        <PlaybackViews recordingId={recording.id} />
      </div>

      {/* sticky with its own scroll: the form and list never push the picture off screen */}
      <aside className="flex flex-col gap-3 lg:sticky lg:top-4 lg:max-h-[calc(100vh-2rem)] lg:self-start lg:overflow-y-auto lg:pr-1" aria-label="Findings">
        {draft && (
          <div ref={formRef}>
            <FindingForm
              recordingId={recording.id}
              draft={draft}
              onChange={(patch) => setDraft((d) => (d ? { ...d, ...patch } : d))}
              currentFrame={frame}
              rate={rate}
              frameCount={frameCount}
              categories={categories.data?.items ?? []}
              drawing={drawing}
              onToggleDrawing={() => {
                player.current?.pause();
                setDrawing((v) => !v);
              }}
              onSaved={(f) => {
                setDraft(null);
                setDrawing(false);
                setSelectedId(f.id);
              }}
              onCancel={() => {
                setDraft(null);
                setDrawing(false);
              }}
              onEditCategories={() => setCategoriesOpen(true)}
            />
          </div>
        )}
        <div className="flex items-center">
          <h2 className="text-base font-semibold">Findings</h2>
          <span className="ml-2 text-sm text-ink-2">{findings.data ? `${items.length}` : "…"}</span>
        </div>
        {findings.error && <p role="alert">{findings.error.message}</p>}
        {findings.data && items.length === 0 && (
          <EmptyState
            title="No findings yet"
            next={viewer.canWrite ? "Step to the frame where a defect is clearest (, and .), then press m or “Mark finding”." : "Findings marked by reviewers appear here."}
          />
        )}
        <FindingList
          findings={items}
          rate={rate}
          selectedId={selectedId}
          canWrite={viewer.canWrite}
          onSelect={jumpTo}
          onEdit={(f) => {
            jumpTo(f);
            setDraft(draftFrom(f));
          }}
          onHistory={(f) => setHistoryFor(f.id)}
        />
      </aside>
      <ShortcutHelp open={help} onClose={() => setHelp(false)} />
      {historyFor && <FindingHistory findingId={historyFor} onClose={() => setHistoryFor(null)} />}
      {categoriesOpen && <CategoriesEditor canWrite={viewer.canWrite} onClose={() => setCategoriesOpen(false)} />}
    </div>
  );
}

function ProcessingState({ live }: { live: LiveProgress }) {
  if (live.state === "failed")
    return <EmptyState title={`Failed: ${live.failureReason ?? "the recording could not be processed"}`} next="The original is kept unaltered. A pilot or owner can reprocess it from the flight page." />;
  const pct = Math.max(0, Math.min(100, Math.round(live.progress)));
  return (
    <EmptyState
      title={live.state === "processing" ? `Processing ${pct} %` : live.state === "ready" ? "Ready: opening the review room" : "Waiting to be processed"}
      next="The playable video, thumbnails and signal trace appear here when processing finishes."
      action={
        live.state === "processing" ? (
          <span role="progressbar" aria-label="Processing" aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100} className="block h-1.5 w-64 max-w-full rounded bg-paper-2">
            <span className="block h-full rounded bg-lake" style={{ width: `${pct}%` }} />
          </span>
        ) : undefined
      }
    />
  );
}
