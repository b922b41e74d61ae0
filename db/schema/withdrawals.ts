// Withdrawals and what follows them: the impact report's subject, the declared way onto a successor, the signed
// outcome of each affected calc revision, and batch re-runs on the successor. Everything here is append-only
// (drizzle/0016_withdrawals.sql, hand-written part): a changed mind is a new row, the latest one counts.
//
//   withdrawals            one per withdrawn thing: a standard version, a library version or one library entry,
//                          with the reason (the version or library event says it too; this row is what the impact
//                          report, its mapping, outcomes and batches hang on)
//   withdrawal_mappings    how the old inputs map onto the successor's: the successor version (a standard's) or the
//                          replacement entry (a library's), renamed keys, values for new inputs, inputs dropped
//   withdrawal_outcomes    the signed outcome of one affected calc revision: no action needed (why), re-run and
//                          re-checked (the new revision), drawings revised (their reference)
//   rerun_batches          a batch re-run of every affected run on a mapping, started by a lead
//   rerun_batch_items      one per original run re-run: the new run (or the failure's message), and the change in
//                          its checks; unique (batch, original run) so a job delivered twice does its work once
import { sql } from "drizzle-orm";
import {
  bigserial,
  boolean,
  check,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  text,
  timestamp,
  unique,
  uuid,
} from "drizzle-orm/pg-core";
import { user } from "./auth";
import { standardVersions } from "./standards";
import { libraryVersionEntries, libraryVersions } from "./libraries";
import { runs } from "./jobs";
import { calcRevisions } from "./calcs";

export const WITHDRAWAL_SUBJECTS = ["standard-version", "library-version", "library-entry"] as const;
export type WithdrawalSubject = (typeof WITHDRAWAL_SUBJECTS)[number];

export const withdrawals = pgTable(
  "withdrawals",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    subject: text("subject", { enum: WITHDRAWAL_SUBJECTS }).notNull(),
    standardVersionId: uuid("standard_version_id")
      .unique()
      .references(() => standardVersions.id),
    libraryVersionId: uuid("library_version_id")
      .unique()
      .references(() => libraryVersions.id),
    libraryEntryId: uuid("library_entry_id")
      .unique()
      .references(() => libraryVersionEntries.id),
    reason: text("reason").notNull(),
    actorId: text("actor_id").references(() => user.id),
    occurredAt: timestamp("occurred_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check(
      "withdrawals_subject_check",
      sql`(${t.subject} = 'standard-version' and ${t.standardVersionId} is not null and ${t.libraryVersionId} is null and ${t.libraryEntryId} is null)
       or (${t.subject} = 'library-version' and ${t.libraryVersionId} is not null and ${t.standardVersionId} is null and ${t.libraryEntryId} is null)
       or (${t.subject} = 'library-entry' and ${t.libraryEntryId} is not null and ${t.standardVersionId} is null and ${t.libraryVersionId} is null)`,
    ),
    check("withdrawals_reason_check", sql`length(btrim(${t.reason})) > 0`),
    index("withdrawals_occurred_idx").on(t.occurredAt.desc()),
  ],
);
export type Withdrawal = typeof withdrawals.$inferSelect;

/** How a run's typed inputs become the successor's: stored as declared (checked against both versions first). */
export type InputMapping = {
  /** Old input key → the successor's key it becomes. */
  rename: Record<string, string>;
  /** Values (as typed, with units) for the successor's inputs the old version did not have. */
  values: Record<string, string | number>;
  /** Old inputs the successor has no place for, left out. */
  drop: string[];
};

