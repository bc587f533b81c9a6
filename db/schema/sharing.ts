// Share links (capability URLs) and the append-only, hash-chained custody log.
import { pgTable, uuid, text, timestamp, integer, boolean, jsonb, index, uniqueIndex, bigint } from "drizzle-orm/pg-core";
import { organisations, users, timestamps } from "./organisations";
import { jobs } from "./work";
import { recordings } from "./media";
import { reports } from "./review";
import { evidencePackages } from "./evidence";
import { shareScopeEnum, shareEventKindEnum, roleEnum } from "./enums";

const orgRef = () => uuid("organisation_id").notNull().references(() => organisations.id, { onDelete: "cascade" });

export const shareLinks = pgTable(
  "share_links",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    jobId: uuid("job_id").notNull().references(() => jobs.id),
    scope: shareScopeEnum("scope").notNull(),
    recordingId: uuid("recording_id").references(() => recordings.id),
    reportId: uuid("report_id").references(() => reports.id),
    findingIds: jsonb("finding_ids").$type<string[]>(),
    // SHA-256 of the token; the token itself is never stored nor logged
    tokenHash: text("token_hash").notNull().unique(),
    label: text("label").notNull(),
    recipientEmails: jsonb("recipient_emails").$type<string[]>().notNull().default([]),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    passcodeHash: text("passcode_hash"),
    failedPasscodeAttempts: integer("failed_passcode_attempts").notNull().default(0),
    lockedUntil: timestamp("locked_until", { withTimezone: true }),
    allowOriginals: boolean("allow_originals").notNull().default(false),
    // an evidence package of the job the link lets its holder download (lib/evidence-packages)
    evidencePackageId: uuid("evidence_package_id").references(() => evidencePackages.id),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    revokedBy: uuid("revoked_by").references(() => users.id, { onDelete: "set null" }),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [index("share_links_org_job_idx").on(t.organisationId, t.jobId, t.createdAt, t.id)],
);

export const shareLinkEvents = pgTable(
  "share_link_events",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    shareLinkId: uuid("share_link_id").notNull().references(() => shareLinks.id),
    kind: shareEventKindEnum("kind").notNull(),
    detail: text("detail"),
    clientAddress: text("client_address"),
    userAgent: text("user_agent"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("share_link_events_link_idx").on(t.organisationId, t.shareLinkId, t.createdAt)],
);

// Append-only: a trigger (migration 0001) refuses UPDATE, DELETE and TRUNCATE, and the app's role
// does not own the table, so it cannot disable the trigger.
export const custodyEvents = pgTable(
  "custody_events",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    // position in the organisation's chain, 1-based
    seq: bigint("seq", { mode: "number" }).notNull(),
    eventType: text("event_type").notNull(),
    evidenceType: text("evidence_type").notNull(),
    evidenceId: uuid("evidence_id"),
    jobId: uuid("job_id"),
    originalSha256: text("original_sha256"),
    originalSize: bigint("original_size", { mode: "number" }),
    actorUserId: uuid("actor_user_id"),
    actorRole: roleEnum("actor_role"),
    actorShareLinkId: uuid("actor_share_link_id"),
    occurredAt: timestamp("occurred_at", { withTimezone: true, precision: 3 }).notNull(),
    clientAddress: text("client_address"),
    userAgent: text("user_agent"),
    storageLocation: text("storage_location"),
    purpose: text("purpose"),
    tool: text("tool"),
    toolArgs: jsonb("tool_args").$type<string[]>(),
    outputSha256: text("output_sha256"),
    details: jsonb("details").$type<Record<string, unknown>>(),
    prevHash: text("prev_hash").notNull(),
    hash: text("hash").notNull(),
  },
  (t) => [
    uniqueIndex("custody_events_org_seq_uq").on(t.organisationId, t.seq),
    index("custody_events_org_evidence_idx").on(t.organisationId, t.evidenceId),
    index("custody_events_org_job_idx").on(t.organisationId, t.jobId),
  ],
);

// A signed, time-stamped statement of an organisation's chain head (lib/custody/make-checkpoint.ts):
// with it, verification can tell that nothing was cut from the end of the log or re-sealed up to this
// point. Append-only like the log itself. The Ed25519 private key is never stored here, only the
// public key that checks the signature; the RFC 3161 time-stamp response is kept whole (base64 DER).
export const custodyCheckpoints = pgTable(
  "custody_checkpoints",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: orgRef(),
    // 1-based, per organisation
    number: integer("number").notNull(),
    headSeq: bigint("head_seq", { mode: "number" }).notNull(),
    headEventId: uuid("head_event_id").notNull(),
    headHash: text("head_hash").notNull(),
    // SHA-256 hex of the previous checkpoint's signed statement (64 zeros for the first)
    previousStatementSha256: text("previous_statement_sha256").notNull(),
    signedAt: timestamp("signed_at", { withTimezone: true, precision: 3 }).notNull(),
    // Ed25519 (RFC 8032): raw 32-byte public key and 64-byte signature, base64url
    publicKey: text("public_key").notNull(),
    signature: text("signature").notNull(),
    tsaUrl: text("tsa_url"),
    tsaResponse: text("tsa_response"),
    stampedAt: timestamp("stamped_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("custody_checkpoints_org_number_uq").on(t.organisationId, t.number)],
);
