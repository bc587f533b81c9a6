"use client";
// A flight's track on its page: import it, align it with the recordings, play a recording and watch the
// aircraft move on the plan and the distance chart, read the distance, height and slant range at every
// link event and finding, and log a link event as a range check with one click. Figures come from the
// server (lib/tracks/load-flight-track.ts); the browser only interpolates the drawn position.
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import Link from "next/link";
import { Button } from "@/components/ui/button";
import { HashText } from "@/components/ui/hash-text";
import { SafetyCautions } from "@/components/range/safety-cautions";
import { LinkEventMark } from "@/components/range/link-event-mark";
import { LINK_EVENT_META } from "@/lib/range-checks/link-events";
import { formatMetresIn } from "@/lib/range-checks/format-figures";
import { displayAt } from "@/lib/tracks/display-at";
import type { FlightTrackView } from "@/lib/tracks/load-flight-track";
import type { DisplayUnits } from "@/lib/validation/range-checks";
import { TrackImport } from "./track-import";
import { TrackPlan, type PlanEvent } from "./track-plan";
import { DistanceChart, type ChartEvent } from "./distance-chart";
import { TRACK_LINK_STYLE } from "./link-state-style";

type View = FlightTrackView;
type Loaded = Extract<View, { track: NonNullable<unknown> }> & { track: NonNullable<View["track"]> };

const time = (iso: string | null) => (iso ? `${iso.slice(11, 23)} UTC` : "—");

export function FlightTrackPanel({ flightId, canImport, canAlign, units }: { flightId: string; canImport: boolean; canAlign: boolean; units: DisplayUnits }) {
  const qc = useQueryClient();
  const key = ["flight-track", flightId];
  const q = useQuery({ queryKey: key, queryFn: () => fetchJson<View>(`/api/flights/${flightId}/track`) });
  const load = useCallback(async () => {
    await qc.invalidateQueries({ queryKey: ["flight-track", flightId] });
  }, [qc, flightId]);
  const setView = (v: View) => qc.setQueryData(["flight-track", flightId], v);
  const view = q.data ?? null;
  const error = q.error ? (q.error as Error).message : null;

  if (error) return <p role="alert" className="text-sm text-bad">The track could not be loaded: {error}</p>;
  if (!view) return <p role="status" className="text-sm text-ink-2">Loading the flight track…</p>;
  if (!view.track) {
    return (
      <div className="flex flex-col gap-3" data-testid="track-empty">
        <p className="text-sm text-ink-2">
          No track yet. With the flight&apos;s track (exported by the flight app or the controller), Cairn measures the distance and height at every break-up, loss and return of the video, with nothing typed.
        </p>
        {canImport ? <TrackImport flightId={flightId} onImported={load} /> : <p className="text-sm text-ink-2">A pilot or the owner can import it.</p>}
      </div>
    );
  }
  return <LoadedTrack view={view as Loaded} canAlign={canAlign} units={units} reload={load} onView={setView} />;
}

