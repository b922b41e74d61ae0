import "server-only";
// The audit trail: written for every change (by the use-case runner, lib/use-cases/run.ts) and every
// sign-in attempt, read by auditors and admins. The table refuses UPDATE, DELETE and TRUNCATE
// (drizzle/0002_audit_append_only.sql).
import { and, desc, eq, lt } from "drizzle-orm";
import { auditEvents, user } from "@/db/schema";
import { auditActionLabel, type AuditEventInput } from "@/lib/domain/audit-actions";
import { currentDb } from "./transaction";

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

/** Writes inside the current transaction when there is one. */
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

/** Newest first; pass the last id seen as `before` for the next page. Callers check audit.read. */
export async function listAuditEvents({
  limit = 50,
  before,
  actorId,
}: {
  limit?: number;
  before?: number;
  actorId?: string;
}): Promise<{ events: AuditEventDto[]; nextBefore: number | null }> {
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
      label: auditActionLabel(row.action),
    })),
    nextBefore: rows.length > pageSize ? page[page.length - 1].id : null,
  };
}
