import "server-only";
// The audit trail: written for every guarded change and every sign-in attempt, read by auditors and
// admins. The table refuses UPDATE, DELETE and TRUNCATE (drizzle/0002_audit_append_only.sql).
import { and, desc, eq, lt } from "drizzle-orm";
import { auditEvents, user } from "@/db/schema";
import { assertCanOrThrow, type Actor } from "@/lib/auth/actor";
import { currentDb } from "./transaction";

export const AUDIT_ACTION_LABELS: Record<string, string> = {
  "system.seed": "Created the demo firm",
  "auth.sign-in": "Signed in",
  "auth.sign-in.failed": "Failed sign-in",
  "auth.password-reset.requested": "Asked for a password reset",
  "auth.password-reset": "Reset password",
  "auth.password-reset.failed": "Failed password reset",
  "users.invite": "Invited a person",
  "users.set-role": "Changed a role",
  "users.deactivate": "Deactivated an account",
  "users.reactivate": "Reactivated an account",
  "invitations.accept": "Accepted an invitation",
  "invitations.revoke": "Revoked an invitation",
};

export type AuditEventInput = {
  actorId?: string | null;
  actorEmail?: string | null;
  action: string;
  subject?: string | null;
  details?: Record<string, unknown>;
  ipAddress?: string | null;
};

export type AuditEventDto = {
  id: number;
  occurredAt: string;
  actorId: string | null;
  actorEmail: string | null;
  actorName: string | null;
  action: string;
  label: string;
  subject: string | null;
  details: Record<string, unknown>;
  ipAddress: string | null;
};

/** Writes inside the current request's transaction when there is one. */
export async function recordAuditEvent(event: AuditEventInput): Promise<void> {
  await currentDb()
    .insert(auditEvents)
    .values({
      actorId: event.actorId ?? null,
      actorEmail: event.actorEmail ?? null,
      action: event.action,
      subject: event.subject ?? null,
      details: event.details ?? {},
      ipAddress: event.ipAddress ?? null,
    });
}

/** Newest first; pass the last id seen as `before` for the next page. */
export async function listAuditEvents({
  actor,
  limit = 50,
  before,
  actorId,
}: {
  actor: Actor | null;
  limit?: number;
  before?: number;
  actorId?: string;
}): Promise<{ events: AuditEventDto[]; nextBefore: number | null }> {
  assertCanOrThrow(actor, "audit.read");
  const pageSize = Math.min(Math.max(Math.trunc(limit), 1), 200);
  const rows = await currentDb()
    .select({
      id: auditEvents.id,
      occurredAt: auditEvents.occurredAt,
      actorId: auditEvents.actorId,
      actorEmail: auditEvents.actorEmail,
      actorName: user.name,
      action: auditEvents.action,
      subject: auditEvents.subject,
      details: auditEvents.details,
      ipAddress: auditEvents.ipAddress,
    })
    .from(auditEvents)
    .leftJoin(user, eq(user.id, auditEvents.actorId))
    .where(
      and(
        before === undefined ? undefined : lt(auditEvents.id, before),
        actorId === undefined ? undefined : eq(auditEvents.actorId, actorId),
      ),
    )
    .orderBy(desc(auditEvents.id))
    .limit(pageSize + 1);
  const page = rows.slice(0, pageSize);
  return {
    events: page.map((row) => ({
      ...row,
      occurredAt: row.occurredAt.toISOString(),
      label: AUDIT_ACTION_LABELS[row.action] ?? row.action,
    })),
    nextBefore: rows.length > pageSize ? page[page.length - 1].id : null,
  };
}
