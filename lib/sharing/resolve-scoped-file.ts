// The stored file a media grant names, found only among what the link's scope holds right now.
// A recording link asking for another recording's rendition, still, sprite or original gets null,
// exactly like an id that does not exist.
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings, renditions, stills } from "@/db/schema";
import type { MediaGrantKind } from "./media-grant";
import { loadShareScope, type ScopeLink, type ScopeRecording } from "./share-scope";

export type ScopedFile = {
  storageKey: string;
  contentType: string;
  /** the name a download is saved under; inline files carry none */
  downloadName: string | null;
  sha256: string | null;
  evidence: { type: "recording" | "rendition" | "still" | "report"; id: string; recordingId: string | null; originalSha256: string | null; originalSize: number | null };
};

const RENDITION_KIND = { playable: "playable", poster: "poster", sprite: "sprite", thumbnails: "thumbnails_vtt" } as const;

async function originalKeyOf(organisationId: string, rec: ScopeRecording): Promise<string | null> {
  if (rec.storageKey) return rec.storageKey;
  if (!rec.duplicateOfId) return null;
  // a duplicate upload keeps no bytes of its own: the first upload of the same bytes holds them
  const [first] = await db()
    .select({ storageKey: recordings.storageKey, sha256: recordings.sha256 })
    .from(recordings)
    .where(and(eq(recordings.id, rec.duplicateOfId), eq(recordings.organisationId, organisationId)));
  return first && first.sha256 === rec.sha256 ? first.storageKey : null;
}

export async function resolveScopedFile(link: ScopeLink, kind: MediaGrantKind, resourceId: string): Promise<ScopedFile | null> {
  const scope = await loadShareScope(link);
  switch (kind) {
    case "playable":
    case "poster":
    case "sprite":
    case "thumbnails": {
      const rec = scope.recordings.find((r) => r.id === resourceId);
      if (!rec) return null;
      const [r] = await db()
        .select({ id: renditions.id, storageKey: renditions.storageKey, mimeType: renditions.mimeType, sha256: renditions.sha256 })
        .from(renditions)
        .where(and(eq(renditions.organisationId, link.organisationId), eq(renditions.recordingId, rec.id), eq(renditions.kind, RENDITION_KIND[kind])));
      if (!r) return null;
      return {
        storageKey: r.storageKey,
        contentType: r.mimeType,
        downloadName: null,
        sha256: r.sha256,
        evidence: { type: "rendition", id: r.id, recordingId: rec.id, originalSha256: rec.sha256, originalSize: rec.sizeBytes },
      };
    }
    case "still": {
      const finding = scope.findings.find((f) => f.stillId === resourceId);
      if (!finding) return null;
      const [s] = await db()
        .select({ storageKey: stills.storageKey, sha256: stills.sha256 })
        .from(stills)
        .where(and(eq(stills.organisationId, link.organisationId), eq(stills.id, resourceId), eq(stills.state, "ready")));
      const rec = scope.recordings.find((r) => r.id === finding.recordingId);
      if (!s?.storageKey || !rec) return null;
      return {
        storageKey: s.storageKey,
        contentType: "image/jpeg",
        downloadName: null,
        sha256: s.sha256,
        evidence: { type: "still", id: resourceId, recordingId: rec.id, originalSha256: rec.sha256, originalSize: rec.sizeBytes },
      };
    }
    case "original": {
      if (!link.allowOriginals) return null;
      const rec = scope.recordings.find((r) => r.id === resourceId);
      if (!rec) return null;
      const key = await originalKeyOf(link.organisationId, rec);
      if (!key) return null;
      return {
        storageKey: key,
        contentType: "application/octet-stream",
        downloadName: rec.originalName,
        sha256: rec.sha256,
        evidence: { type: "recording", id: rec.id, recordingId: rec.id, originalSha256: rec.sha256, originalSize: rec.sizeBytes },
      };
    }
    case "report": {
      const rep = scope.report;
      if (!rep || rep.id !== resourceId || !rep.storageKey) return null;
      return {
        storageKey: rep.storageKey,
        contentType: "application/pdf",
        downloadName: `inspection-report-v${rep.version}.pdf`,
        sha256: rep.sha256,
        evidence: { type: "report", id: rep.id, recordingId: null, originalSha256: rep.sha256, originalSize: rep.sizeBytes },
      };
    }
  }
}
