// Finds the stored file a media URL names, inside one organisation only: another organisation's
// file, a deleted recording's file or one not produced yet are all simply "not found".
import "server-only";
import { and, eq, inArray, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { jobs, recordings, renditions, reports, stills } from "@/db/schema";
import { mediaContentType } from "./media-content-type";
import type { MediaFile, MediaTarget } from "./media-file";

const baseName = (key: string) => key.slice(key.lastIndexOf("/") + 1);
const stem = (name: string) => name.replace(/\.[^.]*$/, "") || name;
const safeName = (s: string) => s.replace(/[^\p{L}\p{N}._ -]+/gu, "-").replace(/\s+/g, " ").trim().slice(0, 80) || "file";

export async function resolveMediaFile(organisationId: string, target: MediaTarget): Promise<MediaFile | null> {
  switch (target.kind) {
    case "recording-file": {
      const rows = await db()
        .select({
          id: renditions.id,
          storageKey: renditions.storageKey,
          mimeType: renditions.mimeType,
          sha256: renditions.sha256,
          updatedAt: renditions.updatedAt,
          jobId: recordings.jobId,
          originalName: recordings.originalName,
        })
        .from(renditions)
        .innerJoin(recordings, eq(recordings.id, renditions.recordingId))
        .where(
          and(
            eq(renditions.recordingId, target.recordingId),
            eq(renditions.organisationId, organisationId),
            eq(recordings.organisationId, organisationId),
            isNull(recordings.deletedAt),
          ),
        );
      const r = rows.find((row) => baseName(row.storageKey) === target.file);
      if (!r) return null;
      return {
        kind: "rendition",
        id: r.id,
        organisationId,
        storageKey: r.storageKey,
        contentType: mediaContentType(r.mimeType, target.file),
        sha256: r.sha256,
        recordingId: target.recordingId,
        jobId: r.jobId,
        findingId: null,
        reportId: null,
        downloadName: `${safeName(stem(r.originalName))}-${target.file}`,
        updatedAt: r.updatedAt,
      };
    }
    case "still": {
      const [s] = await db()
        .select({
          id: stills.id,
          storageKey: stills.storageKey,
          sha256: stills.sha256,
          updatedAt: stills.updatedAt,
          recordingId: stills.recordingId,
          findingId: stills.findingId,
          frameNumber: stills.frameNumber,
          jobId: recordings.jobId,
          originalName: recordings.originalName,
        })
        .from(stills)
        .innerJoin(recordings, eq(recordings.id, stills.recordingId))
        .where(
          and(
            eq(stills.id, target.stillId),
            eq(stills.organisationId, organisationId),
            eq(recordings.organisationId, organisationId),
            eq(stills.state, "ready"),
            isNull(recordings.deletedAt),
          ),
        );
      if (!s?.storageKey) return null;
      return {
        kind: "still",
        id: s.id,
        organisationId,
        storageKey: s.storageKey,
        contentType: "image/jpeg",
        sha256: s.sha256,
        recordingId: s.recordingId,
        jobId: s.jobId,
        findingId: s.findingId,
        reportId: null,
        downloadName: `${safeName(stem(s.originalName))}-frame-${s.frameNumber}.jpg`,
        updatedAt: s.updatedAt,
      };
    }
    case "report": {
      const [r] = await db()
        .select({
          id: reports.id,
          storageKey: reports.storageKey,
          sha256: reports.sha256,
          updatedAt: reports.updatedAt,
          version: reports.version,
          jobId: reports.jobId,
          jobTitle: jobs.title,
        })
        .from(reports)
        .innerJoin(jobs, eq(jobs.id, reports.jobId))
        .where(
          and(
            eq(reports.id, target.reportId),
            eq(reports.organisationId, organisationId),
            eq(jobs.organisationId, organisationId),
            inArray(reports.state, ["ready", "approved"]),
          ),
        );
      if (!r?.storageKey) return null;
      return {
        kind: "report",
        id: r.id,
        organisationId,
        storageKey: r.storageKey,
        contentType: "application/pdf",
        sha256: r.sha256,
        recordingId: null,
        jobId: r.jobId,
        findingId: null,
        reportId: r.id,
        downloadName: `Inspection report - ${safeName(r.jobTitle)} - v${r.version}.pdf`,
        updatedAt: r.updatedAt,
      };
    }
  }
}
