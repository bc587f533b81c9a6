// Shapes of the range-check API's answers as the browser receives them (dates as ISO text).
import type { LinkEvent } from "@/lib/range-checks/link-events";
import type { RangeCheckMeasures } from "@/lib/range-checks/range-check-measures";

export type RangeCheckRow = RangeCheckMeasures & {
  id: string;
  flightId: string;
  recordingId: string | null;
  recordingName: string | null;
  flownOn: string;
  archivedAt: string | null;
  createdAt: string;
};

export type TraceEventItem = {
  intervalIndex: number;
  event: LinkEvent;
  atSec: number;
  atFrame: number;
  state: "intact" | "damaged" | "lost";
  durationSec: number;
  recordingId: string;
  recordingName: string;
  sequenceIndex: number;
  rangeCheckId: string | null;
};

export type TraceEventsAnswer = {
  items: TraceEventItem[];
  total: number;
  tracedRecordings: number;
  prefill: { heightAglM: number | null; aircraft: string | null; hasLaunchPoint: boolean };
};
