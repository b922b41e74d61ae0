// The firm's standards: calculation templates, each a series of numbered, immutable versions.
//
//   standards                 one row per standard (its slug); the title and the rest live in its versions
//   standard_drafts           a lead's working copy: edited, submitted, returned, edited again; the only
//                             rows here that change
//   standard_reviews          one per submission: the source as submitted, its changelog line, and the
//                             second lead's decision (returned or approved)
//   standard_review_comments  a reviewer's comments, each on a line of the submitted source (append-only)
//   standard_versions         a published version: the source, its content hash, author, reviewer and
//                             number (append-only: the database refuses UPDATE and DELETE for everyone)
//   standard_version_events   published, superseded, withdrawn (append-only); a version's status is its
//                             latest event, so nothing published is ever updated
//   standard_attachments      files a standard's verification cases cite (hand calculations), stored in S3
//                             under their sha256 (append-only: a published version's evidence never goes)
//
// The append-only triggers are in drizzle/0005_standards.sql (custom part); scripts/lib/app-privileges.ts
// gives the app's role only SELECT and INSERT on tables with such a trigger.
import { sql } from "drizzle-orm";
import {
  type AnyPgColumn,
  bigserial,
  check,
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

export const standards = pgTable("standards", {
  id: uuid("id").primaryKey().defaultRandom(),
  /** Kebab-case, unique in the firm; the folder name under content/standards/ for the starting ones. */
  slug: text("slug").notNull().unique(),
  createdById: text("created_by_id").references(() => user.id),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});
export type Standard = typeof standards.$inferSelect;

export const DRAFT_STATES = ["editing", "in-review", "published", "discarded"] as const;
export type DraftState = (typeof DRAFT_STATES)[number];

export const standardDrafts = pgTable(
  "standard_drafts",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    standardId: uuid("standard_id")
      .notNull()
      .references(() => standards.id),
    /** The version this draft started from; null for a new standard's first draft. */
    basedOnVersionId: uuid("based_on_version_id").references((): AnyPgColumn => standardVersions.id),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    source: text("source").notNull(),
    state: text("state", { enum: DRAFT_STATES }).notNull().default("editing"),
    /** Set when published: the version it became. */
    publishedVersionId: uuid("published_version_id").references((): AnyPgColumn => standardVersions.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("standard_drafts_standard_idx").on(t.standardId),
    check("standard_drafts_state_check", sql`${t.state} in ('editing', 'in-review', 'published', 'discarded')`),
  ],
);
export type StandardDraft = typeof standardDrafts.$inferSelect;

export const REVIEW_OUTCOMES = ["returned", "approved"] as const;
export type ReviewOutcome = (typeof REVIEW_OUTCOMES)[number];

export const standardReviews = pgTable(
  "standard_reviews",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    draftId: uuid("draft_id")
      .notNull()
      .references(() => standardDrafts.id),
    /** 1 for the first submission of the draft, 2 after it was returned once, … */
    round: integer("round").notNull(),
    /** The source exactly as submitted: comments point at its lines. */
    source: text("source").notNull(),
    changelog: text("changelog").notNull(),
    submittedById: text("submitted_by_id")
      .notNull()
      .references(() => user.id),
    submittedAt: timestamp("submitted_at", { withTimezone: true }).notNull().defaultNow(),
    reviewerId: text("reviewer_id").references(() => user.id),
    outcome: text("outcome", { enum: REVIEW_OUTCOMES }),
    /** The reviewer's overall note with the decision. */
    note: text("note"),
    decidedAt: timestamp("decided_at", { withTimezone: true }),
  },
  (t) => [
    unique("standard_reviews_round_unique").on(t.draftId, t.round),
    check("standard_reviews_outcome_check", sql`${t.outcome} is null or ${t.outcome} in ('returned', 'approved')`),
    // Four eyes, kept by the database too: nobody decides on their own submission.
    check("standard_reviews_four_eyes", sql`${t.reviewerId} is null or ${t.reviewerId} <> ${t.submittedById}`),
  ],
);
export type StandardReview = typeof standardReviews.$inferSelect;

