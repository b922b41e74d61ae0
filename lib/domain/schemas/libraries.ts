// The libraries' lifecycle: what an admin or lead types when creating, saving, submitting, reviewing and
// withdrawing, and what a standard or a run gives to resolve a reference. The document itself is checked by
// lib/libraries (checkLibraryDocument) when a draft is saved and submitted; here only its size and characters,
// so a draft with problems is still saved.
import { z } from "../zod";
import { slugSchema } from "./standards";
import { replacementField } from "./withdrawals";
import { plainText } from "./text";

/** The three kinds of library; lib/libraries/document.ts's LIBRARY_KINDS (a unit test keeps them equal). */
export const LIBRARY_KIND_IDS = ["sections", "materials", "combinations"] as const;
export type LibraryKindId = (typeof LIBRARY_KIND_IDS)[number];

/** A saved document's JSON text may be this long (a catalogue of a few thousand sections fits). */
export const MAX_DOCUMENT_CHARACTERS = 5_000_000;

// NUL cannot be stored in jsonb; bidirectional controls make a designation display differently from what it is.
// eslint-disable-next-line no-control-regex -- control characters are exactly what is refused here
const DOCUMENT_HIDDEN = /[\u0000\u202a-\u202e\u2066-\u2069\u200e\u200f\u061c]/;

function hidesCharacters(value: unknown): boolean {
  if (typeof value === "string") return DOCUMENT_HIDDEN.test(value);
  if (Array.isArray(value)) return value.some(hidesCharacters);
  if (value && typeof value === "object")
    return Object.entries(value).some(([key, item]) => DOCUMENT_HIDDEN.test(key) || hidesCharacters(item));
  return false;
}

/** Any JSON value (its problems are the document check's to list), within size and without hidden characters. */
export const libraryDocumentSchema = z.unknown().superRefine((value, ctx) => {
  let text: string | undefined;
  try {
    text = JSON.stringify(value);
  } catch {
    text = undefined;
  }
  if (text === undefined) {
    ctx.addIssue({ code: "custom", message: "The document is not JSON." });
    return;
  }
  if (text.length > MAX_DOCUMENT_CHARACTERS)
    ctx.addIssue({
      code: "custom",
      message: `A library's document is limited to ${MAX_DOCUMENT_CHARACTERS.toLocaleString("en")} characters; split the library.`,
    });
  else if (hidesCharacters(value))
    ctx.addIssue({
      code: "custom",
      message: "The document holds invisible control characters (they may have come with a copy and paste); remove them.",
    });
});

const id = (what: string) => z.uuid(`Choose ${what}.`);
const sentence = (what: string, max: number) =>
  plainText().pipe(z.string().trim().min(1, `Write ${what}.`).max(max, `Keep ${what} under ${max} characters.`));
const optionalNote = z.union([z.literal(""), sentence("a note", 2000)]).default("");
/** An entry's key as a person or a standard writes it (matched case and spacing aside). */
const entryKeySchema = plainText().pipe(
  z.string().trim().min(1, "Name the entry (its designation or name).").max(80, "An entry's name is at most 80 characters."),
);

export const libraryKindSchema = z.enum(LIBRARY_KIND_IDS, "Choose sections, materials or load-combination sets.");

export const listLibrariesSchema = z.object({ kind: libraryKindSchema.optional() }).default({});
export const librarySlugSchema = z.object({ slug: slugSchema });
export const libraryVersionRefSchema = z.object({ slug: slugSchema, number: z.coerce.number().int().min(1) });
export const libraryDraftRefSchema = z.object({ draftId: id("a draft") });

export const createLibrarySchema = z.object({
  slug: slugSchema,
  kind: libraryKindSchema,
  title: sentence("a title", 120),
});
export const startLibraryDraftSchema = z.object({ versionId: id("a version to start from") });
export const saveLibraryDraftSchema = z.object({ draftId: id("a draft"), document: libraryDocumentSchema });
export const submitLibraryDraftSchema = z.object({
  draftId: id("a draft"),
  changelog: sentence("one line saying what changed (the changelog)", 300),
});
export const discardLibraryDraftSchema = z.object({ draftId: id("a draft") });

export const libraryReviewCommentSchema = z.object({
  /** The entry the comment is on; null for the whole submission. */
  entryKey: entryKeySchema.nullable(),
  body: sentence("the comment", 2000),
});
export const returnLibraryDraftSchema = z
  .object({
    reviewId: id("a submission"),
    note: optionalNote,
    comments: z.array(libraryReviewCommentSchema).max(500, "At most 500 comments at once.").default([]),
  })
  .refine((value) => value.note !== "" || value.comments.length > 0, {
    message: "Say what needs changing: a note or at least one comment on an entry.",
    path: ["note"],
  });
export const approveLibraryReviewSchema = z.object({ reviewId: id("a submission"), note: optionalNote });

export const withdrawLibraryVersionSchema = z.object({
  versionId: id("a version"),
  reason: sentence("why the version is withdrawn", 500),
  ...replacementField,
});
export const withdrawLibraryEntrySchema = z.object({
  versionId: id("a version"),
  entryKey: entryKeySchema,
  reason: sentence("why the entry is withdrawn (which value is wrong)", 500),
  ...replacementField,
});

/**
 * A reference to one entry, as a standard or a run writes it: the library's slug, a version number (pinned) or
 * "latest" (the newest version that is not withdrawn), and the entry's key.
 */
export const libraryReferenceSchema = z.object({
  library: slugSchema,
  version: z.union([z.literal("latest"), z.coerce.number().int().min(1)], 'Give a version number or "latest".'),
  entry: entryKeySchema,
});
export type LibraryReference = z.infer<typeof libraryReferenceSchema>;
