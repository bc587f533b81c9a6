// Flight tracks (lib/tracks): a GPX 1.1 or CSV track imported on a flight's page, kept as evidence like a
// recording's original (write-once file, SHA-256, custody event), and the alignments of the recorder's
// clock with the track's clock, one row each time someone sets it (the newest counts; the rest is history).
import { pgTable, uuid, text, timestamp, doublePrecision, integer, bigint, jsonb, index, uniqueIndex } from "drizzle-orm/pg-core";
import { organisations, users, timestamps } from "./organisations";
import { jobs, flights } from "./work";
import { recordings } from "./media";

const orgRef = () => uuid("organisation_id").notNull().references(() => organisations.id, { onDelete: "cascade" });

/** One track point: [time in ms since 1970 UTC, latitude, longitude, height above launch in m or null]. */
export type StoredTrackPoint = [number, number, number, number | null];

export const flightTracks = pgTable(
  "flight_tracks",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    jobId: uuid("job_id").notNull().references(() => jobs.id),
    flightId: uuid("flight_id").notNull().references(() => flights.id),
    originalName: text("original_name").notNull(),
    // "gpx" (GPX 1.1) or "csv"
    format: text("format").notNull(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    sha256: text("sha256").notNull(),
    // write-once file in the store, at a key built from ids (lib/storage/storage-keys.ts)
    storageKey: text("storage_key").notNull(),
    pointCount: integer("point_count").notNull(),
    startsAt: timestamp("starts_at", { withTimezone: true, precision: 3 }).notNull(),
    endsAt: timestamp("ends_at", { withTimezone: true, precision: 3 }).notNull(),
    // how the heights were read: "above_launch" (CSV column) or "elevation_minus_first" (GPX <ele>), or "none"
    heightSource: text("height_source").notNull(),
    points: jsonb("points").$type<StoredTrackPoint[]>().notNull(),
    // problems that did not refuse the file, each naming its line or point
    warnings: jsonb("warnings").$type<string[]>().notNull().default([]),
    uploadedBy: uuid("uploaded_by").references(() => users.id, { onDelete: "set null" }),
    ...timestamps,
  },
  // one track per flight: a second import is refused, so no figure ever changes under a range check
  (t) => [uniqueIndex("flight_tracks_flight_uq").on(t.flightId), index("flight_tracks_org_idx").on(t.organisationId, t.flightId)],
);

export const trackAlignments = pgTable(
  "track_alignments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    trackId: uuid("track_id").notNull().references(() => flightTracks.id, { onDelete: "cascade" }),
    // track time = recorder time + offset, in milliseconds
    offsetMs: doublePrecision("offset_ms").notNull(),
    // "file_times" (proposed from the recordings' file times) or "frame_match" (a frame matched to a track point)
    method: text("method").notNull(),
    // for a frame match: the frame of which recording, and the index of the track point it matches
    recordingId: uuid("recording_id").references(() => recordings.id, { onDelete: "set null" }),
    frame: integer("frame"),
    pointIndex: integer("point_index"),
    // half-width of the interval the true offset lies in, as far as Cairn can tell, in milliseconds
    uncertaintyMs: doublePrecision("uncertainty_ms").notNull(),
    setBy: uuid("set_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true, precision: 3 }).notNull().defaultNow(),
  },
  (t) => [index("track_alignments_track_idx").on(t.trackId, t.createdAt)],
);
