"use client";
// The client's page: who shared, what, until when; the clip with its findings on the timeline and
// in a list (each jumps to its moment); the report and, when allowed, the originals with their
// SHA-256. Signed addresses live 10 minutes: the page fetches fresh ones before they run out, and
// again when the player reports a failed source. A link that stopped working sends the visitor to
// its door page, which says why.
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { CairnMark } from "@/components/ui/cairn-mark";
import { HashText } from "@/components/ui/hash-text";
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import { describeMoment } from "@/lib/findings/describe-moment";
import { frameRateFromFps } from "@/lib/recordings/recording-frame-rate";
import type { FrameRate } from "@/lib/timecode/frame-rate";
import { frameOnScreen, seekTimeForFrame } from "@/components/player/frame-seek";
import type { ShareView, ShareViewFinding } from "@/lib/sharing/build-share-view";
import { SharePlayer, type SharePlayerHandle } from "./share-player";
import { FindingTimeline } from "./finding-timeline";
import { SeverityStone } from "./severity-stone";
import { formatBytes } from "@/lib/uploads/format-bytes";

const REFRESH_MARGIN_MS = 90_000; // fetch fresh addresses 90 s before the old ones expire

// one formatter and one unit system (decimal) for every size Cairn shows
const formatSize = (n: number | null) => (n === null ? "size unknown" : formatBytes(n));

// The recording's exact frame rate, when it is known: times on this page are then frame times, the
// same labels the review room, the findings and the report give for the same moment.
function rateOf(fps: number | null | undefined): FrameRate | null {
  if (!fps) return null;
  try {
    return frameRateFromFps(fps);
  } catch {
    return null;
  }
}

