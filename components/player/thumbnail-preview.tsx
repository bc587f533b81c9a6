"use client";
// Scrub-thumbnail preview: while the pointer is over the progress bar, the sprite tile of that moment
// (from the WebVTT thumbnail track) floats above it. The track is fetched once; tiles are shown by
// offsetting the sprite as a background, so the sprite image loads once too.
import { useEffect, useState, type RefObject } from "react";
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import { cueAt, parseThumbnailVtt, type ThumbnailCue } from "./parse-thumbnail-vtt";
import type { Player } from "./review-player";

const TILE_MAX_WIDTH = 200; // px on screen

export function ThumbnailPreview({ player, trackUrl, durationSec, container }: { player: Player; trackUrl: string; durationSec: number; container: RefObject<HTMLDivElement | null> }) {
  const [cues, setCues] = useState<ThumbnailCue[]>([]);
  const [hover, setHover] = useState<{ left: number; bottom: number; cue: ThumbnailCue; seconds: number } | null>(null);

  useEffect(() => {
    let cancelled = false;
    fetch(trackUrl, { credentials: "same-origin" })
      .then((r) => (r.ok ? r.text() : Promise.reject(new Error(`track ${r.status}`))))
      .then((text) => !cancelled && setCues(parseThumbnailVtt(text, new URL(trackUrl, window.location.href).toString())))
      .catch(() => !cancelled && setCues([]));
    return () => {
      cancelled = true;
    };
  }, [trackUrl]);

  useEffect(() => {
    if (!cues.length) return;
    const progress = player.getChild("ControlBar")?.getChild("ProgressControl");
    const bar = progress?.getChild("SeekBar")?.el() as HTMLElement | undefined;
    const area = progress?.el() as HTMLElement | undefined;
    if (!bar || !area) return;
    const move = (e: PointerEvent) => {
      const b = bar.getBoundingClientRect();
      const c = container.current?.getBoundingClientRect();
      if (!c || b.width <= 0) return;
      const fraction = Math.min(1, Math.max(0, (e.clientX - b.left) / b.width));
      const seconds = fraction * durationSec;
      const cue = cueAt(cues, seconds * 1000);
      if (!cue) return setHover(null);
      setHover({ left: e.clientX - c.left, bottom: c.bottom - b.top + 12, cue, seconds });
    };
    const leave = () => setHover(null);
    area.addEventListener("pointermove", move);
    area.addEventListener("pointerleave", leave);
    return () => {
      area.removeEventListener("pointermove", move);
      area.removeEventListener("pointerleave", leave);
    };
  }, [cues, player, durationSec, container]);

  if (!hover) return null;
  const { cue } = hover;
  const scale = Math.min(1, TILE_MAX_WIDTH / cue.w);
  const w = cue.w * scale;
  const h = cue.h * scale;
  const maxLeft = (container.current?.clientWidth ?? w) - w / 2;
  const left = Math.min(Math.max(w / 2, hover.left), maxLeft);
  return (
    <div
      data-testid="scrub-thumbnail"
      className="pointer-events-none absolute z-20 -translate-x-1/2 rounded border border-white bg-black shadow-lg"
      style={{ left, bottom: hover.bottom, width: w + 2 }}
    >
      <div style={{ width: w, height: h, overflow: "hidden" }} role="img" aria-label={`Preview at ${formatClockTime(hover.seconds)}`}>
        {/* the tile at its own size, scaled as a whole: the sprite's size need not be known */}
        <div
          style={{
            width: cue.w,
            height: cue.h,
            backgroundImage: `url("${cue.url}")`,
            backgroundPosition: `-${cue.x}px -${cue.y}px`,
            backgroundRepeat: "no-repeat",
            transform: `scale(${scale})`,
            transformOrigin: "top left",
          }}
        />
      </div>
      <p className="bg-black px-1 text-center font-mono text-[11px] text-white">{formatClockTime(hover.seconds)}</p>
    </div>
  );
}
