// A job's calc package, as design control keeps it: numbered calcs (C-012, "roof rafter grid B"), each with
// revisions (A, B, …) that point at the run that is the design of record, and the sign-off of each revision as
// events added, never edited.
//
//   calcs                    one row per calc of a job; its number is unique in the job
//   calc_revisions           one per revision: its letter, the run, who prepared it (who ran the run) and the
//                            checker assigned (never the preparer: a CHECK keeps it so)
//   calc_revision_events     prepared, checked, returned, approved, status (the issue status changes), superseded;
//                            a revision's state is its events
//
// All three are append-only for every role (drizzle/0010, custom part).
import { sql } from "drizzle-orm";
import { bigserial, check, index, pgTable, text, timestamp, unique, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { jobs, runs } from "./jobs";

export const calcs = pgTable(
  "calcs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    jobId: uuid("job_id")
      .notNull()
      .references(() => jobs.id),
    /** As drawings cite it, e.g. "C-012". */
    number: text("number").notNull(),
    title: text("title").notNull(),
    createdById: text("created_by_id")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("calcs_job_number_unique").on(t.jobId, t.number)],
);

export const calcRevisions = pgTable(
  "calc_revisions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    calcId: uuid("calc_id")
      .notNull()
      .references(() => calcs.id),
    /** A, B, … Z, then AA, AB, … */
    letter: text("letter").notNull(),
    runId: uuid("run_id")
      .notNull()
      .references(() => runs.id),
    preparerId: text("preparer_id")
      .notNull()
      .references(() => user.id),
    checkerId: text("checker_id")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("calc_revisions_letter_unique").on(t.calcId, t.letter),
    check("calc_revisions_letter_check", sql`${t.letter} ~ '^[A-Z]{1,2}$'`),
    // Four eyes, kept by the database too: nobody checks their own calc.
    check("calc_revisions_four_eyes", sql`${t.checkerId} <> ${t.preparerId}`),
    index("calc_revisions_run_idx").on(t.runId),
  ],
);

export const CALC_EVENT_KINDS = ["prepared", "checked", "returned", "approved", "status", "superseded"] as const;
export type CalcEventKind = (typeof CALC_EVENT_KINDS)[number];
export const ISSUE_STATUSES = ["preliminary", "for-approval", "for-construction", "superseded"] as const;
export type IssueStatus = (typeof ISSUE_STATUSES)[number];

export const calcRevisionEvents = pgTable(
  "calc_revision_events",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => calcRevisions.id),
    kind: text("kind", { enum: CALC_EVENT_KINDS }).notNull(),
    /** The issue status from this event on (set when prepared, changed by `status`, `superseded`). */
    issueStatus: text("issue_status", { enum: ISSUE_STATUSES }),
    actorId: text("actor_id").references(() => user.id),
    /** The checker's comments when returning; a note with any step. */
    note: text("note"),
    /** Why a failing run, or a run on a version no longer current, was approved all the same. */
    reason: text("reason"),
    occurredAt: timestamp("occurred_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("calc_revision_events_revision_idx").on(t.revisionId, t.id),
    check(
      "calc_revision_events_kind_check",
      sql`${t.kind} in ('prepared', 'checked', 'returned', 'approved', 'status', 'superseded')`,
    ),
    check(
      "calc_revision_events_status_check",
      sql`${t.issueStatus} is null or ${t.issueStatus} in ('preliminary', 'for-approval', 'for-construction', 'superseded')`,
    ),
    check("calc_revision_events_return_note", sql`${t.kind} <> 'returned' or length(btrim(coalesce(${t.note}, ''))) > 0`),
  ],
);
