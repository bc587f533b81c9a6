// The signal trace in a few figures: share of intact frames, when the picture first broke up or the
// video was first lost, the longest loss, and the lost and damaged frame counts ("at least N" when the
// count is a lower bound). Used for one recording and for a whole flight. The figures never contradict
// each other on screen: with any loss or damage, "first degradation" is never "none".
import { formatClockTimeMs } from "@/lib/timecode/format-clock-time";

/**
 * A moment given in seconds, labelled as the player labels frames: the first whole millisecond at or
 * after it (lib/timecode/format-frame-clock-time.ts rounds up for the same reason), so frame 40 at
 * 30 fps reads 00:00:01.334 here as in the readout, not 00:00:01.333.
 */
export function formatMomentSec(sec: number): string {
  return formatClockTimeMs(Math.max(0, Math.ceil(sec * 1000 - 1e-6)));
}
import { describeLost } from "@/components/player/describe-frame-count";

/** `clockLabel`: the moment as the player labels it (a frame time), when known; else seconds rounded. */
export function describeFirstDegradation(firstDegradationSec: number | null, anyTrouble: boolean, scope: "recording" | "flight", clockLabel?: string): string {
  if (firstDegradationSec !== null) return `at ${clockLabel ?? `${formatMomentSec(firstDegradationSec)}${scope === "flight" ? " (flight time)" : ""}`}`;
  return anyTrouble ? (scope === "flight" ? "time not known (a gap between files is of unknown length)" : "time not known") : "none";
}

export function TraceSummaryLine({
  intactShare,
  firstDegradationSec,
  longestLossSec,
  lost,
  damagedFrames,
  firstDegradationLabel,
  longestLossEstimated = false,
  scope = "recording",
}: {
  intactShare: number | null;
  firstDegradationSec: number | null;
  longestLossSec: number;
  lost?: { frames: number; isLowerBound: boolean } | null;
  damagedFrames?: number | null;
  /** the first degradation's frame time (lib/timecode/format-frame-clock-time.ts), as the player shows it */
  firstDegradationLabel?: string;
  /** the longest loss is an outage between files, its length estimated from the recorder's file times */
  longestLossEstimated?: boolean;
  scope?: "recording" | "flight";
}) {
  const anyTrouble = longestLossSec > 0 || (intactShare !== null && intactShare < 1) || (lost?.frames ?? 0) > 0 || (damagedFrames ?? 0) > 0;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm sm:grid-cols-[auto_auto_auto_auto_auto_auto]" data-testid="trace-summary">
      <dt className="text-ink-2">Intact</dt>
      <dd className="font-mono tabular">{intactShare === null ? "no trace" : `${(intactShare * 100).toFixed(1)} % of ${scope === "flight" ? "the flight's time" : "frames"}`}</dd>
      <dt className="text-ink-2">First degradation</dt>
      <dd className="font-mono tabular" data-testid="first-degradation">
        {describeFirstDegradation(firstDegradationSec, anyTrouble, scope, firstDegradationLabel)}
      </dd>
      <dt className="text-ink-2">Longest loss</dt>
      <dd className="font-mono tabular">{longestLossSec > 0 ? `${longestLossEstimated ? "about " : ""}${longestLossSec.toFixed(3)} s${longestLossEstimated ? " (between files, estimated)" : ""}` : "none"}</dd>
      {lost && (
        <>
          <dt className="text-ink-2">Frames lost</dt>
          <dd className="font-mono tabular" data-testid="lost-frames">
            {lost.frames > 0 || lost.isLowerBound ? describeLost(lost).replace(/ lost$/, "") : "none"}
          </dd>
        </>
      )}
      {damagedFrames !== undefined && damagedFrames !== null && (
        <>
          <dt className="text-ink-2">Frames breaking up</dt>
          <dd className="font-mono tabular">{damagedFrames > 0 ? damagedFrames : "none"}</dd>
        </>
      )}
    </dl>
  );
}
