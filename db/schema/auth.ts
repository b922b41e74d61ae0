// The four tables better-auth reads and writes (user, session, account, verification) plus its
// rate-limit table, written by hand from its schema so that drizzle-kit owns the migrations.
// Gusset adds three columns to the user (the role, when the account was deactivated, the person's time
// zone) and one table of its own: why a session was ended on purpose.
import { sql } from "drizzle-orm";
import { boolean, check, index, integer, bigint, pgTable, text, timestamp } from "drizzle-orm/pg-core";

export const user = pgTable(
  "user",
  {
    id: text("id").primaryKey(),
    name: text("name").notNull(),
    email: text("email").notNull().unique(),
    emailVerified: boolean("email_verified").notNull().default(false),
    image: text("image"),
    /** One of ROLES in lib/auth/roles.ts; checked in SQL by the migration's constraint. */
    role: text("role", { enum: ["admin", "lead", "engineer", "auditor"] })
      .notNull()
      .default("engineer"),
    /** Set when an admin deactivates the account; a deactivated user cannot sign in. */
    deactivatedAt: timestamp("deactivated_at", { withTimezone: true }),
    /** An IANA time zone the person chose on their profile; null: the browser's own. */
    timeZone: text("time_zone"),
    /** How the person reads results: SI, or US customary converted from the stored SI values. */
    displayUnits: text("display_units", { enum: ["si", "us"] })
      .notNull()
      .default("si"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check("user_role_check", sql`${t.role} in ('admin', 'lead', 'engineer', 'auditor')`),
    check("user_display_units_check", sql`${t.displayUnits} in ('si', 'us')`),
  ],
);
export type User = typeof user.$inferSelect;
export type NewUser = typeof user.$inferInsert;

export const session = pgTable(
  "session",
  {
    id: text("id").primaryKey(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    token: text("token").notNull().unique(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    ipAddress: text("ip_address"),
    userAgent: text("user_agent"),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
  },
  (t) => [index("session_user_id_idx").on(t.userId)],
);
export type Session = typeof session.$inferSelect;
export type NewSession = typeof session.$inferInsert;

/**
 * Why a session was ended by someone's action (deactivation, a password change elsewhere), keyed by a hash
 * of its token: the browser that still holds the token is told why on the sign-in page. Rows go with the
 * person, and are pruned once the session would have expired anyway.
 */
export const endedSession = pgTable(
  "ended_session",
  {
    /** SHA-256 of the session token, hex: the token itself was a credential. */
    tokenHash: text("token_hash").primaryKey(),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    reason: text("reason", { enum: ["deactivated", "password-changed"] }).notNull(),
    endedAt: timestamp("ended_at", { withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  },
  (t) => [
    index("ended_session_user_id_idx").on(t.userId),
    check("ended_session_reason_check", sql`${t.reason} in ('deactivated', 'password-changed')`),
  ],
);

export const account = pgTable(
  "account",
  {
    id: text("id").primaryKey(),
    accountId: text("account_id").notNull(),
    providerId: text("provider_id").notNull(),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    accessToken: text("access_token"),
    refreshToken: text("refresh_token"),
    idToken: text("id_token"),
    accessTokenExpiresAt: timestamp("access_token_expires_at", { withTimezone: true }),
    refreshTokenExpiresAt: timestamp("refresh_token_expires_at", { withTimezone: true }),
    scope: text("scope"),
    password: text("password"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("account_user_id_idx").on(t.userId)],
);
export type Account = typeof account.$inferSelect;
export type NewAccount = typeof account.$inferInsert;

export const verification = pgTable(
  "verification",
  {
    id: text("id").primaryKey(),
    identifier: text("identifier").notNull(),
    value: text("value").notNull(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("verification_identifier_idx").on(t.identifier)],
);
export type Verification = typeof verification.$inferSelect;
export type NewVerification = typeof verification.$inferInsert;

/** Sign-in attempts are counted here, not in memory, so every app instance sees the same count. */
export const rateLimit = pgTable("rate_limit", {
  id: text("id").primaryKey(),
  key: text("key").notNull().unique(),
  count: integer("count").notNull(),
  lastRequest: bigint("last_request", { mode: "number" }).notNull(),
});