function LoadedTrack({ view, canAlign, units, reload, onView }: { view: Loaded; canAlign: boolean; units: DisplayUnits; reload: () => Promise<void>; onView: (v: View) => void }) {
  const playable = view.recordings.filter((r) => r.playableUrl);
  const [recId, setRecId] = useState<string | null>(playable[0]?.id ?? null);
  const rec = view.recordings.find((r) => r.id === recId) ?? null;
  const video = useRef<HTMLVideoElement>(null);
  const [sec, setSec] = useState(0);
  const [message, setMessage] = useState<string | null>(null);
  const [busyKey, setBusyKey] = useState<string | null>(null);

  useEffect(() => {
    const v = video.current;
    if (!v) return;
    let raf = 0;
    const tick = () => {
      setSec(v.currentTime);
      if (!v.paused) raf = requestAnimationFrame(tick);
    };
    const start = () => {
      cancelAnimationFrame(raf);
      raf = requestAnimationFrame(tick);
    };
    v.addEventListener("play", start);
    v.addEventListener("seeked", tick);
    v.addEventListener("timeupdate", tick);
    return () => {
      cancelAnimationFrame(raf);
      v.removeEventListener("play", start);
      v.removeEventListener("seeked", tick);
      v.removeEventListener("timeupdate", tick);
    };
  }, [recId]);

  const nowT = rec?.startOnTrack ? Date.parse(rec.startOnTrack) + sec * 1000 : null;
  const here = nowT !== null ? displayAt(view.points, nowT) : null;
  const frame = rec?.fps ? Math.floor(sec * rec.fps + 1e-6) : null;

  const startOf = (recordingId: string) => view.recordings.find((r) => r.id === recordingId)?.startOnTrack ?? null;
  const planEvents: PlanEvent[] = useMemo(
    () =>
      view.events.flatMap((e) => {
        const p = e.measured.position;
        const at = e.measured.trackTime ? displayAt(view.points, Date.parse(e.measured.trackTime)) : null;
        return p && at ? [{ key: `${e.recordingId}-${e.intervalIndex}`, event: e.event, east: at.east, north: at.north, label: `${LINK_EVENT_META[e.event].label}, ${e.recordingName} at ${e.atSec.toFixed(2)} s` }] : [];
      }),
    [view],
  );
  const chartEvents: ChartEvent[] = view.events.flatMap((e) =>
    e.measured.position && e.measured.trackTime ? [{ key: `${e.recordingId}-${e.intervalIndex}`, event: e.event, t: Date.parse(e.measured.trackTime), d: e.measured.position.groundDistanceM, label: `${LINK_EVENT_META[e.event].label} at ${formatMetresIn(e.measured.position.groundDistanceM, units)}` }] : [],
  );
  const maxHeight = Math.max(0, ...view.points.map((p) => p.h ?? 0));

  async function post(url: string, body: unknown) {
    const res = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    const out = await res.json().catch(() => null);
    if (!res.ok) throw new Error(out?.error?.message ?? `HTTP ${res.status}`);
    return out;
  }

  async function logRangeCheck(recordingId: string, intervalIndex: number) {
    setBusyKey(`${recordingId}-${intervalIndex}`);
    setMessage(null);
    try {
      await post(`/api/flights/${view.flightId}/track/range-checks`, { recordingId, intervalIndex });
      setMessage("Range check logged from the track.");
      await reload();
    } catch (err) {
      setMessage(`Not logged: ${(err as Error).message}`);
    } finally {
      setBusyKey(null);
    }
  }

  function seek(recordingId: string, atSec: number) {
    setRecId(recordingId);
    requestAnimationFrame(() => {
      if (video.current) {
        video.current.currentTime = atSec;
        setSec(atSec);
      }
    });
  }

  return (
    <div className="flex flex-col gap-6" data-testid="track-loaded">
      <dl className="grid grid-cols-1 gap-3 text-sm sm:grid-cols-3">
        <div>
          <dt className="text-ink-2">Track file</dt>
          <dd className="font-mono" data-testid="track-name">{view.track.originalName}</dd>
          <dd className="text-xs text-ink-2">
            {view.track.format.toUpperCase()}, {view.track.pointCount} points, {(view.track.sizeBytes / 1024).toFixed(1)} KiB
          </dd>
        </div>
        <div>
          <dt className="text-ink-2">Runs</dt>
          <dd className="font-mono text-xs">
            {view.track.startsAt.replace("T", " ").slice(0, 23)} to {view.track.endsAt.slice(11, 23)} UTC
          </dd>
          <dd className="text-xs text-ink-2">
            Imported {view.track.importedAt.slice(0, 10)}
            {view.track.importedBy ? ` by ${view.track.importedBy}` : ""}; write-once
          </dd>
        </div>
        <div>
          <dt className="text-ink-2">Fingerprint</dt>
          <dd>
            <HashText value={view.track.sha256} />
          </dd>
        </div>
      </dl>
      <p className="text-xs text-ink-2">
        Distances are measured from {view.launch.source === "flight" ? "the flight's launch point" : "the track's first point (the flight has no launch point)"} on the WGS84 ellipsoid; heights are{" "}
        {view.track.heightSource === "above_launch" ? "the track's heights above the launch" : view.track.heightSource === "elevation_minus_first" ? "the track's elevations less that of its first point" : "not in the track"}.
      </p>
      {view.warnings.length > 0 && (
        <ul className="flex flex-col gap-1 rounded-md border border-warn bg-warn-soft px-3 py-2 text-sm" data-testid="track-warnings">
          {view.warnings.map((w, i) => (
            <li key={i}>⚠ {w}</li>
          ))}
        </ul>
      )}

      <Alignment view={view} canAlign={canAlign} recId={recId} frame={frame} onSet={onView} />

      <div className="grid gap-6 lg:grid-cols-2">
        <div className="flex flex-col gap-2">
          {playable.length ? (
            <>
              <label className="flex items-center gap-2 text-sm">
                Recording
                <select className="rounded-md border border-line bg-paper px-2 py-1" value={recId ?? ""} onChange={(e) => setRecId(e.target.value)} data-testid="track-recording">
                  {playable.map((r) => (
                    <option key={r.id} value={r.id}>
                      {r.name}
                    </option>
                  ))}
                </select>
              </label>
              {/* the playable rendition keeps the recorder's clock: second s is frame slot s x fps */}
              <video ref={video} key={rec?.playableUrl ?? ""} src={rec?.playableUrl ?? undefined} controls preload="metadata" className="w-full rounded-md bg-black" data-testid="track-video" />
            </>
          ) : (
            <p className="text-sm text-ink-2">No recording of this flight is ready to play yet.</p>
          )}
          <div className="rounded-md border border-line px-3 py-2 text-sm" aria-live="polite" data-testid="track-readout">
            {rec && nowT !== null ? (
              here ? (
                <>
                  <p className="font-mono">
                    {time(new Date(nowT).toISOString())} · {sec.toFixed(2)} s{frame !== null ? `, frame ${frame}` : ""}
                  </p>
                  <p>
                    Ground distance <span className="font-mono" data-testid="readout-distance">{formatMetresIn(here.d, units)}</span>, height{" "}
                    <span className="font-mono">{here.h === null ? "unknown" : formatMetresIn(here.h, units)}</span>, slant range{" "}
                    <span className="font-mono">{here.h === null ? "unknown" : formatMetresIn(Math.hypot(here.d, here.h), units)}</span>
                  </p>
                  <p className="text-ink-2">Link: {TRACK_LINK_STYLE[here.state].word}</p>
                </>
              ) : (
                <p className="text-ink-2">This moment is outside the track or in a gap between its points.</p>
              )
            ) : (
              <p className="text-ink-2">Play a recording to see where the aircraft was.</p>
            )}
          </div>
        </div>
        <TrackPlan points={view.points} events={planEvents} aircraft={here ? { east: here.east, north: here.north } : null} units={units} />
      </div>
      <DistanceChart points={view.points} events={chartEvents} nowT={nowT} units={units} />
      <SafetyCautions heightAglM={maxHeight} />

      <section aria-labelledby="track-events-h" className="flex flex-col gap-2">
        <h3 id="track-events-h" className="text-base font-semibold">
          Distance at every link event
        </h3>
        {message && (
          <p role="status" className="text-sm" data-testid="track-message">
            {message}
          </p>
        )}
        {view.events.length === 0 ? (
          <p className="text-sm text-ink-2">The signal traces show no break-up, loss or return of the video (or no recording is processed yet).</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-sm tabular-nums" data-testid="track-events">
              <thead className="text-left text-ink-2">
                <tr>
                  <th className="py-1 pr-3 font-normal">Event</th>
                  <th className="py-1 pr-3 font-normal">Recording, time</th>
                  <th className="py-1 pr-3 font-normal">Track time</th>
                  <th className="py-1 pr-3 font-normal">Ground distance</th>
                  <th className="py-1 pr-3 font-normal">Height</th>
                  <th className="py-1 pr-3 font-normal">Slant range</th>
                  <th className="py-1 font-normal">Range check</th>
                </tr>
              </thead>
              <tbody>
                {view.events.map((e) => {
                  const p = e.measured.position;
                  const key = `${e.recordingId}-${e.intervalIndex}`;
                  return (
                    <tr key={key} className="border-t border-line align-top" data-testid="track-event-row">
                      <td className="py-1.5 pr-3">
                        <LinkEventMark event={e.event} />
                      </td>
                      <td className="py-1.5 pr-3">
                        <button type="button" className="text-lake underline" onClick={() => seek(e.recordingId, e.atSec)} disabled={!startOf(e.recordingId)}>
                          {e.recordingName}
                        </button>{" "}
                        <span className="font-mono">
                          {e.atSec.toFixed(2)} s, frame {e.atFrame}
                        </span>
                      </td>
                      <td className="py-1.5 pr-3 font-mono text-xs">{time(e.measured.trackTime)}</td>
                      {p ? (
                        <>
                          <td className="py-1.5 pr-3 font-mono">{formatMetresIn(p.groundDistanceM, units)}</td>
                          <td className="py-1.5 pr-3 font-mono">{p.heightM === null ? "unknown" : formatMetresIn(p.heightM, units)}</td>
                          <td className="py-1.5 pr-3 font-mono">{p.slantRangeM === null ? "unknown" : formatMetresIn(p.slantRangeM, units)}</td>
                        </>
                      ) : (
                        <td colSpan={3} className="py-1.5 pr-3 text-ink-2">
                          No position: {e.measured.reason}
                        </td>
                      )}
                      <td className="py-1.5">
                        {e.rangeCheckId ? (
                          <Link href="/range/checks" className="text-lake underline">
                            Logged
                          </Link>
                        ) : canAlign && p && p.heightM !== null ? (
                          <Button variant="secondary" busy={busyKey === key} onClick={() => void logRangeCheck(e.recordingId, e.intervalIndex)} data-testid="log-range-check">
                            Log range check
                          </Button>
                        ) : (
                          <span className="text-ink-2">—</span>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        )}
      </section>

      <section aria-labelledby="track-findings-h" className="flex flex-col gap-2">
        <h3 id="track-findings-h" className="text-base font-semibold">
          Distance at every finding
        </h3>
        {view.findings.length === 0 ? (
          <p className="text-sm text-ink-2">No findings on this flight&apos;s recordings yet.</p>
        ) : (
          <ul className="flex flex-col gap-1 text-sm">
            {view.findings.map((f) => (
              <li key={f.id} className="border-t border-line pt-1">
                <span className="font-medium capitalize">{f.severity}</span> · {f.recordingName} at <span className="font-mono">{f.startSec.toFixed(2)} s</span>
                {f.note ? ` · ${f.note.slice(0, 80)}` : ""} ·{" "}
                {f.measured.position ? (
                  <span className="font-mono">
                    {formatMetresIn(f.measured.position.groundDistanceM, units)} ground, height {f.measured.position.heightM === null ? "unknown" : formatMetresIn(f.measured.position.heightM, units)}, slant{" "}
                    {f.measured.position.slantRangeM === null ? "unknown" : formatMetresIn(f.measured.position.slantRangeM, units)} ({time(f.measured.trackTime)})
                  </span>
                ) : (
                  <span className="text-ink-2">no position: {f.measured.reason}</span>
                )}
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}

function Alignment({ view, canAlign, recId, frame, onSet }: { view: Loaded; canAlign: boolean; recId: string | null; frame: number | null; onSet: (v: View) => void }) {
  const a = view.alignment;
  const [pointNo, setPointNo] = useState<string>(String((view.takeOffPoint ?? 0) + 1));
  const [frameText, setFrameText] = useState<string>("");
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const pointIndex = Number(pointNo) - 1;
  const pointTime = Number.isInteger(pointIndex) && pointIndex >= 0 && pointIndex < view.pointTimes.length ? new Date(view.pointTimes[pointIndex]).toISOString() : null;

  async function set(body: unknown) {
    setBusy(true);
    setProblem(null);
    try {
      const res = await fetch(`/api/flights/${view.flightId}/track/alignment`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
      const out = await res.json().catch(() => null);
      if (!res.ok) {
        const fields = out?.error?.fields as Record<string, string[]> | undefined;
        throw new Error(fields ? Object.values(fields).flat().join("; ") : (out?.error?.message ?? `HTTP ${res.status}`));
      }
      onSet(out.view);
    } catch (err) {
      setProblem((err as Error).message);
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-col gap-3 rounded-md border border-line p-3" data-testid="track-alignment">
      <h3 className="text-base font-semibold">Alignment with the recordings</h3>
      {a ? (
        <>
          <p className="text-sm">
            Track clock = recorder clock <span className="font-mono" data-testid="alignment-offset">{a.offsetMs >= 0 ? "+" : "−"} {(Math.abs(a.offsetMs) / 1000).toFixed(3)} s</span>
            {a.stored ? (
              <span className="text-ink-2">
                {" "}
                · set {a.setAt?.replace("T", " ").slice(0, 19)} UTC{a.setBy ? ` by ${a.setBy}` : ""}
                {a.method === "frame_match" && a.frame !== null && a.pointIndex !== null ? ` (frame ${a.frame} matched to track point ${a.pointIndex + 1})` : " (file times accepted)"}
              </span>
            ) : (
              <span className="text-ink-2"> · proposed, not yet confirmed</span>
            )}
          </p>
          <p className={`text-sm ${a.method === "frame_match" ? "" : "text-warn"}`} data-testid="alignment-sureness">
            {a.description}
          </p>
        </>
      ) : (
        <p className="text-sm text-ink-2">No recording of this flight has a file time yet: match a frame to a track point.</p>
      )}
      {canAlign && (
        <form
          className="flex flex-wrap items-end gap-3 text-sm"
          onSubmit={(e) => {
            e.preventDefault();
            const f = frameText.trim() === "" ? frame : Number(frameText);
            void set({ method: "frame_match", recordingId: recId, frame: f, pointIndex });
          }}
        >
          <label className="flex flex-col gap-1">
            Frame of the recording in the player
            <input className="w-32 rounded-md border border-line bg-paper px-2 py-1 font-mono" inputMode="numeric" value={frameText} placeholder={frame === null ? "" : String(frame)} onChange={(e) => setFrameText(e.target.value)} data-testid="align-frame" />
          </label>
          <label className="flex flex-col gap-1">
            Matching track point (number)
            <input className="w-32 rounded-md border border-line bg-paper px-2 py-1 font-mono" inputMode="numeric" value={pointNo} onChange={(e) => setPointNo(e.target.value)} data-testid="align-point" />
          </label>
          <span className="pb-1 font-mono text-xs text-ink-2">{pointTime ? time(pointTime) : "no such point"}</span>
          <Button type="submit" busy={busy} disabled={!recId} data-testid="align-set">
            Match frame to point
          </Button>
          {a && !a.stored && (
            <Button type="button" variant="secondary" busy={busy} onClick={() => void set({ method: "file_times" })} data-testid="align-accept">
              Accept the proposal
            </Button>
          )}
        </form>
      )}
      {canAlign && (
        <p className="text-xs text-ink-2">
          Pause the player on a moment you can also find in the track (the take-off is suggested: point {view.takeOffPoint === null ? "—" : view.takeOffPoint + 1}), then match. The frame box takes the player&apos;s frame when left empty.
        </p>
      )}
      {problem && (
        <p role="alert" className="text-sm text-bad">
          {problem}
        </p>
      )}
    </div>
  );
}
