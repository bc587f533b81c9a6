// Clients, sites, jobs, flights: how a crew files its work.
import { pgTable, uuid, text, timestamp, doublePrecision, date, boolean, index, primaryKey, integer } from "drizzle-orm/pg-core";
import { organisations, users, memberships, timestamps } from "./organisations";
import { assetKindEnum, jobStatusEnum } from "./enums";

const orgRef = () => uuid("organisation_id").notNull().references(() => organisations.id, { onDelete: "cascade" });

export const clients = pgTable(
  "clients",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    name: text("name").notNull(),
    contactName: text("contact_name"),
    contactEmail: text("contact_email"),
    notes: text("notes"),
    // overrides the organisation's retention period for this client's jobs, in days (lib/retention)
    retentionDays: integer("retention_days"),
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [index("clients_org_name_idx").on(t.organisationId, t.name, t.id)],
);

export const sites = pgTable(
  "sites",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    clientId: uuid("client_id").notNull().references(() => clients.id),
    name: text("name").notNull(),
    address: text("address"),
    latitude: doublePrecision("latitude"),
    longitude: doublePrecision("longitude"),
    timeZone: text("time_zone").notNull().default("UTC"),
    assetKind: assetKindEnum("asset_kind").notNull().default("other"),
    launchNotes: text("launch_notes"),
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [index("sites_org_client_idx").on(t.organisationId, t.clientId), index("sites_org_name_idx").on(t.organisationId, t.name, t.id)],
);

export const jobs = pgTable(
  "jobs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    title: text("title").notNull(),
    scope: text("scope"),
    dueDate: date("due_date"),
    status: jobStatusEnum("status").notNull().default("planned"),
    pilotId: uuid("pilot_id").references(() => users.id, { onDelete: "set null" }),
    reviewerId: uuid("reviewer_id").references(() => users.id, { onDelete: "set null" }),
    legalHold: boolean("legal_hold").notNull().default(false),
    legalHoldReason: text("legal_hold_reason"),
    // retention (lib/retention): this job's own period in days (overrides client and organisation);
    // when it was closed (set by a trigger, migration 0008); when its files were disposed of, and by whom
    retentionDays: integer("retention_days"),
    closedAt: timestamp("closed_at", { withTimezone: true }),
    disposedAt: timestamp("disposed_at", { withTimezone: true }),
    disposedBy: uuid("disposed_by").references(() => users.id, { onDelete: "set null" }),
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("jobs_org_status_idx").on(t.organisationId, t.status),
    index("jobs_org_site_idx").on(t.organisationId, t.siteId),
    index("jobs_org_due_idx").on(t.organisationId, t.dueDate, t.id),
  ],
);

export const flights = pgTable(
  "flights",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    jobId: uuid("job_id").notNull().references(() => jobs.id),
    flownOn: date("flown_on").notNull(),
    pilotId: uuid("pilot_id").references(() => users.id, { onDelete: "set null" }),
    aircraft: text("aircraft"),
    launchLatitude: doublePrecision("launch_latitude"),
    launchLongitude: doublePrecision("launch_longitude"),
    launchNotes: text("launch_notes"),
    // stored in metres; shown in the user's units
    maxAltitudeAglM: doublePrecision("max_altitude_agl_m"),
    notes: text("notes"),
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [index("flights_org_job_idx").on(t.organisationId, t.jobId, t.flownOn, t.createdAt, t.id), index("flights_org_date_idx").on(t.organisationId, t.flownOn, t.createdAt, t.id)],
);

// A client account sees only the work of the clients it is tied to here (jobs at their sites, and
// what hangs off those jobs). Other roles ignore this table.
export const membershipClients = pgTable(
  "membership_clients",
  {
    membershipId: uuid("membership_id").notNull().references(() => memberships.id, { onDelete: "cascade" }),
    clientId: uuid("client_id").notNull().references(() => clients.id, { onDelete: "cascade" }),
    organisationId: orgRef(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.membershipId, t.clientId] }), index("membership_clients_client_idx").on(t.clientId)],
);
