// Everything one report version prints, already worded and formatted: the PDF document only lays it out.
import type { Caution } from "@/lib/geo/cautions";
import type { Severity } from "@/lib/findings/severity-scale";
import type { Moment } from "@/lib/findings/describe-moment";
import type { FrameBox } from "@/db/schema/review";

export type ReportFinding = {
  number: number;
  id: string;
  severity: Severity;
  severityLabel: string;
  severityMeaning: string;
  nbiRating: number;
  nbiWord: string;
  category: string | null;
  note: string;
  recordingName: string;
  recordingSha256: string;
  start: Moment;
  end: Moment | null;
  position: string | null;
  distances: string | null;
  box: FrameBox | null;
  still: { storageKey: string; sha256: string | null; width: number | null; height: number | null } | null;
  stillMissing: string | null;
  markedBy: string | null;
  version: number;
};

export type ReportData = {
  organisationName: string;
  reportId: string;
  version: number;
  builtAt: string;
  timeZone: string;
  builtBy: string | null;
  job: { title: string; scope: string | null; status: string; dueDate: string | null };
  client: { name: string; contact: string | null };
  site: { name: string; address: string | null; coordinates: string | null; assetKind: string };
  crew: { role: string; name: string }[];
  flights: { flownOn: string; pilot: string | null; aircraft: string | null; launch: string | null; maxAltitude: string | null; notes: string | null; recordings: number }[];
  /** duration "HH:MM:SS.mmm" on the recorder's clock; signal: the stored figures in one line, null without a trace */
  recordings: { name: string; sha256: string; size: string; duration: string | null; signal: string | null; flownOn: string; uploadedAt: string }[];
  counts: { severity: Severity; label: string; nbiRating: number; nbiWord: string; count: number }[];
  findings: ReportFinding[];
  cautions: Caution[];
  preservation: readonly string[];
  /** the newest entry of the organisation's custody log when the report was built; null for an empty log */
  custodyHead: { seq: number; hash: string; occurredAt: string } | null;
};
