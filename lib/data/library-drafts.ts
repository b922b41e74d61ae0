import "server-only";
// Library drafts and their reviews (db/schema/libraries.ts): the working copies admins and leads edit, submit
// and decide on. Permissions and the four-eyes rule are the use cases' (lib/use-cases/libraries.ts); the
// database keeps four eyes too, and refuses changes to a finished draft or a decided review.
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import {
  libraries,
  libraryDrafts,
  libraryReviewComments,
  libraryReviews,
  libraryVersions,
  user,
  type DraftState,
  type LibraryDraft,
  type LibraryReview,
  type ReviewOutcome,
} from "@/db/schema";
import type { LibraryKindId } from "@/lib/domain/schemas/libraries";
import { AppError } from "@/lib/domain/errors";
import { currentDb } from "./transaction";

export type LibraryDraftDto = {
  id: string;
  libraryId: string;
  slug: string;
  kind: LibraryKindId;
  authorId: string;
  authorName: string;
  state: DraftState;
  document: unknown;
  basedOnVersionId: string | null;
  basedOnNumber: number | null;
  publishedVersionId: string | null;
  createdAt: string;
  updatedAt: string;
};

export type LibraryReviewDto = {
  id: string;
  draftId: string;
  round: number;
  document: unknown;
  contentHash: string;
  changelog: string;
  submittedById: string;
  submittedByName: string;
  submittedAt: string;
  reviewerId: string | null;
  reviewerName: string | null;
  outcome: ReviewOutcome | null;
  note: string | null;
  decidedAt: string | null;
  comments: { id: number; entryKey: string | null; body: string; authorName: string; createdAt: string }[];
};

function draftQuery() {
  const basedOn = alias(libraryVersions, "based_on");
  return currentDb()
    .select({
      id: libraryDrafts.id,
      libraryId: libraryDrafts.libraryId,
      slug: libraries.slug,
      kind: libraries.kind,
      authorId: libraryDrafts.authorId,
      authorName: user.name,
      state: libraryDrafts.state,
      document: libraryDrafts.document,
      basedOnVersionId: libraryDrafts.basedOnVersionId,
      basedOnNumber: basedOn.number,
      publishedVersionId: libraryDrafts.publishedVersionId,
      createdAt: libraryDrafts.createdAt,
      updatedAt: libraryDrafts.updatedAt,
    })
    .from(libraryDrafts)
    .innerJoin(libraries, eq(libraries.id, libraryDrafts.libraryId))
    .innerJoin(user, eq(user.id, libraryDrafts.authorId))
    .leftJoin(basedOn, eq(basedOn.id, libraryDrafts.basedOnVersionId));
}
type DraftRow = Awaited<ReturnType<ReturnType<typeof draftQuery>["execute"]>>[number];
const toDraft = (row: DraftRow): LibraryDraftDto => ({
  ...row,
  createdAt: row.createdAt.toISOString(),
  updatedAt: row.updatedAt.toISOString(),
});

export async function getLibraryDraft(id: string): Promise<LibraryDraftDto | null> {
  const [row] = await draftQuery().where(eq(libraryDrafts.id, id));
  return row ? toDraft(row) : null;
}

/** The draft, locked for the rest of the transaction; not found is a 404 with a sentence. */
export async function lockLibraryDraftOrThrow(id: string): Promise<LibraryDraft> {
  const [row] = await currentDb().select().from(libraryDrafts).where(eq(libraryDrafts.id, id)).for("update");
  if (!row) throw new AppError("not-found", "That library draft does not exist.");
  return row;
}

/** Drafts still being worked on (editing or in review), newest first; of one library when given. */
export async function listOpenLibraryDrafts(libraryId?: string): Promise<LibraryDraftDto[]> {
  const open = inArray(libraryDrafts.state, ["editing", "in-review"]);
  const rows = await draftQuery()
    .where(libraryId ? and(open, eq(libraryDrafts.libraryId, libraryId)) : open)
    .orderBy(desc(libraryDrafts.updatedAt));
  return rows.map(toDraft);
}

export async function insertLibraryDraft(values: {
  libraryId: string;
  authorId: string;
  document: unknown;
  basedOnVersionId: string | null;
}): Promise<LibraryDraft> {
  const [row] = await currentDb().insert(libraryDrafts).values(values).returning();
  return row;
}

export async function updateLibraryDraft(
  id: string,
  values: Partial<Pick<LibraryDraft, "document" | "state" | "publishedVersionId">>,
): Promise<void> {
  await currentDb()
    .update(libraryDrafts)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(libraryDrafts.id, id));
}

