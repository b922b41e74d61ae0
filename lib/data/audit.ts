import "server-only";
// The audit trail: written for every change (by the use-case runner, lib/use-cases/run.ts) and every
// sign-in attempt, read by auditors and admins. The table refuses UPDATE, DELETE and TRUNCATE
// (drizzle/0002_audit_append_only.sql).
import { and, asc, desc, eq, gte, inArray, lt, notInArray, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { auditEvents, invitations, user } from "@/db/schema";
import { auditActionLabel, type AuditEventInput } from "@/lib/domain/audit-actions";
import { prepared } from "./prepared";
import { currentDb } from "./transaction";

export type AuditEventDto = {
  id: number;
  occurredAt: string;
  actorId: string | null;
  actorEmail: string | null;
  actorName: string | null;
  action: string;
  label: string;
  /** The stored reference ("user:…", "invitation:…"); pages show the names below, never this. */
  subject: string | null;
  /** The person (or the invited person) the reference points at; null when it points at nothing on record. */
  subjectName: string | null;
  subjectEmail: string | null;
  details: Record<string, unknown>;
  ipAddress: string | null;
};

// Prepared: every change writes one (lib/data/prepared.ts).
const insertAuditEvent = prepared("gusset_insert_audit_event", (executor) =>
  executor.insert(auditEvents).values({
    actorId: sql.placeholder("actorId"),
    actorEmail: sql.placeholder("actorEmail"),
    action: sql.placeholder("action"),
    subject: sql.placeholder("subject"),
    details: sql.placeholder("details"),
    ipAddress: sql.placeholder("ipAddress"),
  }),
);

/** Writes inside the current transaction when there is one. */
export async function recordAuditEvent(event: AuditEventInput): Promise<void> {
  await insertAuditEvent({
    actorId: event.actorId ?? null,
    actorEmail: event.actorEmail ?? null,
    action: event.action,
    subject: event.subject ?? null,
    details: event.details ?? {},
    ipAddress: event.ipAddress ?? null,
  });
}

/** Which events a page of the trail holds. `from` is inclusive, `until` exclusive. */
export type AuditEventFilter = {
  limit?: number;
  /** The last id seen: the page holds older events. */
  before?: number;
  actorId?: string;
  action?: string;
  from?: Date;
  until?: Date;
  /** Actions left out (sign-ins, unless asked for). */
  excludeActions?: readonly string[];
};

// The person an event was done to ("user:<id>") and the invitation it concerned ("invitation:<uuid>").
const subjectUser = alias(user, "subject_user");

/** The events with the actor's and the subject's names resolved; the caller adds its own conditions and order. */
function selectAuditEvents() {
  return currentDb()
    .select({
      id: auditEvents.id,
      occurredAt: auditEvents.occurredAt,
      actorId: auditEvents.actorId,
      actorEmail: auditEvents.actorEmail,
      actorName: user.name,
      action: auditEvents.action,
      subject: auditEvents.subject,
      subjectName: sql<string | null>`coalesce(${subjectUser.name}, ${invitations.name})`,
      subjectEmail: sql<string | null>`coalesce(${subjectUser.email}, ${invitations.email})`,
      details: auditEvents.details,
      ipAddress: auditEvents.ipAddress,
    })
    .from(auditEvents)
    .leftJoin(user, eq(user.id, auditEvents.actorId))
    .leftJoin(subjectUser, sql`${auditEvents.subject} = 'user:' || ${subjectUser.id}`)
    .leftJoin(invitations, sql`${auditEvents.subject} = 'invitation:' || ${invitations.id}::text`);
}

/** Newest first, with the actor's and the subject's names; pass the last id seen as `before` for the next page. Callers check audit.read. */
export async function listAuditEvents({
  limit = 50,
  before,
  actorId,
  action,
  from,
  until,
  excludeActions = [],
}: AuditEventFilter): Promise<{ events: AuditEventDto[]; nextBefore: number | null }> {
  const pageSize = Math.min(Math.max(Math.trunc(limit), 1), 200);
  const rows = await selectAuditEvents()
    .where(
      and(
        before === undefined ? undefined : lt(auditEvents.id, before),
        actorId === undefined ? undefined : eq(auditEvents.actorId, actorId),
        action === undefined ? undefined : eq(auditEvents.action, action),
        from === undefined ? undefined : gte(auditEvents.occurredAt, from),
        until === undefined ? undefined : lt(auditEvents.occurredAt, until),
        excludeActions.length === 0 ? undefined : notInArray(auditEvents.action, [...excludeActions]),
      ),
    )
    .orderBy(desc(auditEvents.id))
    .limit(pageSize + 1);
  const page = rows.slice(0, pageSize);
  return { events: page.map(toAuditEventDto), nextBefore: rows.length > pageSize ? page[page.length - 1].id : null };
}

function toAuditEventDto(row: Awaited<ReturnType<ReturnType<typeof selectAuditEvents>["execute"]>>[number]): AuditEventDto {
  return { ...row, occurredAt: row.occurredAt.toISOString(), label: auditActionLabel(row.action) };
}

/**
 * The events about any of `subjects` ("run:<id>", "calc-revision:<id>"), oldest first, at most `limit` (the
 * newest are kept when there are more). Read through audit_events_subject_idx.
 */
export async function listAuditEventsAbout(
  subjects: readonly string[],
  limit: number,
): Promise<{ events: AuditEventDto[]; more: boolean }> {
  if (subjects.length === 0) return { events: [], more: false };
  const rows = await selectAuditEvents()
    .where(inArray(auditEvents.subject, [...subjects]))
    .orderBy(desc(auditEvents.id))
    .limit(limit + 1);
  return { events: rows.slice(0, limit).reverse().map(toAuditEventDto), more: rows.length > limit };
}

export type AuditPersonDto = { id: string; name: string; email: string; deactivated: boolean };

/** Everyone who has an account, for the trail's "who" filter: by name, deactivated people included. */
export async function listAuditPeople(): Promise<AuditPersonDto[]> {
  const rows = await currentDb()
    .select({ id: user.id, name: user.name, email: user.email, deactivatedAt: user.deactivatedAt })
    .from(user)
    .orderBy(asc(user.name), asc(user.email));
  return rows.map(({ deactivatedAt, ...person }) => ({ ...person, deactivated: deactivatedAt !== null }));
}
