"use client";
// Live processing progress for one recording, from the server-sent event stream of
// GET /api/recordings/:id/progress (app/api/recordings/[id]/progress/route.ts): the page shows each
// change as the worker reports it and refreshes itself once, when the recording is ready or failed.
// EventSource reconnects by itself when the stream ends early (WHATWG HTML, "Server-sent events").
import { useEffect, useState } from "react";

export type LiveProgress = { state: "waiting" | "processing" | "ready" | "failed"; progress: number; failureReason: string | null };

export function useProcessingProgress(recordingId: string, initial: LiveProgress, onFinal: () => void): LiveProgress {
  const [live, setLive] = useState<LiveProgress>(initial);
  const final = initial.state === "ready" || initial.state === "failed";
  useEffect(() => {
    if (final) return;
    const source = new EventSource(`/api/recordings/${recordingId}/progress`);
    source.addEventListener("progress", (e) => {
      const next = JSON.parse((e as MessageEvent<string>).data) as LiveProgress;
      setLive({ state: next.state, progress: next.progress, failureReason: next.failureReason });
      if (next.state === "ready" || next.state === "failed") {
        source.close();
        onFinal();
      }
    });
    return () => source.close();
    // onFinal is a fresh function on every render; the stream depends only on the recording
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [recordingId, final]);
  return live;
}
