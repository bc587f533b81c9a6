// What the media route can serve, and what it learns about a file before serving it.

/** What a media URL names. */
export type MediaTarget =
  | { kind: "recording-file"; recordingId: string; file: string } // a rendition, by its stored file name
  | { kind: "still"; stillId: string }
  | { kind: "report"; reportId: string };

/** A stored file, resolved inside one organisation, with the evidence it belongs to. */
export type MediaFile = {
  kind: "rendition" | "still" | "report" | "evidence_package";
  id: string;
  organisationId: string;
  storageKey: string;
  contentType: string;
  sha256: string | null;
  recordingId: string | null;
  jobId: string;
  findingId: string | null;
  reportId: string | null;
  /** the name a download is saved under */
  downloadName: string;
  updatedAt: Date;
};

/** Who is opening a file: a signed-in member of the organisation. */
export type MediaPrincipal = { organisationId: string; userId: string; role: "owner" | "pilot" | "reviewer" | "client"; clientIds: string[] | null };
