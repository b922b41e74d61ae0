import "server-only";
// The calc package's rows: calcs, revisions and their sign-off events (lib/use-cases/calcs.ts checks who may do
// what and writes the audit events). Everything here is append-only; a revision's state is read from its events.
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { calcRevisionEvents, calcRevisions, calcs, user, type CalcEventKind, type IssueStatus } from "@/db/schema";
import { currentDb } from "./transaction";

export type CalcEventDto = {
  kind: CalcEventKind;
  issueStatus: IssueStatus | null;
  actorId: string | null;
  actorName: string | null;
  note: string | null;
  reason: string | null;
  occurredAt: string;
};

export type RevisionState = "awaiting-check" | "returned" | "awaiting-approval" | "approved";

export type CalcRevisionDto = {
  id: string;
  calcId: string;
  letter: string;
  runId: string;
  preparerId: string;
  preparerName: string;
  checkerId: string;
  checkerName: string;
  createdAt: string;
  events: CalcEventDto[];
  state: RevisionState;
  issueStatus: IssueStatus | null;
};

export type CalcDto = {
  id: string;
  jobId: string;
  number: string;
  title: string;
  createdByName: string;
  createdAt: string;
  revisions: CalcRevisionDto[];
};

/** A revision's state and issue status, from its events in order. */
export function stateOf(events: CalcEventDto[]): { state: RevisionState; issueStatus: IssueStatus | null } {
  let state: RevisionState = "awaiting-check";
  let issueStatus: IssueStatus | null = null;
  for (const event of events) {
    if (event.kind === "checked") state = "awaiting-approval";
    if (event.kind === "returned") state = "returned";
    if (event.kind === "approved") state = "approved";
    if (event.issueStatus) issueStatus = event.issueStatus;
  }
  return { state, issueStatus };
}

const preparer = alias(user, "preparer");
const checker = alias(user, "checker");

async function revisionsOf(calcIds: string[]): Promise<CalcRevisionDto[]> {
  if (calcIds.length === 0) return [];
  const rows = await currentDb()
    .select({
      id: calcRevisions.id,
      calcId: calcRevisions.calcId,
      letter: calcRevisions.letter,
      runId: calcRevisions.runId,
      preparerId: calcRevisions.preparerId,
      preparerName: preparer.name,
      checkerId: calcRevisions.checkerId,
      checkerName: checker.name,
      createdAt: calcRevisions.createdAt,
    })
    .from(calcRevisions)
    .innerJoin(preparer, eq(preparer.id, calcRevisions.preparerId))
    .innerJoin(checker, eq(checker.id, calcRevisions.checkerId))
    .where(inArray(calcRevisions.calcId, calcIds))
    .orderBy(asc(calcRevisions.createdAt));
  const events = rows.length
    ? await currentDb()
        .select({
          revisionId: calcRevisionEvents.revisionId,
          kind: calcRevisionEvents.kind,
          issueStatus: calcRevisionEvents.issueStatus,
          actorId: calcRevisionEvents.actorId,
          actorName: user.name,
          note: calcRevisionEvents.note,
          reason: calcRevisionEvents.reason,
          occurredAt: calcRevisionEvents.occurredAt,
        })
        .from(calcRevisionEvents)
        .leftJoin(user, eq(user.id, calcRevisionEvents.actorId))
        .where(
          inArray(
            calcRevisionEvents.revisionId,
            rows.map((r) => r.id),
          ),
        )
        .orderBy(asc(calcRevisionEvents.id))
    : [];
  return rows.map((row) => {
    const own = events
      .filter((e) => e.revisionId === row.id)
      .map(({ revisionId: _r, occurredAt, ...e }) => ({ ...e, occurredAt: occurredAt.toISOString() }));
    return { ...row, createdAt: row.createdAt.toISOString(), events: own, ...stateOf(own) };
  });
}

