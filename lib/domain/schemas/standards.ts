// The standards' lifecycle: what a lead types when starting, saving, submitting, reviewing and withdrawing.
// A standard's source itself is checked by lib/standards (compile); here only its size and characters.
import { z } from "../zod";
import { plainText } from "./text";
import { successorFields } from "./withdrawals";

export const MAX_SOURCE_LENGTH = 200_000;

// In a source file, line breaks and tabs are fine; other control characters and bidirectional controls
// (which can make a line display differently from what it says) are not.
// eslint-disable-next-line no-control-regex -- control characters are exactly what is refused here
const SOURCE_HIDDEN = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069\u200e\u200f\u061c]/;

export const sourceSchema = z
  .string()
  .max(MAX_SOURCE_LENGTH, `A standard's source is limited to ${MAX_SOURCE_LENGTH.toLocaleString("en")} characters.`)
  .refine((value) => !SOURCE_HIDDEN.test(value), {
    message: "The source holds invisible control characters (they may have come with a copy and paste); remove them.",
  });

export const SLUG_PATTERN = /^[a-z][a-z0-9]*(-[a-z0-9]+)*$/;
export const slugSchema = z
  .string()
  .trim()
  .min(3, "A short name needs at least 3 characters.")
  .max(60, "A short name is at most 60 characters.")
  .regex(SLUG_PATTERN, "Use lower-case letters, digits and single hyphens, starting with a letter (e.g. fixed-end-beam).");

const id = (what: string) => z.uuid(`Choose ${what}.`);
const sentence = (what: string, max: number) =>
  plainText().pipe(z.string().trim().min(1, `Write ${what}.`).max(max, `Keep ${what} under ${max} characters.`));

export const createStandardSchema = z.object({
  slug: slugSchema,
  title: sentence("a title", 120),
});
export const startDraftSchema = z.object({ versionId: id("a version to start from") });
export const saveDraftSchema = z.object({ draftId: id("a draft"), source: sourceSchema });
export const submitDraftSchema = z.object({
  draftId: id("a draft"),
  changelog: sentence("one line saying what changed (the changelog)", 300),
});
export const discardDraftSchema = z.object({ draftId: id("a draft") });

/** Hand calculations: what a checker scans or exports (PDF, PNG, JPEG), up to 10 MB. */
export const HAND_CALCULATION_MAX_BYTES = 10 * 1024 * 1024;
export const attachHandCalculationSchema = z.object({
  draftId: id("a draft"),
  file: z
    .file("Choose the hand calculation's file (PDF, PNG or JPEG).")
    .min(1, "That file is empty.")
    .max(HAND_CALCULATION_MAX_BYTES, "That file is over 10 MB; scan it at a lower resolution or split it.")
    .mime(["application/pdf", "image/png", "image/jpeg"], "A hand calculation is a PDF, PNG or JPEG file."),
});
export const handCalculationRefSchema = z.object({
  sha256: z.string().regex(/^[0-9a-f]{64}$/, "A file is named by its sha256: 64 lowercase hex digits."),
});
export const reviewCommentSchema = z.object({
  line: z.number().int().min(1).max(100_000).nullable(),
  body: sentence("the comment", 2000),
});
export const returnDraftSchema = z
  .object({
    reviewId: id("a submission"),
    note: z.union([z.literal(""), sentence("a note", 2000)]).default(""),
    comments: z.array(reviewCommentSchema).max(200, "At most 200 comments at once.").default([]),
  })
  .refine((value) => value.note !== "" || value.comments.length > 0, {
    message: "Say what needs changing: a note or at least one comment on a line.",
    path: ["note"],
  });
export const approveReviewSchema = z.object({
  reviewId: id("a submission"),
  note: z.union([z.literal(""), sentence("a note", 2000)]).default(""),
});
export const withdrawVersionSchema = z.object({
  versionId: id("a version"),
  reason: sentence("why the version is withdrawn", 500),
  ...successorFields,
});
export const standardSlugSchema = z.object({ slug: slugSchema });
export const versionRefSchema = z.object({ slug: slugSchema, number: z.coerce.number().int().min(1) });
export const draftRefSchema = z.object({ draftId: id("a draft") });
