// The signal trace in three figures: share of intact frames, when the link first degraded, and the
// longest loss. Used for one recording and for a whole flight.
import { formatClockTime } from "@/lib/timecode/format-clock-time";

export function TraceSummaryLine({
  intactShare,
  firstDegradationSec,
  longestLossSec,
  scope = "recording",
}: {
  intactShare: number | null;
  firstDegradationSec: number | null;
  longestLossSec: number;
  scope?: "recording" | "flight";
}) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm sm:grid-cols-[auto_auto_auto_auto_auto_auto]">
      <dt className="text-ink-2">Intact</dt>
      <dd className="font-mono tabular">{intactShare === null ? "no trace" : `${(intactShare * 100).toFixed(1)} % of frames`}</dd>
      <dt className="text-ink-2">First degradation</dt>
      <dd className="font-mono tabular">{firstDegradationSec === null ? "none" : `at ${formatClockTime(firstDegradationSec)}${scope === "flight" ? " (flight time)" : ""}`}</dd>
      <dt className="text-ink-2">Longest loss</dt>
      <dd className="font-mono tabular">{longestLossSec > 0 ? `${longestLossSec.toFixed(3)} s` : "none"}</dd>
    </dl>
  );
}
