"use client";
// A recording's processing state in words ("Waiting", "Processing 42 %", "Ready", "Failed: no video
// track"), live, with the retry and the frame-rate correction for those allowed to re-process.
import { useState } from "react";
import { fetchJson } from "@/components/fetch-json";
import { Button } from "@/components/ui/button";
import { useProcessingProgress, type ProcessingProgress } from "./use-processing-progress";

export function ProcessingStatus({
  initial,
  canReprocess = false,
  fps,
  onReady,
}: {
  initial: ProcessingProgress;
  canReprocess?: boolean;
  /** The rate the recording plays at now, for raw controller streams (editable). */
  fps?: { value: number; source: string } | null;
  onReady?: () => void;
}) {
  const [now, setNow] = useProcessingProgress(initial.id, initial);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fpsText, setFpsText] = useState(fps ? String(fps.value) : "");
  const [prevState, setPrevState] = useState(now.state);
  if (prevState !== now.state) {
    setPrevState(now.state);
    if (now.state === "ready") onReady?.();
  }

  const reprocess = async (body: { fps?: number } = {}) => {
    setBusy(true);
    setError(null);
    try {
      const res = await fetchJson<{ state: ProcessingProgress["state"]; progress: number }>(`/api/recordings/${now.id}/reprocess`, { method: "POST", json: body });
      setNow({ ...now, state: res.state, progress: res.progress, failureReason: null });
    } catch (e) {
      setError((e as Error).message);
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="flex flex-col gap-2 text-sm">
      {now.state === "waiting" && <p>Waiting to be processed</p>}
      {now.state === "processing" && (
        <div className="flex items-center gap-2">
          <span>Processing {now.progress} %</span>
          <div role="progressbar" aria-label="Processing" aria-valuemin={0} aria-valuemax={100} aria-valuenow={now.progress} className="h-2 w-40 overflow-hidden rounded bg-paper-2">
            <div className="h-full bg-lake" style={{ width: `${now.progress}%` }} />
          </div>
        </div>
      )}
      {now.state === "ready" && <p>Ready</p>}
      {now.state === "failed" && (
        <div className="flex flex-wrap items-center gap-2" role="alert">
          <span className="font-medium text-bad">Failed: {now.failureReason ?? "no reason recorded"}</span>
          {canReprocess && (
            <Button type="button" variant="secondary" busy={busy} onClick={() => reprocess()}>
              Retry processing
            </Button>
          )}
          <span className="text-xs text-ink-2">The original is kept unaltered.</span>
        </div>
      )}
      {canReprocess && fps && now.state !== "processing" && (
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            const value = Number(fpsText);
            if (!(value >= 1 && value <= 240)) return setError("A frame rate between 1 and 240 fps");
            void reprocess({ fps: value });
          }}
        >
          <label className="flex flex-col text-xs text-ink-2">
            Frame rate (fps), {fps.source === "recording-override" ? "set for this recording" : fps.source === "stream" ? "from the stream" : "organisation default"}
            <input
              type="number"
              min={1}
              max={240}
              step="0.001"
              inputMode="decimal"
              value={fpsText}
              onChange={(e) => setFpsText(e.target.value)}
              className="mt-1 w-28 rounded border border-line bg-paper px-2 py-1 font-mono tabular text-ink"
            />
          </label>
          <Button type="submit" variant="secondary" busy={busy} disabled={Number(fpsText) === fps.value}>
            Re-process at this rate
          </Button>
        </form>
      )}
      {error && <p className="text-bad" role="alert">{error}</p>}
    </div>
  );
}
