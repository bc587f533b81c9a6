// Plain words for custody event types, shown beside (never instead of) the stored type.
import type { CustodyEventType } from "@/lib/custody/record-custody-event";

export const CUSTODY_EVENT_LABELS: Record<CustodyEventType, string> = {
  upload: "Uploaded",
  duplicate_upload: "Uploaded again (same bytes)",
  processing: "Processed",
  derived: "Derived file made",
  view: "Viewed",
  download: "Downloaded",
  share: "Shared with a client",
  share_open: "Share link opened",
  revoke: "Share link revoked",
  finding_created: "Finding marked",
  finding_updated: "Finding edited",
  finding_deleted: "Finding removed",
  report_built: "Report built",
  report_approved: "Report approved",
  hold_set: "Legal hold set",
  hold_released: "Legal hold released",
  deletion_refused: "Deletion refused",
  deletion: "Files deleted",
  package_built: "Evidence package built",
  disposal_refused: "Disposal refused",
  disposal: "Disposed of (retention ended)",
  track_imported: "Flight track imported",
  track_aligned: "Flight track aligned with the recordings",
};

export const custodyEventLabel = (t: string) => CUSTODY_EVENT_LABELS[t as CustodyEventType] ?? t;