// ---- reviews ---------------------------------------------------------------------------------------

export async function insertLibraryReview(values: {
  draftId: string;
  round: number;
  document: unknown;
  contentHash: string;
  changelog: string;
  submittedById: string;
}): Promise<LibraryReview> {
  const [row] = await currentDb().insert(libraryReviews).values(values).returning();
  return row;
}

export async function countLibraryReviews(draftId: string): Promise<number> {
  const [row] = await currentDb()
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(libraryReviews)
    .where(eq(libraryReviews.draftId, draftId));
  return row.n;
}

/** What was submitted, and the library's kind; not found is a 404. */
export async function getLibraryReviewDocument(id: string): Promise<{ document: unknown; kind: LibraryKindId }> {
  const [row] = await currentDb()
    .select({ document: libraryReviews.document, kind: libraries.kind })
    .from(libraryReviews)
    .innerJoin(libraryDrafts, eq(libraryDrafts.id, libraryReviews.draftId))
    .innerJoin(libraries, eq(libraries.id, libraryDrafts.libraryId))
    .where(eq(libraryReviews.id, id));
  if (!row) throw new AppError("not-found", "That library submission does not exist.");
  return row;
}

/** The submission, locked; not found is a 404. */
export async function lockLibraryReviewOrThrow(id: string): Promise<LibraryReview> {
  const [row] = await currentDb().select().from(libraryReviews).where(eq(libraryReviews.id, id)).for("update");
  if (!row) throw new AppError("not-found", "That library submission does not exist.");
  return row;
}

export async function decideLibraryReview(
  id: string,
  values: { reviewerId: string; outcome: ReviewOutcome; note: string | null },
): Promise<void> {
  await currentDb()
    .update(libraryReviews)
    .set({ ...values, decidedAt: new Date() })
    .where(eq(libraryReviews.id, id));
}

export async function insertLibraryReviewComments(
  reviewId: string,
  authorId: string,
  comments: { entryKey: string | null; body: string }[],
): Promise<void> {
  if (comments.length === 0) return;
  await currentDb()
    .insert(libraryReviewComments)
    .values(comments.map((comment) => ({ ...comment, reviewId, authorId })));
}

/** Every submission of a draft, oldest first, with its comments. */
export async function listLibraryReviews(draftId: string): Promise<LibraryReviewDto[]> {
  const submitter = alias(user, "submitter");
  const reviewer = alias(user, "reviewer");
  const rows = await currentDb()
    .select({
      id: libraryReviews.id,
      draftId: libraryReviews.draftId,
      round: libraryReviews.round,
      document: libraryReviews.document,
      contentHash: libraryReviews.contentHash,
      changelog: libraryReviews.changelog,
      submittedById: libraryReviews.submittedById,
      submittedByName: submitter.name,
      submittedAt: libraryReviews.submittedAt,
      reviewerId: libraryReviews.reviewerId,
      reviewerName: reviewer.name,
      outcome: libraryReviews.outcome,
      note: libraryReviews.note,
      decidedAt: libraryReviews.decidedAt,
    })
    .from(libraryReviews)
    .innerJoin(submitter, eq(submitter.id, libraryReviews.submittedById))
    .leftJoin(reviewer, eq(reviewer.id, libraryReviews.reviewerId))
    .where(eq(libraryReviews.draftId, draftId))
    .orderBy(asc(libraryReviews.round));
  const ids = rows.map((row) => row.id);
  const comments =
    ids.length === 0
      ? []
      : await currentDb()
          .select({
            id: libraryReviewComments.id,
            reviewId: libraryReviewComments.reviewId,
            entryKey: libraryReviewComments.entryKey,
            body: libraryReviewComments.body,
            authorName: user.name,
            createdAt: libraryReviewComments.createdAt,
          })
          .from(libraryReviewComments)
          .innerJoin(user, eq(user.id, libraryReviewComments.authorId))
          .where(inArray(libraryReviewComments.reviewId, ids))
          .orderBy(asc(libraryReviewComments.id));
  return rows.map((row) => ({
    ...row,
    submittedAt: row.submittedAt.toISOString(),
    decidedAt: row.decidedAt?.toISOString() ?? null,
    comments: comments
      .filter((comment) => comment.reviewId === row.id)
      .map(({ reviewId: _, ...comment }) => ({ ...comment, createdAt: comment.createdAt.toISOString() })),
  }));
}
