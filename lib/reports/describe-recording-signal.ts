// One line on a recording's signal for the report, from its stored figures (lib/recordings/recording-figures.ts):
// frame slots, lost ("at least N" when the count is a lower bound), breaking up, intact share, first
// degradation and longest loss, with the same frame times the review room shows.
import { describeLostFrames, type RecordingFigures } from "@/lib/recordings/recording-figures";
import { formatFrameClockTime } from "@/lib/timecode/format-frame-clock-time";
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import { reduceFrameRate } from "@/lib/timecode/frame-rate";

export function describeRecordingDuration(figures: RecordingFigures | null, durationSec: number | null): string | null {
  const sec = figures?.durationSeconds ?? durationSec;
  return sec ? formatClockTime(sec) : null;
}

export function describeRecordingSignal(figures: RecordingFigures | null): string | null {
  if (!figures || !figures.signalKnown) return null;
  const rate = reduceFrameRate(figures.frameRate);
  const parts = [`${figures.frameSlots} frame slots`];
  if (figures.framesLost > 0 || figures.framesLostIsLowerBound) parts.push(`${describeLostFrames(figures)} lost`);
  if (figures.framesDamaged > 0) parts.push(`${figures.framesDamaged} breaking up`);
  if (figures.intactShare !== null) parts.push(`${(figures.intactShare * 100).toFixed(1)} % intact`);
  const first = figures.firstDegradationSlot !== null ? `first degradation at ${formatFrameClockTime(figures.firstDegradationSlot, rate)} (frame ${figures.firstDegradationSlot})` : "no degradation";
  const longest = figures.longestLossSeconds > 0 ? `; longest loss ${figures.longestLossSeconds.toFixed(3)} s` : "";
  return `Signal: ${parts.join(", ")}; ${first}${longest}`;
}
