// Where the reviewer is, in the three notations Cairn uses (lib/findings/describe-moment.ts).
import { describeMoment } from "@/lib/findings/describe-moment";
import type { FrameRate } from "@/lib/timecode/frame-rate";

export function TimecodeReadout({ frame, rate, frameCount, fps, playbackRate }: { frame: number; rate: FrameRate; frameCount: number; fps: number; playbackRate: number }) {
  const m = describeMoment(frame, rate);
  return (
    <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1 font-mono tabular" aria-live="off">
      <span className="text-xl font-medium" data-testid="clock-time" title="Clock time of this frame, HH:MM:SS.mmm">
        {m.clock}
      </span>
      <span className="text-sm" data-testid="frame-number">
        frame {m.frame} <span className="text-ink-2">of {frameCount - 1}</span>
      </span>
      <span className="text-sm" data-testid="smpte" title={m.smpte?.includes(";") ? "SMPTE timecode, drop-frame" : "SMPTE timecode"}>
        {m.smpte ?? "no SMPTE label at this rate"}
      </span>
      <span className="text-xs text-ink-2">
        {Number.isInteger(fps) ? fps : fps.toFixed(3)} fps · speed {playbackRate}×
      </span>
    </div>
  );
}
