"use client";
// The box of a finding on the frame: shown over the picture, and drawn with a pointer drag when
// drawing is on. Stored as fractions of the frame, so it fits the full-resolution still as well.
import { useRef, useState } from "react";
import type { FrameBox } from "@/db/schema/review";

const clamp = (v: number) => Math.min(1, Math.max(0, v));
const round = (v: number) => Math.round(v * 10000) / 10000;

export function BoxOverlay({ box, drawing, onDrawn }: { box: FrameBox | null; drawing: boolean; onDrawn(box: FrameBox): void }) {
  const area = useRef<HTMLDivElement>(null);
  const [drag, setDrag] = useState<{ x0: number; y0: number; x1: number; y1: number } | null>(null);
  const at = (e: React.PointerEvent) => {
    const r = area.current!.getBoundingClientRect();
    return { x: clamp((e.clientX - r.left) / r.width), y: clamp((e.clientY - r.top) / r.height) };
  };
  const shown: FrameBox | null = drag
    ? { x: Math.min(drag.x0, drag.x1), y: Math.min(drag.y0, drag.y1), w: Math.abs(drag.x1 - drag.x0), h: Math.abs(drag.y1 - drag.y0) }
    : box;
  return (
    <div
      ref={area}
      data-testid="box-overlay"
      className={`absolute inset-0 ${drawing ? "pointer-events-auto cursor-crosshair" : ""}`}
      onPointerDown={(e) => {
        if (!drawing) return;
        e.currentTarget.setPointerCapture(e.pointerId);
        const p = at(e);
        setDrag({ x0: p.x, y0: p.y, x1: p.x, y1: p.y });
      }}
      onPointerMove={(e) => drag && setDrag({ ...drag, x1: at(e).x, y1: at(e).y })}
      onPointerUp={() => {
        if (!drag) return;
        const b = { x: round(Math.min(drag.x0, drag.x1)), y: round(Math.min(drag.y0, drag.y1)), w: round(Math.abs(drag.x1 - drag.x0)), h: round(Math.abs(drag.y1 - drag.y0)) };
        setDrag(null);
        // a click without a drag is not a box
        if (b.w > 0.005 && b.h > 0.005) onDrawn({ ...b, w: Math.min(b.w, round(1 - b.x)), h: Math.min(b.h, round(1 - b.y)) });
      }}
    >
      {drawing && (
        <p className="absolute left-2 top-2 rounded bg-ink/80 px-2 py-1 text-xs text-white">Drag on the picture to draw the box · Esc to stop</p>
      )}
      {shown && (
        <div
          data-testid="finding-box"
          className="absolute border-2 border-white outline outline-1 outline-black"
          style={{ left: `${shown.x * 100}%`, top: `${shown.y * 100}%`, width: `${shown.w * 100}%`, height: `${shown.h * 100}%` }}
        />
      )}
    </div>
  );
}
