// Jobs (the trade's word for a project, by job number) and the runs made inside them.
//
//   jobs                  one row per job; the only rows here that change (name, client, site, responsible
//                         engineer, status), each change an audit event
//   runs                  one published version evaluated with a person's inputs: the canonical record (RFC 8785
//                         JSON, the bytes as written) and its sha256, with the columns lists filter on copied
//                         from it. Append-only: the database refuses UPDATE and DELETE (drizzle/0009, custom part)
//   run_library_entries   the library entries a run used (a section, a material), one row per input, pointing
//                         at the published entry row and its hash: what a withdrawal's impact report joins on
//   job_attachments       files kept on a job or on one of its runs (sketches, site photos, PDFs): stored in S3 by
//                         their sha256 before the row is written; append-only
//   calc_sheet_pdfs       each state of a run's calc sheet rendered to PDF by Chromium and stored in S3: a new
//                         sign-off or a withdrawal banner gives a new row, an old one is kept; append-only
//   calc_sheet_pdf_keys   each sheet key a kept PDF is known by: the sha256 of what the sheet shows, read from the
//                         database, and the build that draws it (lib/use-cases/sheet-key.ts), so a kept PDF is served
//                         without opening Chromium; one PDF may have several (a new build drawing the same sheet);
//                         append-only, so a key never comes to name another PDF
import { sql } from "drizzle-orm";
import {
  type AnyPgColumn,
  boolean,
  check,
  doublePrecision,
  index,
  integer,
  pgTable,
  primaryKey,
  text,
  timestamp,
  unique,
  uuid,
} from "drizzle-orm/pg-core";
import { user } from "./auth";
import { standardVersions } from "./standards";
import { libraryVersionEntries } from "./libraries";

export const JOB_STATUSES = ["active", "on-hold", "closed"] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

export const jobs = pgTable(
  "jobs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    /** The firm's job number as written on drawings and calc sheets, e.g. "MF-2291". */
    jobNumber: text("job_number").notNull().unique(),
    name: text("name").notNull(),
    client: text("client"),
    site: text("site"),
    /** Who approves the job's calcs. Null only for jobs made before the field existed. */
    responsibleEngineerId: text("responsible_engineer_id").references(() => user.id),
    status: text("status", { enum: JOB_STATUSES }).notNull().default("active"),
    createdById: text("created_by_id").references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check("jobs_status_check", sql`${t.status} in ('active', 'on-hold', 'closed')`)],
);
export type Job = typeof jobs.$inferSelect;
export type NewJob = typeof jobs.$inferInsert;

export const RUN_OUTCOMES = ["succeeded", "failed"] as const;
export type RunOutcome = (typeof RUN_OUTCOMES)[number];
export const RUN_PURPOSES = ["design", "remediation"] as const;
export type RunPurpose = (typeof RUN_PURPOSES)[number];
export const UNIT_SYSTEMS = ["si", "us"] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

export const runs = pgTable(
  "runs",
  {
    /** Made by the app before the record is written, since the record names it. */
    id: uuid("id").primaryKey(),
    jobId: uuid("job_id")
      .notNull()
      .references(() => jobs.id),
    versionId: uuid("version_id")
      .notNull()
      .references(() => standardVersions.id),
    outcome: text("outcome", { enum: RUN_OUTCOMES }).notNull(),
    /** Every check passes and every guard holds; null for a failed run. */
    pass: boolean("pass"),
    /** The largest utilisation among the checks; null for a failed run or one without checks. */
    maxUtilisation: doublePrecision("max_utilisation"),
    purpose: text("purpose", { enum: RUN_PURPOSES }).notNull().default("design"),
    /** The run this one re-ran with changes (the form pre-filled from it). */
    parentRunId: uuid("parent_run_id").references((): AnyPgColumn => runs.id),
    unitSystem: text("unit_system", { enum: UNIT_SYSTEMS }).notNull(),
    /** The canonical record (RFC 8785), stored as the very text that was hashed. */
    record: text("record").notNull(),
    recordSha256: text("record_sha256").notNull(),
    recordBytes: integer("record_bytes").notNull(),
    createdById: text("created_by_id")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull(),
  },
  (t) => [
    // The run lists' orders and filters (lib/data/runs.ts listRuns), each read as a range in its order, so a page of
    // a million runs filtered by job, version, person or failure stays a few index pages (npm run bench:audit).
    index("runs_job_created_idx").on(t.jobId, t.createdAt.desc(), t.id.desc()),
    index("runs_version_created_idx").on(t.versionId, t.createdAt.desc(), t.id.desc()),
    index("runs_created_idx").on(t.createdAt.desc(), t.id.desc()),
    index("runs_person_created_idx").on(t.createdById, t.createdAt.desc(), t.id.desc()),
    // Largest utilisation first; a run without one sorts below every number (the key listRuns sorts on).
    index("runs_utilisation_idx").on(
      sql`coalesce(${t.maxUtilisation}, '-Infinity'::float8) desc nulls last`,
      t.createdAt.desc(),
      t.id.desc(),
    ),
    // One person's runs by utilisation ("whose runs are nearest their limits"), read in order: with the index above a
    // person's 28,000 runs of a million were walked in utilisation order and filtered one by one (136 ms for a page of
    // one person's runs of one standard; 2 ms with this one).
    index("runs_person_utilisation_idx").on(
      t.createdById,
      sql`coalesce(${t.maxUtilisation}, '-Infinity'::float8) desc nulls last`,
      t.createdAt.desc(),
      t.id.desc(),
    ),
    // Failures are few: "failed in the engine" and "a check fails" read from their own small indexes.
    index("runs_failed_created_idx")
      .on(t.createdAt.desc(), t.id.desc())
      .where(sql`${t.outcome} = 'failed'`),
    index("runs_not_passing_created_idx")
      .on(t.createdAt.desc(), t.id.desc())
      .where(sql`${t.pass} = false`),
    // One job's failing runs in a period: read from the job's own failures, not from all its runs (a page from a
    // cold cache read 330 rows of the table for 50: p95 75 ms on a million runs; 25 ms with this index).
    index("runs_job_not_passing_created_idx")
      .on(t.jobId, t.createdAt.desc(), t.id.desc())
      .where(sql`${t.pass} = false`),
    check("runs_outcome_check", sql`${t.outcome} in ('succeeded', 'failed')`),
    check("runs_purpose_check", sql`${t.purpose} in ('design', 'remediation')`),
    check("runs_unit_system_check", sql`${t.unitSystem} in ('si', 'us')`),
    check("runs_pass_check", sql`(${t.outcome} = 'failed') = (${t.pass} is null)`),
    check("runs_sha256_check", sql`${t.recordSha256} ~ '^[0-9a-f]{64}$'`),
  ],
);
export type Run = typeof runs.$inferSelect;

