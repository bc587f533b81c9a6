// Recordings (immutable originals), their derived renditions, signal traces, stills and tags.
import { sql } from "drizzle-orm";
import { pgTable, uuid, text, timestamp, doublePrecision, integer, bigint, jsonb, index, uniqueIndex, primaryKey } from "drizzle-orm/pg-core";
import { organisations, users, timestamps } from "./organisations";
import { jobs, flights } from "./work";
import { recordingKindEnum, processingStateEnum, renditionKindEnum, stillStateEnum } from "./enums";
import type { RecordingFigures } from "../../lib/recordings/recording-figures";

const orgRef = () => uuid("organisation_id").notNull().references(() => organisations.id, { onDelete: "cascade" });

export type ProbeFacts = {
  codec?: string;
  profile?: string;
  level?: number | null;
  width?: number;
  height?: number;
  frameCount?: number;
  durationSec?: number;
  bitrate?: number | null;
  fps?: number | null;
  fpsSource?: "stream" | "container" | "organisation-default" | "recording-override";
};

export const recordings = pgTable(
  "recordings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    jobId: uuid("job_id").notNull().references(() => jobs.id),
    flightId: uuid("flight_id").notNull().references(() => flights.id),
    // tus upload id: makes the ingest commit exactly-once per upload
    uploadId: text("upload_id").unique(),
    originalName: text("original_name").notNull(),
    relativePath: text("relative_path"),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    kind: recordingKindEnum("kind").notNull(),
    sha256: text("sha256").notNull(),
    // path of the write-once original inside the store, derived from the id, never from the user's name
    storageKey: text("storage_key"),
    // same bytes uploaded again into the organisation: points at the recording that holds the original
    duplicateOfId: uuid("duplicate_of_id"),
    uploadedBy: uuid("uploaded_by").references(() => users.id, { onDelete: "set null" }),
    recorderModifiedAt: timestamp("recorder_modified_at", { withTimezone: true }),
    // position in the flight timeline (pilot-editable)
    sequenceIndex: integer("sequence_index").notNull().default(0),
    state: processingStateEnum("state").notNull().default("waiting"),
    progress: integer("progress").notNull().default(0),
    failureReason: text("failure_reason"),
    fpsOverride: doublePrecision("fps_override"),
    facts: jsonb("facts").$type<ProbeFacts>(),
    // figures.durationSeconds, kept as a column for sorting; written together with figures
    durationSec: doublePrecision("duration_sec"),
    // the one set of figures, computed once by the worker (lib/recordings/recording-figures.ts)
    figures: jsonb("figures").$type<RecordingFigures>(),
    processedAt: timestamp("processed_at", { withTimezone: true }),
    deletedAt: timestamp("deleted_at", { withTimezone: true }),
    deletedBy: uuid("deleted_by").references(() => users.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [
    // the recordings lists' keyset order (lib/recordings/list-recordings.ts): flight order, upload time, id
    index("recordings_org_flight_idx").on(t.organisationId, t.flightId, t.sequenceIndex, t.createdAt, t.id),
    index("recordings_org_job_idx").on(t.organisationId, t.jobId, t.sequenceIndex, t.createdAt, t.id),
    index("recordings_org_seq_idx").on(t.organisationId, t.sequenceIndex, t.createdAt, t.id),
    index("recordings_org_sha_idx").on(t.organisationId, t.sha256),
    index("recordings_state_idx").on(t.state),
    // the lists' capped count of live recordings (countUpTo in lib/api/keyset.ts): an index-only scan
    // that stops after COUNT_CAP + 1 entries, where a sequential scan read other organisations' rows first
    index("recordings_org_live_idx").on(t.organisationId).where(sql`${t.deletedAt} is null`),
  ],
);

export const renditions = pgTable(
  "renditions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    recordingId: uuid("recording_id").notNull().references(() => recordings.id, { onDelete: "cascade" }),
    kind: renditionKindEnum("kind").notNull(),
    storageKey: text("storage_key").notNull(),
    mimeType: text("mime_type").notNull(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    sha256: text("sha256").notNull(),
    width: integer("width"),
    height: integer("height"),
    tool: text("tool"),
    toolArgs: jsonb("tool_args").$type<string[]>(),
    ...timestamps,
  },
  (t) => [uniqueIndex("renditions_recording_kind_uq").on(t.recordingId, t.kind)],
);

export type TraceInterval = { state: "intact" | "damaged" | "lost"; startFrame: number; endFrame: number; startSec: number; endSec: number };
export type TraceSummary = {
  frameCount: number;
  intactFrames: number;
  damagedFrames: number;
  lostFrames: number;
  intactShare: number;
  firstDegradationSec: number | null;
  longestLossSec: number;
};

export const signalTraces = pgTable("signal_traces", {
  recordingId: uuid("recording_id").primaryKey().references(() => recordings.id, { onDelete: "cascade" }),
  organisationId: orgRef(),
  fps: doublePrecision("fps").notNull(),
  intervals: jsonb("intervals").$type<TraceInterval[]>().notNull(),
  summary: jsonb("summary").$type<TraceSummary>().notNull(),
  decoderErrorFrames: jsonb("decoder_error_frames").$type<number[]>(),
  ...timestamps,
});

export const stills = pgTable(
  "stills",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    recordingId: uuid("recording_id").notNull().references(() => recordings.id, { onDelete: "cascade" }),
    findingId: uuid("finding_id"),
    frameNumber: integer("frame_number").notNull(),
    timeSec: doublePrecision("time_sec").notNull(),
    state: stillStateEnum("state").notNull().default("pending"),
    storageKey: text("storage_key"),
    width: integer("width"),
    height: integer("height"),
    sha256: text("sha256"),
    failureReason: text("failure_reason"),
    ...timestamps,
  },
  (t) => [index("stills_org_recording_idx").on(t.organisationId, t.recordingId), index("stills_finding_idx").on(t.findingId)],
);