export const standardReviewComments = pgTable(
  "standard_review_comments",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    reviewId: uuid("review_id")
      .notNull()
      .references(() => standardReviews.id),
    /** Line of the submitted source; null for a comment on the whole submission. */
    line: integer("line"),
    body: text("body").notNull(),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("standard_review_comments_review_idx").on(t.reviewId)],
);
export type StandardReviewComment = typeof standardReviewComments.$inferSelect;

export const standardVersions = pgTable(
  "standard_versions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    standardId: uuid("standard_id")
      .notNull()
      .references(() => standards.id),
    number: integer("number").notNull(),
    source: text("source").notNull(),
    /** sha256 (hex) of the RFC 8785 canonical form of {definition, narrative}: lib/standards/content-hash.ts. */
    contentHash: text("content_hash").notNull(),
    // Copied from the definition for lists and search; the source stays the authority.
    title: text("title").notNull(),
    category: text("category").notNull(),
    tags: text("tags")
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    summary: text("summary").notNull(),
    changelog: text("changelog").notNull(),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    reviewerId: text("reviewer_id")
      .notNull()
      .references(() => user.id),
    basedOnVersionId: uuid("based_on_version_id").references((): AnyPgColumn => standardVersions.id),
    draftId: uuid("draft_id").references(() => standardDrafts.id),
    reviewId: uuid("review_id").references(() => standardReviews.id),
    /** The engine and evaluation identity the verification cases passed on at publication, and their results. */
    verifiedWith: text("verified_with").notNull(),
    verification: jsonb("verification").$type<unknown>().notNull(),
    publishedAt: timestamp("published_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    // Two leads publishing at once never get the same number (the parent row is locked too).
    unique("standard_versions_number_unique").on(t.standardId, t.number),
    check("standard_versions_number_check", sql`${t.number} >= 1`),
    check("standard_versions_four_eyes", sql`${t.reviewerId} <> ${t.authorId}`),
    check("standard_versions_hash_check", sql`${t.contentHash} ~ '^[0-9a-f]{64}$'`),
  ],
);
export type StandardVersion = typeof standardVersions.$inferSelect;

export const VERSION_EVENT_KINDS = ["published", "superseded", "withdrawn"] as const;
export type VersionEventKind = (typeof VERSION_EVENT_KINDS)[number];

export const standardVersionEvents = pgTable(
  "standard_version_events",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    versionId: uuid("version_id")
      .notNull()
      .references(() => standardVersions.id),
    kind: text("kind", { enum: VERSION_EVENT_KINDS }).notNull(),
    /** Why it was withdrawn; which version superseded it. */
    reason: text("reason"),
    actorId: text("actor_id").references(() => user.id),
    occurredAt: timestamp("occurred_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("standard_version_events_version_idx").on(t.versionId, t.id),
    check("standard_version_events_kind_check", sql`${t.kind} in ('published', 'superseded', 'withdrawn')`),
  ],
);
export type StandardVersionEvent = typeof standardVersionEvents.$inferSelect;

/** Accepted for hand calculations: what a checker scans or exports. */
export const ATTACHMENT_TYPES = ["application/pdf", "image/png", "image/jpeg"] as const;
export type AttachmentType = (typeof ATTACHMENT_TYPES)[number];

export const standardAttachments = pgTable(
  "standard_attachments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    standardId: uuid("standard_id")
      .notNull()
      .references(() => standards.id),
    /** sha256 (hex) of the file's bytes; its S3 key is standards/hand-calculations/<sha256>. */
    sha256: text("sha256").notNull(),
    fileName: text("file_name").notNull(),
    contentType: text("content_type", { enum: ATTACHMENT_TYPES }).notNull(),
    bytes: integer("bytes").notNull(),
    uploadedById: text("uploaded_by_id")
      .notNull()
      .references(() => user.id),
    uploadedAt: timestamp("uploaded_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("standard_attachments_standard_sha256_unique").on(t.standardId, t.sha256),
    check("standard_attachments_sha256_check", sql`${t.sha256} ~ '^[0-9a-f]{64}$'`),
    check("standard_attachments_bytes_check", sql`${t.bytes} > 0`),
    check("standard_attachments_content_type_check", sql`${t.contentType} in ('application/pdf', 'image/png', 'image/jpeg')`),
  ],
);
export type StandardAttachment = typeof standardAttachments.$inferSelect;