export async function listCalcs(jobId: string): Promise<CalcDto[]> {
  const rows = await currentDb()
    .select({
      id: calcs.id,
      jobId: calcs.jobId,
      number: calcs.number,
      title: calcs.title,
      createdByName: user.name,
      createdAt: calcs.createdAt,
    })
    .from(calcs)
    .innerJoin(user, eq(user.id, calcs.createdById))
    .where(eq(calcs.jobId, jobId))
    .orderBy(asc(calcs.number));
  const revisions = await revisionsOf(rows.map((r) => r.id));
  return rows.map((row) => ({
    ...row,
    createdAt: row.createdAt.toISOString(),
    revisions: revisions.filter((r) => r.calcId === row.id),
  }));
}

export async function getCalc(id: string): Promise<CalcDto | null> {
  const [row] = await currentDb().select({ jobId: calcs.jobId }).from(calcs).where(eq(calcs.id, id));
  if (!row) return null;
  return (await listCalcs(row.jobId)).find((c) => c.id === id) ?? null;
}

/** The revisions that point at a run, with their calc's number and title. */
export async function revisionsOfRun(runId: string): Promise<(CalcRevisionDto & { calcNumber: string; calcTitle: string })[]> {
  const rows = await currentDb()
    .select({ calcId: calcRevisions.calcId, number: calcs.number, title: calcs.title })
    .from(calcRevisions)
    .innerJoin(calcs, eq(calcs.id, calcRevisions.calcId))
    .where(eq(calcRevisions.runId, runId));
  const revisions = await revisionsOf([...new Set(rows.map((r) => r.calcId))]);
  return revisions
    .filter((r) => r.runId === runId)
    .map((r) => {
      const calc = rows.find((c) => c.calcId === r.calcId)!;
      return { ...r, calcNumber: calc.number, calcTitle: calc.title };
    });
}

export async function getRevision(id: string): Promise<(CalcRevisionDto & { jobId: string; calcNumber: string }) | null> {
  const [row] = await currentDb()
    .select({ calcId: calcRevisions.calcId, jobId: calcs.jobId, number: calcs.number })
    .from(calcRevisions)
    .innerJoin(calcs, eq(calcs.id, calcRevisions.calcId))
    .where(eq(calcRevisions.id, id));
  if (!row) return null;
  const revision = (await revisionsOf([row.calcId])).find((r) => r.id === id)!;
  return { ...revision, jobId: row.jobId, calcNumber: row.number };
}

/** Serialises sign-off on one calc (two revisions issued at once get different letters, one step at a time). */
export async function lockCalc(id: string): Promise<void> {
  await currentDb().execute(sql`select pg_advisory_xact_lock(hashtext(${`calc:${id}`}))`);
}

export async function calcNumberTaken(jobId: string, number: string): Promise<boolean> {
  const [row] = await currentDb()
    .select({ id: calcs.id })
    .from(calcs)
    .where(and(eq(calcs.jobId, jobId), sql`lower(${calcs.number}) = lower(${number})`));
  return row !== undefined;
}

export async function insertCalc(values: typeof calcs.$inferInsert): Promise<{ id: string }> {
  const [row] = await currentDb().insert(calcs).values(values).returning({ id: calcs.id });
  return row;
}

export async function lastLetter(calcId: string): Promise<string | null> {
  const [row] = await currentDb()
    .select({ letter: calcRevisions.letter })
    .from(calcRevisions)
    .where(eq(calcRevisions.calcId, calcId))
    .orderBy(desc(sql`length(${calcRevisions.letter})`), desc(calcRevisions.letter))
    .limit(1);
  return row?.letter ?? null;
}

export async function insertRevision(values: typeof calcRevisions.$inferInsert): Promise<{ id: string }> {
  const [row] = await currentDb().insert(calcRevisions).values(values).returning({ id: calcRevisions.id });
  return row;
}

export async function insertRevisionEvent(values: typeof calcRevisionEvents.$inferInsert): Promise<void> {
  await currentDb().insert(calcRevisionEvents).values(values);
}
