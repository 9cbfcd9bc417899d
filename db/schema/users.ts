import { datetime, index, mysqlEnum, mysqlTable, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { id, ref, timestamps } from "./columns";
import { organisations } from "./organisations";

export const ROLES = ["admin", "lead", "engineer", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const USER_STATUSES = ["active", "deactivated"] as const;
export type UserStatus = (typeof USER_STATUSES)[number];

export const users = mysqlTable(
  "users",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    email: varchar("email", { length: 254 }).notNull(),
    name: varchar("name", { length: 120 }).notNull(),
    passwordHash: varchar("password_hash", { length: 255 }).notNull(),
    role: mysqlEnum("role", ROLES).notNull(),
    status: mysqlEnum("status", USER_STATUSES).notNull().default("active"),
    lastSignInAt: datetime("last_sign_in_at", { fsp: 3 }),
    ...timestamps,
  },
  (t) => [uniqueIndex("users_email_uq").on(t.email), index("users_organisation_idx").on(t.organisationId)],
);

/** A single-use invitation: only the SHA-256 of the token is stored. */
export const invitations = mysqlTable(
  "invitations",
  {
    id: id(),
    organisationId: ref("organisation_id")
      .notNull()
      .references(() => organisations.id),
    email: varchar("email", { length: 254 }).notNull(),
    role: mysqlEnum("role", ROLES).notNull(),
    tokenHash: varchar("token_hash", { length: 64 }).notNull(),
    invitedById: ref("invited_by_id")
      .notNull()
      .references(() => users.id),
    expiresAt: datetime("expires_at", { fsp: 3 }).notNull(),
    acceptedAt: datetime("accepted_at", { fsp: 3 }),
    revokedAt: datetime("revoked_at", { fsp: 3 }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("invitations_token_uq").on(t.tokenHash),
    index("invitations_organisation_idx").on(t.organisationId),
    index("invitations_invited_by_idx").on(t.invitedById),
    index("invitations_email_idx").on(t.email),
  ],
);

/** Every sign-in attempt, for throttling across app instances. */
export const signInAttempts = mysqlTable(
  "sign_in_attempts",
  {
    id: id(),
    email: varchar("email", { length: 254 }).notNull(),
    ip: varchar("ip", { length: 64 }),
    succeeded: mysqlEnum("outcome", ["success", "failure"]).notNull(),
    createdAt: timestamps.createdAt,
  },
  (t) => [index("sign_in_attempts_email_time_idx").on(t.email, t.createdAt)],
);
