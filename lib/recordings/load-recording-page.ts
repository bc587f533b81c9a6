// Everything the recording page needs on first paint, read inside the member's organisation:
// the recording and its timing, its derived files as media-route URLs, and the other files of its
// flight in recorder order (the signal trace and flight timeline fetch their own data).
import "server-only";
import { and, asc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { recordingFileUrl } from "@/lib/media-serving/media-urls";
import { readRecordingFigures } from "@/lib/recordings/recording-figures";
import { recordingTiming } from "./recording-frame-rate";

const fileOf = (key: string) => key.slice(key.lastIndexOf("/") + 1);

export type RecordingPageData = NonNullable<Awaited<ReturnType<typeof loadRecordingPage>>>;

export async function loadRecordingPage(organisationId: string, recordingId: string) {
  const [row] = await db()
    .select({
      id: s.recordings.id,
      name: s.recordings.originalName,
      sha256: s.recordings.sha256,
      sizeBytes: s.recordings.sizeBytes,
      kind: s.recordings.kind,
      state: s.recordings.state,
      progress: s.recordings.progress,
      failureReason: s.recordings.failureReason,
      fpsOverride: s.recordings.fpsOverride,
      durationSec: s.recordings.durationSec,
      facts: s.recordings.facts,
      figures: s.recordings.figures,
      jobId: s.recordings.jobId,
      jobTitle: s.jobs.title,
      flightId: s.recordings.flightId,
      flownOn: s.flights.flownOn,
      assetKind: s.sites.assetKind,
      defaultFps: s.organisations.defaultControllerFps,
    })
    .from(s.recordings)
    .innerJoin(s.jobs, eq(s.jobs.id, s.recordings.jobId))
    .innerJoin(s.sites, eq(s.sites.id, s.jobs.siteId))
    .innerJoin(s.flights, eq(s.flights.id, s.recordings.flightId))
    .innerJoin(s.organisations, eq(s.organisations.id, s.recordings.organisationId))
    .where(and(eq(s.recordings.id, recordingId), eq(s.recordings.organisationId, organisationId), isNull(s.recordings.deletedAt)));
  if (!row) return null;

  const renditions = await db()
    .select({ kind: s.renditions.kind, storageKey: s.renditions.storageKey, width: s.renditions.width, height: s.renditions.height })
    .from(s.renditions)
    .where(and(eq(s.renditions.recordingId, row.id), eq(s.renditions.organisationId, organisationId)));
  const url = (kind: (typeof renditions)[number]["kind"]) => {
    const r = renditions.find((x) => x.kind === kind);
    return r ? recordingFileUrl(row.id, fileOf(r.storageKey)) : null;
  };
  const playable = renditions.find((r) => r.kind === "playable");

  const flightFiles = await db()
    .select({ id: s.recordings.id, name: s.recordings.originalName, durationSec: s.recordings.durationSec, figures: s.recordings.figures, state: s.recordings.state })
    .from(s.recordings)
    .where(and(eq(s.recordings.organisationId, organisationId), eq(s.recordings.flightId, row.flightId), isNull(s.recordings.deletedAt)))
    .orderBy(asc(s.recordings.sequenceIndex), asc(s.recordings.createdAt));

  const timing = row.state === "ready" ? recordingTiming(row, row.defaultFps) : null;
  return {
    recording: {
      id: row.id,
      name: row.name,
      sha256: row.sha256,
      sizeBytes: row.sizeBytes,
      kind: row.kind,
      state: row.state,
      progress: row.progress,
      failureReason: row.failureReason,
      jobId: row.jobId,
      jobTitle: row.jobTitle,
      flightId: row.flightId,
      flownOn: row.flownOn,
      assetKind: row.assetKind,
      width: playable?.width ?? row.facts?.width ?? null,
      height: playable?.height ?? row.facts?.height ?? null,
      fpsSource: row.facts?.fpsSource ?? null,
    },
    timing: timing
      ? {
          rate: timing.rate,
          fps: timing.fps,
          frameCount: timing.frameCount,
          durationSec: timing.durationSec,
          lost: timing.lost ?? null,
          damagedFrames: timing.figures?.signalKnown ? timing.figures.framesDamaged : null,
          /** true when the rendition keeps the recorder's time (stored figures): player time = slot / rate */
          recorderClock: !!timing.figures,
        }
      : null,
    /** the worker's stored figures (lib/recordings/recording-figures.ts), null before they exist */
    figures: timing?.figures ?? null,
    media: { playable: url("playable"), poster: url("poster"), thumbnails: url("thumbnails_vtt") },
    // one duration per recording: the stored figures' when there are figures
    flightFiles: flightFiles.map(({ figures, ...f }) => ({ ...f, durationSec: readRecordingFigures({ figures })?.durationSeconds ?? f.durationSec })),
  };
}