export function ShareViewer({ initialView, gatePath, manifestPath }: { initialView: ShareView; gatePath: string; manifestPath: string }) {
  const [view, setView] = useState(initialView);
  const [recordingId, setRecordingId] = useState(initialView.recordings.find((r) => r.playableUrl)?.id ?? initialView.recordings[0]?.id ?? null);
  const [current, setCurrent] = useState(0);
  const [duration, setDuration] = useState(0);
  const [startAt, setStartAt] = useState<number | undefined>(undefined);
  const [selected, setSelected] = useState<string | null>(null);
  const player = useRef<SharePlayerHandle>(null);

  const refresh = useCallback(async () => {
    const res = await fetch(manifestPath, { cache: "no-store" }).catch(() => null);
    if (!res) return;
    if (res.status === 404 || res.status === 410) {
      window.location.assign(gatePath);
      return;
    }
    if (res.ok) setView((await res.json()) as ShareView);
  }, [manifestPath, gatePath]);

  useEffect(() => {
    const wait = Math.max(5_000, new Date(view.addressesExpireAt).getTime() - Date.now() - REFRESH_MARGIN_MS);
    const t = setTimeout(() => void refresh(), wait);
    return () => clearTimeout(t);
  }, [view.addressesExpireAt, refresh]);

  const recording = view.recordings.find((r) => r.id === recordingId) ?? null;
  // the stored duration (the recorder's frame slots over the frame rate) is the one every page shows
  const durationSec = recording?.durationSec || duration || 0;
  const rate = rateOf(recording?.fps);
  const frameCount = rate ? Math.max(1, Math.round((durationSec * rate.num) / rate.den)) : 0;
  const positionLabel = rate && frameCount > 0 ? describeMoment(frameOnScreen(current, rate, frameCount), rate).clock : formatClockTime(current);
  const findingLabel = (f: ShareViewFinding) => {
    const r = rateOf(view.recordings.find((x) => x.id === f.recordingId)?.fps);
    return r ? describeMoment(f.startFrame, r).clock : formatClockTime(f.startSec);
  };
  const findingSeekSec = (f: ShareViewFinding) => {
    const rec = view.recordings.find((x) => x.id === f.recordingId);
    const r = rateOf(rec?.fps);
    return r ? seekTimeForFrame(f.startFrame, r, Number.MAX_SAFE_INTEGER) : f.startSec;
  };
  const findingsHere = useMemo(() => view.findings.filter((f) => f.recordingId === recordingId), [view.findings, recordingId]);
  const nameOf = (id: string) => view.recordings.find((r) => r.id === id)?.name ?? "";

  const jump = (f: ShareViewFinding) => {
    setSelected(f.id);
    const at = findingSeekSec(f);
    if (f.recordingId !== recordingId) {
      setStartAt(at);
      setDuration(0);
      setRecordingId(f.recordingId);
      setCurrent(at);
      return;
    }
    player.current?.seek(at);
  };

  return (
    <div className="min-h-screen">
      <header className="border-b border-line bg-paper">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-4 px-4 py-3">
          <CairnMark size={24} />
          <p className="text-sm">
            Shared by <strong data-testid="share-org">{view.organisationName}</strong>
          </p>
          <p className="ml-auto text-sm text-ink-2">
            Available until <span className="font-mono">{view.expiresAt.slice(0, 10)}</span>
          </p>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-6">
        <h1 className="text-2xl font-semibold tracking-tight">{view.label}</h1>
        <p className="mt-1 text-sm text-ink-2">
          {view.jobTitle}
          {view.siteName ? ` · ${view.siteName}` : ""}
        </p>

        {view.recordings.length > 0 && (
          <section aria-labelledby="footage" className="mt-6 grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
            <div>
              <h2 id="footage" className="sr-only">
                Footage
              </h2>
              {view.recordings.length > 1 && (
                <div role="tablist" aria-label="Recordings" className="mb-3 flex flex-wrap gap-2">
                  {view.recordings.map((r) => (
                    <button
                      key={r.id}
                      role="tab"
                      type="button"
                      aria-selected={r.id === recordingId}
                      onClick={() => {
                        setStartAt(undefined);
                        setDuration(0);
                        setCurrent(0);
                        setRecordingId(r.id);
                      }}
                      className={`rounded-md border px-3 py-2 text-sm ${r.id === recordingId ? "border-lake bg-lake text-on-lake" : "border-line hover:bg-paper-2"}`}
                    >
                      {r.name}
                    </button>
                  ))}
                </div>
              )}
              {recording?.playableUrl ? (
                <SharePlayer
                  key={recording.id}
                  ref={player}
                  src={recording.playableUrl}
                  poster={recording.posterUrl}
                  thumbnails={recording.thumbnailsUrl}
                  label={`Recording ${recording.name}`}
                  startAt={startAt}
                  onTime={setCurrent}
                  onDuration={setDuration}
                  onSourceError={() => void refresh()}
                  frameSec={rate ? rate.den / rate.num : undefined}
                  analytics={{ recordingId: recording.id, title: recording.name }}
                />
              ) : (
                <p className="rounded-md border border-dashed border-line px-4 py-10 text-center text-sm text-ink-2">
                  {recording ? "This recording is still being processed; its playable copy is not ready yet." : "No recording is shared through this link."}
                </p>
              )}
              {recording && (
                <>
                  <p className="mt-2 font-mono text-sm tabular" aria-live="off">
                    <span className="sr-only">Position </span>
                    <span data-testid="share-current-time">{positionLabel}</span>
                    {durationSec > 0 && <span className="text-ink-2"> / {formatClockTime(durationSec)}</span>}
                  </p>
                  <FindingTimeline findings={findingsHere} durationSec={durationSec} currentSec={current} onJump={jump} labelOf={findingLabel} />
                </>
              )}
            </div>

            <div>
              <h2 className="text-lg font-semibold">Findings</h2>
              {view.findings.length === 0 ? (
                <p className="mt-2 text-sm text-ink-2">No findings are shared through this link.</p>
              ) : (
                <ol className="mt-2 flex flex-col gap-2" aria-label="Findings">
                  {view.findings.map((f) => (
                    <li key={f.id} className={`rounded-md border p-3 ${selected === f.id ? "border-lake" : "border-line"}`} data-testid="share-finding">
                      <div className="flex items-start gap-2">
                        <SeverityStone severity={f.severity} />
                        <div className="min-w-0 flex-1">
                          <p className="text-sm">
                            <strong title={f.severityMeaning}>{f.severityLabel}</strong>
                            {f.categoryName && <span> · {f.categoryName}</span>}
                          </p>
                          {f.note && <p className="mt-1 text-sm text-ink-2">{f.note}</p>}
                          {view.recordings.length > 1 && <p className="mt-1 text-xs text-ink-2">{nameOf(f.recordingId)}</p>}
                        </div>
                        {f.stillUrl && (
                          // eslint-disable-next-line @next/next/no-img-element
                          <img src={f.stillUrl} alt={`Still of the ${f.severityLabel.toLowerCase()} finding`} className="h-14 w-20 rounded border border-line object-cover" />
                        )}
                      </div>
                      <button type="button" onClick={() => jump(f)} className="mt-2 min-h-10 rounded-md border border-line px-3 text-sm hover:bg-paper-2">
                        Jump to <span className="font-mono tabular">{findingLabel(f)}</span>
                      </button>
                    </li>
                  ))}
                </ol>
              )}
            </div>
          </section>
        )}

        <section aria-labelledby="downloads" className="mt-8">
          <h2 id="downloads" className="text-lg font-semibold">
            Downloads
          </h2>
          <div className="mt-2 flex flex-col gap-3">
            {view.report ? (
              <div className="flex flex-wrap items-center gap-3 rounded-md border border-line p-3">
                <a href={view.report.url} download className="inline-flex min-h-10 items-center rounded-md border border-lake bg-lake px-4 text-sm font-medium text-on-lake hover:bg-lake-dark">
                  Download the report (PDF)
                </a>
                <span className="text-sm">
                  Version {view.report.version}
                  {view.report.approved ? ", approved" : ", not yet approved"} · {formatSize(view.report.sizeBytes)}
                </span>
                {view.report.sha256 && <HashText value={view.report.sha256} />}
              </div>
            ) : (
              <p className="text-sm text-ink-2">No report is shared through this link yet.</p>
            )}
            {view.evidencePackage && (
              <div className="flex flex-wrap items-center gap-3 rounded-md border border-line p-3" data-testid="share-evidence-package">
                <a href={manifestPath.replace(/\/manifest$/, "/package")} download className="inline-flex min-h-10 items-center rounded-md border border-lake bg-lake px-4 text-sm font-medium text-on-lake hover:bg-lake-dark">
                  Download the evidence package (ZIP)
                </a>
                <span className="text-sm">
                  {formatSize(view.evidencePackage.sizeBytes)} · kept until {view.evidencePackage.expiresAt.slice(0, 10)} · a BagIt bag: its README.txt tells how to check it with sha256sum -c
                </span>
                {view.evidencePackage.sha256 && <HashText value={view.evidencePackage.sha256} />}
              </div>
            )}
            {view.allowOriginals && view.recordings.length > 0 && (
              <div className="rounded-md border border-line p-3">
                <p className="text-sm font-medium">Originals, byte for byte as recorded</p>
                <p className="text-xs text-ink-2">After downloading, compute the file&apos;s SHA-256: it must equal the value shown, or the file is not the original.</p>
                <ul className="mt-2 flex flex-col gap-2">
                  {view.recordings.map((r) => (
                    <li key={r.id} className="flex flex-wrap items-center gap-3 text-sm">
                      <a href={r.originalUrl ?? undefined} download className="min-h-10 rounded-md border border-line px-3 py-2 hover:bg-paper-2">
                        Download original: {r.name}
                      </a>
                      <span>{formatSize(r.sizeBytes)}</span>
                      <HashText value={r.sha256} />
                    </li>
                  ))}
                </ul>
              </div>
            )}
          </div>
        </section>

        <footer className="mt-10 border-t border-line pt-4 text-xs text-ink-2">
          Shared through Cairn by {view.organisationName}. Every opening and download of this link is recorded in the organisation&apos;s custody log. Please do not forward the link.
        </footer>
      </main>
    </div>
  );
}
