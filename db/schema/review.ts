// Findings, their history, categories, reports and range checks.
import { sql } from "drizzle-orm";
import { pgTable, uuid, text, timestamp, doublePrecision, integer, jsonb, index, uniqueIndex, bigint } from "drizzle-orm/pg-core";
import { organisations, users, timestamps } from "./organisations";
import { jobs, flights } from "./work";
import { recordings } from "./media";
import { severityEnum, revisionActionEnum, reportStateEnum, assetKindEnum, linkEventEnum } from "./enums";

const orgRef = () => uuid("organisation_id").notNull().references(() => organisations.id, { onDelete: "cascade" });

export const findingCategories = pgTable(
  "finding_categories",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    name: text("name").notNull(),
    assetKind: assetKindEnum("asset_kind"),
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [uniqueIndex("finding_categories_org_name_uq").on(t.organisationId, t.name)],
);

export type FrameBox = { x: number; y: number; w: number; h: number }; // fractions of the frame, 0..1

export const findings = pgTable(
  "findings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    jobId: uuid("job_id").notNull().references(() => jobs.id),
    recordingId: uuid("recording_id").notNull().references(() => recordings.id),
    startFrame: integer("start_frame").notNull(),
    endFrame: integer("end_frame"),
    startSec: doublePrecision("start_sec").notNull(),
    endSec: doublePrecision("end_sec"),
    severity: severityEnum("severity").notNull(),
    categoryId: uuid("category_id").references(() => findingCategories.id),
    note: text("note").notNull().default(""),
    box: jsonb("box").$type<FrameBox>(),
    latitude: doublePrecision("latitude"),
    longitude: doublePrecision("longitude"),
    groundDistanceM: doublePrecision("ground_distance_m"),
    slantDistanceM: doublePrecision("slant_distance_m"),
    heightAglM: doublePrecision("height_agl_m"),
    version: integer("version").notNull().default(1),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    deletedAt: timestamp("deleted_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("findings_org_job_idx").on(t.organisationId, t.jobId),
    index("findings_org_recording_idx").on(t.organisationId, t.recordingId, t.startSec),
    // the findings list's order within a recording (lib/findings/finding-view.ts)
    index("findings_org_recording_frame_idx").on(t.organisationId, t.recordingId, t.startFrame, t.createdAt, t.id),
    index("findings_org_severity_idx").on(t.organisationId, t.severity),
    // the capped count of a job's live findings, walked recording by recording (lib/findings/finding-view.ts)
    index("findings_org_recording_live_idx").on(t.organisationId, t.recordingId).where(sql`${t.deletedAt} is null`),
  ],
);

export const findingRevisions = pgTable(
  "finding_revisions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    findingId: uuid("finding_id").notNull().references(() => findings.id),
    version: integer("version").notNull(),
    action: revisionActionEnum("action").notNull(),
    snapshot: jsonb("snapshot").$type<Record<string, unknown>>().notNull(),
    editedBy: uuid("edited_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("finding_revisions_uq").on(t.findingId, t.version)],
);

export const reports = pgTable(
  "reports",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    jobId: uuid("job_id").notNull().references(() => jobs.id),
    version: integer("version").notNull(),
    state: reportStateEnum("state").notNull().default("queued"),
    progress: integer("progress").notNull().default(0),
    storageKey: text("storage_key"),
    sizeBytes: bigint("size_bytes", { mode: "number" }),
    sha256: text("sha256"),
    failureReason: text("failure_reason"),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    approvedBy: uuid("approved_by").references(() => users.id, { onDelete: "set null" }),
    approvedAt: timestamp("approved_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [uniqueIndex("reports_job_version_uq").on(t.jobId, t.version), index("reports_org_job_idx").on(t.organisationId, t.jobId)],
);

export const rangeChecks = pgTable(
  "range_checks",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    flightId: uuid("flight_id").notNull().references(() => flights.id),
    recordingId: uuid("recording_id").references(() => recordings.id),
    event: linkEventEnum("event").notNull(),
    atSec: doublePrecision("at_sec"),
    latitude: doublePrecision("latitude"),
    longitude: doublePrecision("longitude"),
    groundDistanceM: doublePrecision("ground_distance_m").notNull(),
    bearingDeg: doublePrecision("bearing_deg"),
    heightAglM: doublePrecision("height_agl_m").notNull(),
    slantRangeM: doublePrecision("slant_range_m").notNull(),
    antennaOrientation: text("antenna_orientation"),
    cameraOrientation: text("camera_orientation"),
    aircraft: text("aircraft"),
    firmware: text("firmware"),
    notes: text("notes"),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [index("range_checks_org_flight_idx").on(t.organisationId, t.flightId)],
);