export const tags = pgTable(
  "tags",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    name: text("name").notNull(),
    ...timestamps,
  },
  (t) => [uniqueIndex("tags_org_name_uq").on(t.organisationId, t.name)],
);

export const recordingTags = pgTable(
  "recording_tags",
  {
    organisationId: orgRef(),
    recordingId: uuid("recording_id").notNull().references(() => recordings.id, { onDelete: "cascade" }),
    tagId: uuid("tag_id").notNull().references(() => tags.id, { onDelete: "cascade" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.recordingId, t.tagId] }), index("recording_tags_tag_idx").on(t.organisationId, t.tagId)],
);

export const playbackViews = pgTable(
  "playback_views",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    recordingId: uuid("recording_id").notNull().references(() => recordings.id, { onDelete: "cascade" }),
    // the analytics SDK's own view id; beacons of one view update one row
    viewKey: text("view_key").notNull(),
    viewerUserId: uuid("viewer_user_id").references(() => users.id, { onDelete: "set null" }),
    shareLinkId: uuid("share_link_id"),
    startedAt: timestamp("started_at", { withTimezone: true }).notNull(),
    lastBeaconAt: timestamp("last_beacon_at", { withTimezone: true }).notNull(),
    watchTimeMs: integer("watch_time_ms").notNull().default(0),
    startupTimeMs: integer("startup_time_ms"),
    rebufferCount: integer("rebuffer_count").notNull().default(0),
    rebufferMs: integer("rebuffer_ms").notNull().default(0),
    ...timestamps,
  },
  (t) => [uniqueIndex("playback_views_key_uq").on(t.viewKey), index("playback_views_org_recording_idx").on(t.organisationId, t.recordingId, t.startedAt, t.id)],
);

/**
 * One row per upload admitted and not yet settled (lib/uploads/upload-reservations.ts): the bytes it
 * holds against the organisation's quota, reserved in the same transaction as the quota check, and
 * the key its original will be placed at. `placing_since` is set just before the original is placed;
 * a row that keeps it with no recording after a grace period is a commit that died between placing
 * the file and its transaction, and the purge removes that original from database state alone.
 */
export const uploadReservations = pgTable(
  "upload_reservations",
  {
    uploadId: text("upload_id").primaryKey(),
    organisationId: orgRef(),
    bytes: bigint("bytes", { mode: "number" }).notNull(),
    originalKey: text("original_key").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    placingSince: timestamp("placing_since", { withTimezone: true }),
  },
  (t) => [index("upload_reservations_org_idx").on(t.organisationId), index("upload_reservations_placing_idx").on(t.placingSince)],
);
