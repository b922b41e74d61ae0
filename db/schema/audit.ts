// Append-only record of who did what. UPDATE and DELETE are refused by a trigger in the migration
// (drizzle/…_audit_append_only.sql), so not even a bug in the app can rewrite history.
import { bigserial, index, jsonb, pgTable, text, timestamp } from "drizzle-orm/pg-core";

export const auditEvents = pgTable(
  "audit_events",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    /** user.id of the actor; null for an anonymous actor (e.g. a failed sign-in by an unknown e-mail). */
    actorId: text("actor_id"),
    /** E-mail as typed or as known at the time, kept even if the user is later renamed. */
    actorEmail: text("actor_email"),
    /** Dotted action name from lib/auth/permissions.ts or an auth event, e.g. "auth.sign-in.failed". */
    action: text("action").notNull(),
    /** What the action was done to, e.g. "user:abc123", "project:…". */
    subject: text("subject"),
    details: jsonb("details").$type<Record<string, unknown>>().notNull().default({}),
    ipAddress: text("ip_address"),
    occurredAt: timestamp("occurred_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("audit_events_occurred_at_idx").on(t.occurredAt),
    index("audit_events_actor_id_idx").on(t.actorId),
    index("audit_events_action_idx").on(t.action),
    // A run's trace reads every event about the run and its calc revisions ("run:<id>", "calc-revision:<id>").
    index("audit_events_subject_idx").on(t.subject, t.id),
  ],
);
export type AuditEvent = typeof auditEvents.$inferSelect;
export type NewAuditEvent = typeof auditEvents.$inferInsert;