export const runLibraryEntries = pgTable(
  "run_library_entries",
  {
    runId: uuid("run_id")
      .notNull()
      .references(() => runs.id),
    /** The standard's input that took the entry (`beam`, `steel`). */
    inputKey: text("input_key").notNull(),
    entryId: uuid("entry_id")
      .notNull()
      .references(() => libraryVersionEntries.id),
    /** The entry's hash as the run read it (equal to the entry row's; kept so the record stands alone). */
    entryHash: text("entry_hash").notNull(),
  },
  (t) => [primaryKey({ columns: [t.runId, t.inputKey] }), index("run_library_entries_entry_idx").on(t.entryId)],
);

/** What a job or run takes as an attachment, told by the file's first bytes (never its name). */
export const JOB_ATTACHMENT_TYPES = ["application/pdf", "image/png", "image/jpeg", "image/webp"] as const;
export type JobAttachmentType = (typeof JOB_ATTACHMENT_TYPES)[number];

export const jobAttachments = pgTable(
  "job_attachments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    jobId: uuid("job_id")
      .notNull()
      .references(() => jobs.id),
    /** Null for a file on the job itself. */
    runId: uuid("run_id").references(() => runs.id),
    /** sha256 (hex) of the bytes; the S3 key is jobs/<job id>/attachments/<sha256>. */
    sha256: text("sha256").notNull(),
    fileName: text("file_name").notNull(),
    contentType: text("content_type", { enum: JOB_ATTACHMENT_TYPES }).notNull(),
    bytes: integer("bytes").notNull(),
    /** What the file is, in the uploader's words ("site photo, north gable"). */
    note: text("note"),
    uploadedById: text("uploaded_by_id")
      .notNull()
      .references(() => user.id),
    uploadedAt: timestamp("uploaded_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("job_attachments_place_sha256_unique").on(t.jobId, t.runId, t.sha256).nullsNotDistinct(),
    index("job_attachments_run_idx").on(t.runId),
    check("job_attachments_sha256_check", sql`${t.sha256} ~ '^[0-9a-f]{64}$'`),
    check("job_attachments_bytes_check", sql`${t.bytes} > 0`),
    check(
      "job_attachments_content_type_check",
      sql`${t.contentType} in ('application/pdf', 'image/png', 'image/jpeg', 'image/webp')`,
    ),
  ],
);
export type JobAttachment = typeof jobAttachments.$inferSelect;

export const calcSheetPdfs = pgTable(
  "calc_sheet_pdfs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    runId: uuid("run_id")
      .notNull()
      .references(() => runs.id),
    /** sha256 of the sheet as Chromium laid it out (its markup): one PDF per state the sheet has shown. */
    stateSha256: text("state_sha256").notNull(),
    /** sha256 of the PDF's bytes; the S3 key is runs/<run id>/sheets/<sha256>.pdf. */
    sha256: text("sha256").notNull(),
    bytes: integer("bytes").notNull(),
    pages: integer("pages").notNull(),
    renderedById: text("rendered_by_id")
      .notNull()
      .references(() => user.id),
    renderedAt: timestamp("rendered_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("calc_sheet_pdfs_run_state_unique").on(t.runId, t.stateSha256),
    index("calc_sheet_pdfs_run_idx").on(t.runId, t.renderedAt),
    check("calc_sheet_pdfs_sha256_check", sql`${t.sha256} ~ '^[0-9a-f]{64}$' and ${t.stateSha256} ~ '^[0-9a-f]{64}$'`),
    check("calc_sheet_pdfs_bytes_check", sql`${t.bytes} > 0 and ${t.pages} > 0`),
  ],
);
export type CalcSheetPdf = typeof calcSheetPdfs.$inferSelect;

export const calcSheetPdfKeys = pgTable(
  "calc_sheet_pdf_keys",
  {
    runId: uuid("run_id")
      .notNull()
      .references(() => runs.id),
    /** sha256 (hex) of the sheet's facts and the app's build, as the sheet page computed it when it drew the PDF. */
    sheetKey: text("sheet_key").notNull(),
    pdfId: uuid("pdf_id")
      .notNull()
      .references(() => calcSheetPdfs.id),
    keptAt: timestamp("kept_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ name: "calc_sheet_pdf_keys_pkey", columns: [t.runId, t.sheetKey] }),
    index("calc_sheet_pdf_keys_pdf_idx").on(t.pdfId),
    check("calc_sheet_pdf_keys_key_check", sql`${t.sheetKey} ~ '^[0-9a-f]{64}$'`),
  ],
);
export type CalcSheetPdfKey = typeof calcSheetPdfKeys.$inferSelect;
