// Where the reviewer is, in the three notations Cairn uses (lib/findings/describe-moment.ts), and how
// long the recording is. Frame numbers count the recorder's frame slots from 0, lost ones included
// (the rendition holds the frame before a loss for the loss's length), so "frame 151 of 360, 45 lost"
// means slot 151 of slots 0..359, 45 of which never arrived.
import { describeMoment } from "@/lib/findings/describe-moment";
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import type { FrameRate } from "@/lib/timecode/frame-rate";
import { describeFrameCount } from "./describe-frame-count";

export function TimecodeReadout({
  frame,
  rate,
  frameCount,
  fps,
  playbackRate,
  durationSec,
  lost,
  linkState = null,
}: {
  frame: number;
  rate: FrameRate;
  frameCount: number;
  fps: number;
  playbackRate: number;
  durationSec: number;
  lost: { frames: number; isLowerBound: boolean } | null;
  /** the link's state at this frame slot, from the signal trace */
  linkState?: "intact" | "damaged" | "lost" | null;
}) {
  const m = describeMoment(frame, rate);
  return (
    <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1 font-mono tabular" aria-live="off">
      <span className="text-xl font-medium" title="Clock time of this frame on the recorder's clock, HH:MM:SS.mmm">
        <span data-testid="clock-time">{m.clock}</span>
        <span className="text-sm text-ink-2" data-testid="duration">
          {" "}
          / {formatClockTime(durationSec)}
        </span>
      </span>
      <span className="text-sm" data-testid="frame-number" title={`Frames are the recorder's frame slots, numbered 0 to ${frameCount - 1}; lost frames keep their place`}>
        frame {m.frame} <span className="text-ink-2">{describeFrameCount(frameCount, lost)}</span>
      </span>
      <span className="text-sm" data-testid="smpte" title={m.smpte?.includes(";") ? "SMPTE timecode, drop-frame" : "SMPTE timecode"}>
        {m.smpte ?? "no SMPTE label at this rate"}
      </span>
      {linkState === "lost" && (
        <span className="rounded border border-bad bg-bad-soft px-1.5 font-sans text-xs" data-testid="frame-link-state" title="This frame never reached the recorder; the player holds the last frame before the loss">
          <span aria-hidden>▲ </span>Video lost here: last frame held
        </span>
      )}
      {linkState === "damaged" && (
        <span className="rounded border border-line px-1.5 font-sans text-xs" data-testid="frame-link-state" title="Slices of this frame were missing or scrambled, or it was predicted from a lost frame">
          <span aria-hidden>● </span>Picture breaking up
        </span>
      )}
      <span className="text-xs text-ink-2">
        {Number.isInteger(fps) ? fps : fps.toFixed(3)} fps · speed {playbackRate}×
      </span>
    </div>
  );
}
