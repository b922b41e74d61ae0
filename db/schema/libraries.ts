// The firm's libraries (sections, materials, load-combination sets): each a series of numbered, immutable
// versions, with the same lifecycle and four-eyes rule as a standard (db/schema/standards.ts). A version's
// document is lib/libraries/document.ts's.
//
//   libraries                 one row per library (its slug and kind); the title lives in its versions
//   library_drafts            an admin's or lead's working copy of the document; the only rows here that change
//   library_reviews           one per submission: the document as submitted, its changelog line, and the second
//                             person's decision (returned or approved)
//   library_review_comments   a reviewer's comments, each on an entry (by key) or on the whole (append-only)
//   library_versions          a published version: the checked document, its content hash, author, reviewer and
//                             number (append-only)
//   library_version_entries   one row per entry of a published version, with its entry hash: what a run points
//                             at (by id) and records the hash of, and what a withdrawal's impact report joins on
//                             (append-only)
//   library_version_events    published, superseded, withdrawn (append-only). A version's status is its latest
//                             event without an entry key; an event with one withdraws that entry alone (a wrong
//                             property in the catalogue) and leaves the rest of the version in use
//   standard_version_library_pins
//                             the library version each `latest` reference of a standard version resolved to when
//                             it was published: its runs use that version, not whatever is newest later
//                             (append-only)
//
// The append-only triggers are in drizzle/0008_libraries.sql (custom part); scripts/lib/app-privileges.ts gives
// the app's role only SELECT and INSERT on tables with such a trigger.
import { sql } from "drizzle-orm";
import {
  type AnyPgColumn,
  bigserial,
  check,
  foreignKey,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  unique,
  uuid,
} from "drizzle-orm/pg-core";
import { LIBRARY_KIND_IDS } from "@/lib/domain/schemas/libraries";
import { user } from "./auth";
import { DRAFT_STATES, REVIEW_OUTCOMES, standardVersions, VERSION_EVENT_KINDS } from "./standards";

export const libraries = pgTable(
  "libraries",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    /** Kebab-case, unique in the firm: how standards and runs name the library. */
    slug: text("slug").notNull().unique(),
    /** Fixed for the library's life: every version's document is of this kind. */
    kind: text("kind", { enum: LIBRARY_KIND_IDS }).notNull(),
    createdById: text("created_by_id").references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check("libraries_kind_check", sql`${t.kind} in ('sections', 'materials', 'combinations')`)],
);
export type Library = typeof libraries.$inferSelect;

export const libraryDrafts = pgTable(
  "library_drafts",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    libraryId: uuid("library_id")
      .notNull()
      .references(() => libraries.id),
    /** The version this draft started from; null for a new library's first draft. */
    basedOnVersionId: uuid("based_on_version_id").references((): AnyPgColumn => libraryVersions.id),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    /** Whatever was last saved, problems and all (nothing typed is lost); checked when submitted. */
    document: jsonb("document").$type<unknown>().notNull(),
    state: text("state", { enum: DRAFT_STATES }).notNull().default("editing"),
    publishedVersionId: uuid("published_version_id").references((): AnyPgColumn => libraryVersions.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("library_drafts_library_idx").on(t.libraryId),
    check("library_drafts_state_check", sql`${t.state} in ('editing', 'in-review', 'published', 'discarded')`),
  ],
);
export type LibraryDraft = typeof libraryDrafts.$inferSelect;

export const libraryReviews = pgTable(
  "library_reviews",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    draftId: uuid("draft_id")
      .notNull()
      .references(() => libraryDrafts.id),
    round: integer("round").notNull(),
    /** The document exactly as submitted: comments point at its entries, approval publishes it. */
    document: jsonb("document").$type<unknown>().notNull(),
    /**
     * Its content hash when submitted (of the checked document, section properties computed): approval refuses
     * to publish anything else, should the section builder have changed in between.
     */
    contentHash: text("content_hash").notNull(),
    changelog: text("changelog").notNull(),
    submittedById: text("submitted_by_id")
      .notNull()
      .references(() => user.id),
    submittedAt: timestamp("submitted_at", { withTimezone: true }).notNull().defaultNow(),
    reviewerId: text("reviewer_id").references(() => user.id),
    outcome: text("outcome", { enum: REVIEW_OUTCOMES }),
    note: text("note"),
    decidedAt: timestamp("decided_at", { withTimezone: true }),
  },
  (t) => [
    unique("library_reviews_round_unique").on(t.draftId, t.round),
    check("library_reviews_hash_check", sql`${t.contentHash} ~ '^[0-9a-f]{64}$'`),
    check("library_reviews_outcome_check", sql`${t.outcome} is null or ${t.outcome} in ('returned', 'approved')`),
    // Four eyes, kept by the database too: nobody decides on their own submission.
    check("library_reviews_four_eyes", sql`${t.reviewerId} is null or ${t.reviewerId} <> ${t.submittedById}`),
  ],
);
export type LibraryReview = typeof libraryReviews.$inferSelect;

export const libraryReviewComments = pgTable(
  "library_review_comments",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    reviewId: uuid("review_id")
      .notNull()
      .references(() => libraryReviews.id),
    /** The entry's key as the submitted document writes it; null for a comment on the whole submission. */
    entryKey: text("entry_key"),
    body: text("body").notNull(),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("library_review_comments_review_idx").on(t.reviewId)],
);
export type LibraryReviewComment = typeof libraryReviewComments.$inferSelect;

