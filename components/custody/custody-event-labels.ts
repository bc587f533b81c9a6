// Plain words for custody event types, kinds of evidence and derived files: what the custody pages show
// (the stored words stay in the exports).
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

/** Plain words for the kinds of evidence an event can be about. */
export const EVIDENCE_LABELS: Record<string, string> = {
  recording: "Recording",
  rendition: "Derived file",
  still: "Still",
  finding: "Finding",
  report: "Report",
  share_link: "Share link",
  job: "Job",
  track: "Flight track",
};

/** Plain words for the files Cairn derives from a recording (db/schema/enums.ts rendition_kind). */
export const FILE_KIND_LABELS: Record<string, string> = {
  playable: "Playable copy",
  poster: "Poster picture",
  sprite: "Thumbnail picture sheet",
  thumbnails_vtt: "Thumbnail timing track",
};

/** Stored purposes that are internal words, in plain words; any other purpose is already a sentence. */
const PURPOSE_LABELS: Record<string, string> = {
  ...FILE_KIND_LABELS,
  "signal trace": "Signal trace of the video link",
  "finding still": "Still picture for a finding",
  "original download": "Original downloaded",
  "report download": "Report PDF downloaded",
  "derive playable video, stills, thumbnails and signal trace": "Made the playable copy, pictures, thumbnails and signal trace",
};

export const custodyPurposeLabel = (p: string | null) => (p === null ? null : (PURPOSE_LABELS[p] ?? p));

/** What an event is about, in words a reader knows it by: never an internal kind or a bare id. */
export function describeCustodySubject(e: { evidenceType: string; fileKind: string | null; recordingName: string | null; jobTitle: string | null }): string {
  const rec = e.recordingName ? `“${e.recordingName}”` : null;
  switch (e.evidenceType) {
    case "recording":
      return rec ? `Recording ${rec}` : "A recording";
    case "rendition":
      return `${(e.fileKind && FILE_KIND_LABELS[e.fileKind]) || "Derived file"}${rec ? ` of ${rec}` : ""}`;
    case "still":
      return `Still picture${rec ? ` from ${rec}` : ""}`;
    case "finding":
      return `Finding${rec ? ` in ${rec}` : ""}`;
    case "report":
      return e.jobTitle ? `Report of “${e.jobTitle}”` : "Report";
    case "share_link":
      return e.jobTitle ? `Share link of “${e.jobTitle}”` : "Share link";
    case "job":
      return e.jobTitle ? `Job “${e.jobTitle}”` : "Job";
    default:
      return EVIDENCE_LABELS[e.evidenceType] ?? "Evidence";
  }
}
