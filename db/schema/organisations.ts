import { pgTable, uuid, text, timestamp, bigint, doublePrecision, uniqueIndex, index, boolean, integer } from "drizzle-orm/pg-core";
import { roleEnum, unitsEnum } from "./enums";

const timestamps = {
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
};
export { timestamps };

export const organisations = pgTable("organisations", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull(),
  slug: text("slug").notNull().unique(),
  // Controller recordings often carry no frame rate; this is the rate assumed for them.
  defaultControllerFps: doublePrecision("default_controller_fps").notNull().default(30),
  storageQuotaBytes: bigint("storage_quota_bytes", { mode: "number" }),
  timeZone: text("time_zone").notNull().default("UTC"),
  // how long a closed job's evidence is kept, in days (lib/retention); null: no default set
  retentionDays: integer("retention_days"),
  ...timestamps,
});

export const users = pgTable("users", {
  id: uuid("id").primaryKey().defaultRandom(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  passwordHash: text("password_hash"),
  emailVerifiedAt: timestamp("email_verified_at", { withTimezone: true }),
  preferredUnits: unitsEnum("preferred_units").notNull().default("ft"),
  ...timestamps,
});

export const memberships = pgTable(
  "memberships",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: uuid("organisation_id").notNull().references(() => organisations.id, { onDelete: "cascade" }),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    role: roleEnum("role").notNull(),
    ...timestamps,
  },
  (t) => [uniqueIndex("memberships_org_user_uq").on(t.organisationId, t.userId), index("memberships_user_idx").on(t.userId)],
);

export const invitations = pgTable(
  "invitations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: uuid("organisation_id").notNull().references(() => organisations.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    role: roleEnum("role").notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    invitedBy: uuid("invited_by").references(() => users.id, { onDelete: "set null" }),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    revoked: boolean("revoked").notNull().default(false),
    // for a client account: the organisation's clients whose work it may see (copied to membership_clients)
    clientIds: uuid("client_ids").array().notNull().default([]),
    ...timestamps,
  },
  (t) => [index("invitations_org_idx").on(t.organisationId, t.email)],
);

// next-auth e-mail sign-in links (stored hashed by next-auth itself).
export const verificationTokens = pgTable(
  "verification_tokens",
  {
    identifier: text("identifier").notNull(),
    token: text("token").notNull(),
    expires: timestamp("expires", { withTimezone: true }).notNull(),
  },
  (t) => [uniqueIndex("verification_tokens_uq").on(t.identifier, t.token)],
);

// One row per signed-in session (the JWT carries its id as `sid`). Every request checks the row, so
// sign-out, a password change, a role change or removal from an organisation ends a session on the
// server at the next request, not at the token's expiry.
export const userSessions = pgTable(
  "user_sessions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    endedAt: timestamp("ended_at", { withTimezone: true }),
  },
  (t) => [index("user_sessions_user_idx").on(t.userId)],
);