export const libraryVersions = pgTable(
  "library_versions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    libraryId: uuid("library_id")
      .notNull()
      .references(() => libraries.id),
    number: integer("number").notNull(),
    /** Copied from the document (and the library) for lists; the document stays the authority. */
    kind: text("kind", { enum: LIBRARY_KIND_IDS }).notNull(),
    title: text("title").notNull(),
    /** The checked document (section entries completed with the builder's properties). */
    document: jsonb("document").$type<unknown>().notNull(),
    /** sha256 (hex) of the RFC 8785 form of the document: libraryContentHash in lib/libraries/document.ts. */
    contentHash: text("content_hash").notNull(),
    changelog: text("changelog").notNull(),
    authorId: text("author_id")
      .notNull()
      .references(() => user.id),
    reviewerId: text("reviewer_id")
      .notNull()
      .references(() => user.id),
    basedOnVersionId: uuid("based_on_version_id").references((): AnyPgColumn => libraryVersions.id),
    draftId: uuid("draft_id").references(() => libraryDrafts.id),
    reviewId: uuid("review_id").references(() => libraryReviews.id),
    publishedAt: timestamp("published_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    // Two publications of one library never get the same number (the library's row is locked too).
    unique("library_versions_number_unique").on(t.libraryId, t.number),
    check("library_versions_number_check", sql`${t.number} >= 1`),
    check("library_versions_kind_check", sql`${t.kind} in ('sections', 'materials', 'combinations')`),
    check("library_versions_four_eyes", sql`${t.reviewerId} <> ${t.authorId}`),
    check("library_versions_hash_check", sql`${t.contentHash} ~ '^[0-9a-f]{64}$'`),
    // What a pin's foreign key points at: a version together with its own library.
    unique("library_versions_id_library_unique").on(t.id, t.libraryId),
  ],
);
export type LibraryVersion = typeof libraryVersions.$inferSelect;

export const libraryVersionEntries = pgTable(
  "library_version_entries",
  {
    /** What a run stores to name the entry it used (beside the entry hash, which it also records). */
    id: uuid("id").primaryKey().defaultRandom(),
    versionId: uuid("version_id")
      .notNull()
      .references(() => libraryVersions.id),
    /** Where the entry stands in the version's document (0-based). */
    position: integer("position").notNull(),
    /** As the document writes it. */
    key: text("key").notNull(),
    /** normaliseKey(key): case and spacing aside, how references find it. */
    normalisedKey: text("normalised_key").notNull(),
    /** sha256 (hex) of the RFC 8785 form of the entry: libraryEntryHash. */
    entryHash: text("entry_hash").notNull(),
  },
  (t) => [
    unique("library_version_entries_key_unique").on(t.versionId, t.normalisedKey),
    unique("library_version_entries_position_unique").on(t.versionId, t.position),
    check("library_version_entries_hash_check", sql`${t.entryHash} ~ '^[0-9a-f]{64}$'`),
    check("library_version_entries_position_check", sql`${t.position} >= 0`),
  ],
);
export type LibraryVersionEntry = typeof libraryVersionEntries.$inferSelect;

export const libraryVersionEvents = pgTable(
  "library_version_events",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    versionId: uuid("version_id")
      .notNull()
      .references(() => libraryVersions.id),
    kind: text("kind", { enum: VERSION_EVENT_KINDS }).notNull(),
    /** The normalised key of the one entry withdrawn; null for an event of the whole version. */
    entryKey: text("entry_key"),
    /** Why it was withdrawn; which version superseded it. */
    reason: text("reason"),
    actorId: text("actor_id").references(() => user.id),
    occurredAt: timestamp("occurred_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("library_version_events_version_idx").on(t.versionId, t.id),
    check("library_version_events_kind_check", sql`${t.kind} in ('published', 'superseded', 'withdrawn')`),
    // Only a withdrawal names one entry; a withdrawal always says why.
    check("library_version_events_entry_check", sql`${t.entryKey} is null or ${t.kind} = 'withdrawn'`),
    check(
      "library_version_events_reason_check",
      sql`${t.kind} <> 'withdrawn' or (${t.reason} is not null and length(btrim(${t.reason})) > 0)`,
    ),
    // The key names an entry of that very version.
    foreignKey({
      name: "library_version_events_entry_fk",
      columns: [t.versionId, t.entryKey],
      foreignColumns: [libraryVersionEntries.versionId, libraryVersionEntries.normalisedKey],
    }),
  ],
);
export type LibraryVersionEvent = typeof libraryVersionEvents.$inferSelect;

export const standardVersionLibraryPins = pgTable(
  "standard_version_library_pins",
  {
    standardVersionId: uuid("standard_version_id")
      .notNull()
      .references(() => standardVersions.id),
    libraryId: uuid("library_id")
      .notNull()
      .references(() => libraries.id),
    /** The newest published version not withdrawn when the standard version was published. */
    libraryVersionId: uuid("library_version_id").notNull(),
    pinnedAt: timestamp("pinned_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    // One pin per library: every `latest` reference of a version to one library reads the same version.
    primaryKey({ columns: [t.standardVersionId, t.libraryId] }),
    index("standard_version_library_pins_version_idx").on(t.libraryVersionId),
    // The pinned version is a version of that very library.
    foreignKey({
      name: "standard_version_library_pins_version_fk",
      columns: [t.libraryVersionId, t.libraryId],
      foreignColumns: [libraryVersions.id, libraryVersions.libraryId],
    }),
  ],
);
export type StandardVersionLibraryPin = typeof standardVersionLibraryPins.$inferSelect;