export const withdrawalMappings = pgTable(
  "withdrawal_mappings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    withdrawalId: uuid("withdrawal_id")
      .notNull()
      .references(() => withdrawals.id),
    /** A standard's successor: a published version of the same standard. */
    successorVersionId: uuid("successor_version_id").references(() => standardVersions.id),
    /** A library's replacement: the entry name runs take instead (resolved as their standard references the library). */
    replacementEntryKey: text("replacement_entry_key"),
    mapping: jsonb("mapping").$type<InputMapping>().notNull(),
    declaredById: text("declared_by_id")
      .notNull()
      .references(() => user.id),
    declaredAt: timestamp("declared_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("withdrawal_mappings_withdrawal_idx").on(t.withdrawalId, t.declaredAt)],
);

export const OUTCOME_KINDS = ["no-action", "rerun-checked", "drawings-revised"] as const;
export type OutcomeKind = (typeof OUTCOME_KINDS)[number];

export const withdrawalOutcomes = pgTable(
  "withdrawal_outcomes",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    withdrawalId: uuid("withdrawal_id")
      .notNull()
      .references(() => withdrawals.id),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => calcRevisions.id),
    kind: text("kind", { enum: OUTCOME_KINDS }).notNull(),
    /** Why no action is needed (required then); a note with the others. */
    reason: text("reason"),
    /** The revision that re-ran and was re-checked. */
    newRevisionId: uuid("new_revision_id").references(() => calcRevisions.id),
    /** The revised drawings (numbers and revision). */
    reference: text("reference"),
    actorId: text("actor_id")
      .notNull()
      .references(() => user.id),
    occurredAt: timestamp("occurred_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("withdrawal_outcomes_withdrawal_idx").on(t.withdrawalId, t.revisionId, t.id),
    check("withdrawal_outcomes_kind_check", sql`${t.kind} in ('no-action', 'rerun-checked', 'drawings-revised')`),
    check(
      "withdrawal_outcomes_evidence_check",
      sql`(${t.kind} <> 'no-action' or length(btrim(coalesce(${t.reason}, ''))) > 0)
       and (${t.kind} <> 'rerun-checked' or ${t.newRevisionId} is not null)
       and (${t.kind} <> 'drawings-revised' or length(btrim(coalesce(${t.reference}, ''))) > 0)`,
    ),
  ],
);

export const rerunBatches = pgTable(
  "rerun_batches",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    withdrawalId: uuid("withdrawal_id")
      .notNull()
      .references(() => withdrawals.id),
    /** One batch per declared mapping: a new mapping may be run again, the same one never twice. */
    mappingId: uuid("mapping_id")
      .notNull()
      .unique()
      .references(() => withdrawalMappings.id),
    /** The runs to re-run, counted when it started (every affected run). */
    total: integer("total").notNull(),
    startedById: text("started_by_id")
      .notNull()
      .references(() => user.id),
    startedAt: timestamp("started_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("rerun_batches_withdrawal_idx").on(t.withdrawalId, t.startedAt),
    check("rerun_batches_total_check", sql`${t.total} >= 0`),
  ],
);

export const RERUN_STATUSES = ["succeeded", "failed"] as const;
export type RerunStatus = (typeof RERUN_STATUSES)[number];

export const rerunBatchItems = pgTable(
  "rerun_batch_items",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    batchId: uuid("batch_id")
      .notNull()
      .references(() => rerunBatches.id),
    originalRunId: uuid("original_run_id")
      .notNull()
      .references(() => runs.id),
    /** The re-run (a run of purpose remediation whose parent is the original); null when its inputs were refused. */
    newRunId: uuid("new_run_id")
      .unique()
      .references(() => runs.id),
    /** succeeded: the re-run was stored and analysed; failed: refused inputs, or a model the engine could not analyse. */
    status: text("status", { enum: RERUN_STATUSES }).notNull(),
    message: text("message"),
    passBefore: boolean("pass_before"),
    passAfter: boolean("pass_after"),
    utilisationBefore: doublePrecision("utilisation_before"),
    utilisationAfter: doublePrecision("utilisation_after"),
    /** Checks that passed on the original and fail on the re-run. */
    newlyFailing: integer("newly_failing").notNull().default(0),
    /** Each check on both sides: key, label, utilisation and pass before and after. */
    checks: jsonb("checks").$type<CheckDelta[]>().notNull(),
    finishedAt: timestamp("finished_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("rerun_batch_items_batch_run_unique").on(t.batchId, t.originalRunId),
    check("rerun_batch_items_status_check", sql`${t.status} in ('succeeded', 'failed')`),
    check("rerun_batch_items_failure_check", sql`${t.status} = 'failed' or ${t.newRunId} is not null`),
  ],
);

export type CheckDelta = {
  key: string;
  label: string;
  before: { utilisation: number; pass: boolean } | null;
  after: { utilisation: number; pass: boolean } | null;
};
