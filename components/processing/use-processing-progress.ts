"use client";
// Live processing state of a recording: server-sent events from /api/recordings/:id/progress while it
// waits or is processed (EventSource reconnects by itself), nothing once it is ready or failed.
import { useEffect, useState } from "react";

export type ProcessingProgress = {
  id: string;
  state: "waiting" | "processing" | "ready" | "failed";
  progress: number;
  failureReason: string | null;
  processedAt: string | null;
};

export function useProcessingProgress(recordingId: string, initial: ProcessingProgress) {
  const [now, setNow] = useState(initial);
  const settled = now.state === "ready" || now.state === "failed";
  useEffect(() => {
    if (settled) return;
    const source = new EventSource(`/api/recordings/${recordingId}/progress`);
    source.addEventListener("progress", (e) => {
      const next = JSON.parse((e as MessageEvent<string>).data) as ProcessingProgress;
      setNow(next);
      if (next.state === "ready" || next.state === "failed") source.close();
    });
    return () => source.close();
  }, [recordingId, settled]);
  return [now, setNow] as const;
}
