// Evidence packages (a job's, a flight's or chosen recordings' evidence as one BagIt ZIP, built by the
// worker: lib/evidence-packages) and the reminders of retention's disposal dates (lib/retention).
import { pgTable, uuid, text, timestamp, integer, bigint, jsonb, index, uniqueIndex, date } from "drizzle-orm/pg-core";
import { organisations, users, timestamps } from "./organisations";
import { jobs, flights } from "./work";
import { evidencePackageStateEnum } from "./enums";

const orgRef = () => uuid("organisation_id").notNull().references(() => organisations.id, { onDelete: "cascade" });

export const evidencePackages = pgTable(
  "evidence_packages",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    jobId: uuid("job_id").notNull().references(() => jobs.id),
    // what it holds: the whole job (both null), one flight, or chosen recordings of the job
    flightId: uuid("flight_id").references(() => flights.id),
    recordingIds: jsonb("recording_ids").$type<string[]>(),
    state: evidencePackageStateEnum("state").notNull().default("queued"),
    progress: integer("progress").notNull().default(0),
    // the size checked against the free disk before building, in bytes
    estimatedBytes: bigint("estimated_bytes", { mode: "number" }).notNull(),
    storageKey: text("storage_key"),
    sizeBytes: bigint("size_bytes", { mode: "number" }),
    sha256: text("sha256"),
    payloadFiles: integer("payload_files"),
    payloadBytes: bigint("payload_bytes", { mode: "number" }),
    purpose: text("purpose"),
    failureReason: text("failure_reason"),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    // kept until then, then its file is removed (state expired)
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    ...timestamps,
  },
  (t) => [index("evidence_packages_org_job_idx").on(t.organisationId, t.jobId), index("evidence_packages_state_idx").on(t.state, t.expiresAt)],
);

// One row per reminder sent: the disposal date it announced and how many days ahead. The unique index
// makes "sent once" hold in the database, whatever the mail claim in Redis remembers.
export const disposalReminders = pgTable(
  "disposal_reminders",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    jobId: uuid("job_id").notNull().references(() => jobs.id),
    disposalDate: date("disposal_date").notNull(),
    leadDays: integer("lead_days").notNull(),
    recipients: jsonb("recipients").$type<string[]>().notNull().default([]),
    sentAt: timestamp("sent_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("disposal_reminders_job_date_lead_uq").on(t.jobId, t.disposalDate, t.leadDays), index("disposal_reminders_org_idx").on(t.organisationId)],
);
