import "server-only";
// Standards, their drafts, reviews and published versions (db/schema/standards.ts). Permissions are checked
// by the use cases (lib/use-cases/standards.ts) before any of this runs. A version's status is derived from
// its latest event; nothing here updates a published version (the database would refuse).
import { and, asc, desc, eq, inArray, sql, type Placeholder } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import {
  jobs,
  standardAttachments,
  standardDrafts,
  standardReviewComments,
  standardReviews,
  standards,
  standardVersionEvents,
  standardVersions,
  user,
  type AttachmentType,
  type DraftState,
  type JobStatus,
  type ReviewOutcome,
  type StandardDraft,
  type StandardReview,
  type StandardVersion,
  type VersionEventKind,
} from "@/db/schema";
import { AppError } from "@/lib/domain/errors";
import { prepared } from "./prepared";
import { currentDb } from "./transaction";

export type VersionStatus = VersionEventKind;

export type VersionSummaryDto = {
  id: string;
  standardId: string;
  slug: string;
  number: number;
  title: string;
  category: string;
  tags: string[];
  summary: string;
  changelog: string;
  contentHash: string;
  status: VersionStatus;
  authorName: string;
  reviewerName: string;
  publishedAt: string;
};

export type VersionDto = VersionSummaryDto & {
  source: string;
  basedOnVersionId: string | null;
  verifiedWith: string;
  verification: unknown;
  events: { kind: VersionStatus; reason: string | null; actorName: string | null; occurredAt: string }[];
};

export type DraftDto = {
  id: string;
  standardId: string;
  slug: string;
  authorId: string;
  authorName: string;
  state: DraftState;
  source: string;
  basedOnVersionId: string | null;
  basedOnNumber: number | null;
  publishedVersionId: string | null;
  createdAt: string;
  updatedAt: string;
};

export type ReviewDto = {
  id: string;
  draftId: string;
  round: number;
  source: string;
  changelog: string;
  submittedById: string;
  submittedByName: string;
  submittedAt: string;
  reviewerId: string | null;
  reviewerName: string | null;
  outcome: ReviewOutcome | null;
  note: string | null;
  decidedAt: string | null;
  comments: { id: number; line: number | null; body: string; authorName: string; createdAt: string }[];
};

const author = alias(user, "author");
const reviewer = alias(user, "reviewer");

/**
 * A version's status: the kind of its latest event, published when it has none. A correlated probe of
 * standard_version_events_version_idx per version read, not a scan of every version's events. The outer column is
 * written out whole: drizzle leaves the table's name off in a one-table query, and a bare "id" inside the subquery
 * would be the event's own.
 */
const versionStatus = sql<VersionStatus>`coalesce((select e.kind from standard_version_events e where e.version_id = "standard_versions"."id" order by e.id desc limit 1), 'published')`;

/** The status of the version with this id as a scalar subquery (null when there is no such version), for another table's query. */
export const versionStatusById = (versionId: string | Placeholder) =>
  sql<VersionStatus | null>`(select coalesce((select e.kind from standard_version_events e where e.version_id = v.id order by e.id desc limit 1), 'published') from standard_versions v where v.id = ${versionId})`;

/**
 * A version's events, oldest first, as JSON read with the version in the same query (a run's path counts its round
 * trips). The time as text to the microsecond, cut to the millisecond as pg's own timestamp parsing does.
 */
const versionEvents = sql<
  { kind: VersionStatus; reason: string | null; actorName: string | null; occurredAt: string }[]
>`coalesce((
  select json_agg(json_build_object('kind', e.kind, 'reason', e.reason, 'actorName', u.name,
           'occurredAt', to_char(e.occurred_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US')) order by e.id)
    from standard_version_events e left join "user" u on u.id = e.actor_id
   where e.version_id = "standard_versions"."id"), '[]'::json)`;

/** What a version holds besides its summary: read with it in one query where a whole version is wanted. */
const versionContent = {
  source: standardVersions.source,
  basedOnVersionId: standardVersions.basedOnVersionId,
  verifiedWith: standardVersions.verifiedWith,
  verification: standardVersions.verification,
};

function versionSummaryQuery<E extends Partial<typeof versionContent>>(content: E = {} as E, executor = currentDb()) {
  return executor
    .select({
      ...content,
      id: standardVersions.id,
      standardId: standardVersions.standardId,
      slug: standards.slug,
      number: standardVersions.number,
      title: standardVersions.title,
      category: standardVersions.category,
      tags: standardVersions.tags,
      summary: standardVersions.summary,
      changelog: standardVersions.changelog,
      contentHash: standardVersions.contentHash,
      status: versionStatus,
      authorName: author.name,
      reviewerName: reviewer.name,
      publishedAt: standardVersions.publishedAt,
    })
    .from(standardVersions)
    .innerJoin(standards, eq(standards.id, standardVersions.standardId))
    .innerJoin(author, eq(author.id, standardVersions.authorId))
    .innerJoin(reviewer, eq(reviewer.id, standardVersions.reviewerId));
}

type SummaryRow = Awaited<ReturnType<ReturnType<typeof versionSummaryQuery>["execute"]>>[number];
const toSummary = (row: SummaryRow): VersionSummaryDto => ({ ...row, publishedAt: row.publishedAt.toISOString() });

export async function getStandardBySlug(slug: string): Promise<{ id: string; slug: string } | null> {
  const [row] = await currentDb()
    .select({ id: standards.id, slug: standards.slug })
    .from(standards)
    .where(eq(standards.slug, slug));
  return row ?? null;
}

/** A standard's short name by its id. */
export async function getSlugOf(standardId: string): Promise<string> {
  const [row] = await currentDb().select({ slug: standards.slug }).from(standards).where(eq(standards.id, standardId));
  if (!row) throw new AppError("not-found", "That standard does not exist.");
  return row.slug;
}

export async function slugTaken(slug: string): Promise<boolean> {
  return (await getStandardBySlug(slug)) !== null;
}

/** The new standard, or null when its slug was taken meanwhile (two leads creating the same one at once). */
export async function insertStandard(values: {
  slug: string;
  createdById: string;
}): Promise<{ id: string; slug: string } | null> {
  const [row] = await currentDb()
    .insert(standards)
    .values(values)
    .onConflictDoNothing({ target: standards.slug })
    .returning({ id: standards.id, slug: standards.slug });
  return row ?? null;
}

/** Locks the standard's row: publications of one standard take their numbers one at a time. */
export async function lockStandard(id: string): Promise<void> {
  await currentDb().select({ id: standards.id }).from(standards).where(eq(standards.id, id)).for("update");
}

/** Every version of every standard, newest number first within each standard. */
export async function listVersionSummaries(): Promise<VersionSummaryDto[]> {
  const rows = await versionSummaryQuery().orderBy(asc(standards.slug), desc(standardVersions.number));
  return rows.map(toSummary);
}

export async function listVersionsOf(standardId: string): Promise<VersionSummaryDto[]> {
  const rows = await versionSummaryQuery()
    .where(eq(standardVersions.standardId, standardId))
    .orderBy(desc(standardVersions.number));
  return rows.map(toSummary);
}

/** A version's status alone (published, superseded or withdrawn); null when there is no such version. */
export async function getVersionStatus(id: string): Promise<VersionStatus | null> {
  const [row] = await currentDb().select({ status: versionStatus }).from(standardVersions).where(eq(standardVersions.id, id));
  return row?.status ?? null;
}

// Prepared: the pages of a run read its version by id.
const versionById = prepared("gusset_version_by_id", (executor) =>
  versionSummaryQuery({ ...versionContent, events: versionEvents }, executor).where(
    eq(standardVersions.id, sql.placeholder("id")),
  ),
);

// Prepared: every run reads its version, and the job it runs in with it (one round trip).
const versionAndJobById = prepared("gusset_version_and_job", (executor) =>
  versionSummaryQuery(
    {
      ...versionContent,
      events: versionEvents,
      jobId: jobs.id,
      jobNumber: jobs.jobNumber,
      jobName: jobs.name,
      jobStatus: jobs.status,
    },
    executor,
  )
    .leftJoin(jobs, eq(jobs.id, sql.placeholder("jobId")))
    .where(eq(standardVersions.id, sql.placeholder("id"))),
);

type WholeVersionRow = Awaited<ReturnType<typeof versionById>>[number];

function toVersionDto({ source, basedOnVersionId, verifiedWith, verification, events, ...rest }: WholeVersionRow): VersionDto {
  return {
    ...toSummary(rest),
    source,
    basedOnVersionId,
    verifiedWith,
    verification,
    events: events.map((event) => ({ ...event, occurredAt: `${event.occurredAt.slice(0, 23)}Z` })),
  };
}

/** A whole version, its events included, in one query. */
export async function getVersion(where: { id: string } | { standardId: string; number: number }): Promise<VersionDto | null> {
  const [row] =
    "id" in where
      ? await versionById({ id: where.id })
      : await versionSummaryQuery({ ...versionContent, events: versionEvents }).where(
          and(eq(standardVersions.standardId, where.standardId), eq(standardVersions.number, where.number)),
        );
  return row ? toVersionDto(row) : null;
}

/**
 * A whole version as getVersion reads it, with the job it is to run in read in the same query: `job` is null when
 * there is no such job; the answer is null when there is no such version (whatever the job).
 */
export async function getVersionWithJob(
  versionId: string,
  jobId: string,
): Promise<{ version: VersionDto; job: { id: string; jobNumber: string; name: string; status: JobStatus } | null } | null> {
  const [row] = await versionAndJobById({ id: versionId, jobId });
  if (!row) return null;
  const { jobId: id, jobNumber, jobName: name, jobStatus: status, ...version } = row;
  return {
    version: toVersionDto(version),
    job: id !== null && jobNumber !== null && name !== null && status !== null ? { id, jobNumber, name, status } : null,
  };
}

export async function nextVersionNumber(standardId: string): Promise<number> {
  const [row] = await currentDb()
    .select({ last: sql<number>`coalesce(max(${standardVersions.number}), 0)`.mapWith(Number) })
    .from(standardVersions)
    .where(eq(standardVersions.standardId, standardId));
  return row.last + 1;
}

export async function insertVersion(values: typeof standardVersions.$inferInsert): Promise<StandardVersion> {
  const [row] = await currentDb().insert(standardVersions).values(values).returning();
  return row;
}

export async function insertVersionEvent(values: {
  versionId: string;
  kind: VersionEventKind;
  reason?: string | null;
  actorId: string | null;
}): Promise<void> {
  await currentDb().insert(standardVersionEvents).values(values);
}

// ---- drafts ----------------------------------------------------------------------------------------

function draftQuery() {
  const basedOn = alias(standardVersions, "based_on");
  return currentDb()
    .select({
      id: standardDrafts.id,
      standardId: standardDrafts.standardId,
      slug: standards.slug,
      authorId: standardDrafts.authorId,
      authorName: user.name,
      state: standardDrafts.state,
      source: standardDrafts.source,
      basedOnVersionId: standardDrafts.basedOnVersionId,
      basedOnNumber: basedOn.number,
      publishedVersionId: standardDrafts.publishedVersionId,
      createdAt: standardDrafts.createdAt,
      updatedAt: standardDrafts.updatedAt,
    })
    .from(standardDrafts)
    .innerJoin(standards, eq(standards.id, standardDrafts.standardId))
    .innerJoin(user, eq(user.id, standardDrafts.authorId))
    .leftJoin(basedOn, eq(basedOn.id, standardDrafts.basedOnVersionId));
}
type DraftRow = Awaited<ReturnType<ReturnType<typeof draftQuery>["execute"]>>[number];
const toDraft = (row: DraftRow): DraftDto => ({
  ...row,
  createdAt: row.createdAt.toISOString(),
  updatedAt: row.updatedAt.toISOString(),
});

export async function getDraft(id: string): Promise<DraftDto | null> {
  const [row] = await draftQuery().where(eq(standardDrafts.id, id));
  return row ? toDraft(row) : null;
}

/** The draft, locked for the rest of the transaction; not found is a 404 with a sentence. */
export async function lockDraftOrThrow(id: string): Promise<StandardDraft> {
  const [row] = await currentDb().select().from(standardDrafts).where(eq(standardDrafts.id, id)).for("update");
  if (!row) throw new AppError("not-found", "That draft does not exist (it may have been discarded).");
  return row;
}

/** Drafts still being worked on (editing or in review), newest first; of one standard when given. */
export async function listOpenDrafts(standardId?: string): Promise<DraftDto[]> {
  const open = inArray(standardDrafts.state, ["editing", "in-review"]);
  const rows = await draftQuery()
    .where(standardId ? and(open, eq(standardDrafts.standardId, standardId)) : open)
    .orderBy(desc(standardDrafts.updatedAt));
  return rows.map(toDraft);
}

export async function insertDraft(values: {
  standardId: string;
  authorId: string;
  source: string;
  basedOnVersionId: string | null;
}): Promise<StandardDraft> {
  const [row] = await currentDb().insert(standardDrafts).values(values).returning();
  return row;
}

export async function updateDraft(
  id: string,
  values: Partial<Pick<StandardDraft, "source" | "state" | "publishedVersionId">>,
): Promise<void> {
  await currentDb()
    .update(standardDrafts)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(standardDrafts.id, id));
}

// ---- reviews ---------------------------------------------------------------------------------------

export async function insertReview(values: {
  draftId: string;
  round: number;
  source: string;
  changelog: string;
  submittedById: string;
}): Promise<StandardReview> {
  const [row] = await currentDb().insert(standardReviews).values(values).returning();
  return row;
}

export async function countReviews(draftId: string): Promise<number> {
  const [row] = await currentDb()
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(standardReviews)
    .where(eq(standardReviews.draftId, draftId));
  return row.n;
}

/** What was submitted; not found is a 404. */
export async function getReviewSource(id: string): Promise<string> {
  const [row] = await currentDb()
    .select({ source: standardReviews.source })
    .from(standardReviews)
    .where(eq(standardReviews.id, id));
  if (!row) throw new AppError("not-found", "That submission does not exist.");
  return row.source;
}

/** The review, locked; not found is a 404. */
export async function lockReviewOrThrow(id: string): Promise<StandardReview> {
  const [row] = await currentDb().select().from(standardReviews).where(eq(standardReviews.id, id)).for("update");
  if (!row) throw new AppError("not-found", "That submission does not exist.");
  return row;
}

export async function decideReview(id: string, values: { reviewerId: string; outcome: ReviewOutcome; note: string | null }) {
  await currentDb()
    .update(standardReviews)
    .set({ ...values, decidedAt: new Date() })
    .where(eq(standardReviews.id, id));
}

export async function insertReviewComments(
  reviewId: string,
  authorId: string,
  comments: { line: number | null; body: string }[],
): Promise<void> {
  if (comments.length === 0) return;
  await currentDb()
    .insert(standardReviewComments)
    .values(comments.map((comment) => ({ ...comment, reviewId, authorId })));
}

/** Every submission of a draft, oldest first, with its comments. */
export async function listReviews(draftId: string): Promise<ReviewDto[]> {
  const submitter = alias(user, "submitter");
  const rows = await currentDb()
    .select({
      id: standardReviews.id,
      draftId: standardReviews.draftId,
      round: standardReviews.round,
      source: standardReviews.source,
      changelog: standardReviews.changelog,
      submittedById: standardReviews.submittedById,
      submittedByName: submitter.name,
      submittedAt: standardReviews.submittedAt,
      reviewerId: standardReviews.reviewerId,
      reviewerName: reviewer.name,
      outcome: standardReviews.outcome,
      note: standardReviews.note,
      decidedAt: standardReviews.decidedAt,
    })
    .from(standardReviews)
    .innerJoin(submitter, eq(submitter.id, standardReviews.submittedById))
    .leftJoin(reviewer, eq(reviewer.id, standardReviews.reviewerId))
    .where(eq(standardReviews.draftId, draftId))
    .orderBy(asc(standardReviews.round));
  const ids = rows.map((row) => row.id);
  const comments =
    ids.length === 0
      ? []
      : await currentDb()
          .select({
            id: standardReviewComments.id,
            reviewId: standardReviewComments.reviewId,
            line: standardReviewComments.line,
            body: standardReviewComments.body,
            authorName: user.name,
            createdAt: standardReviewComments.createdAt,
          })
          .from(standardReviewComments)
          .innerJoin(user, eq(user.id, standardReviewComments.authorId))
          .where(inArray(standardReviewComments.reviewId, ids))
          .orderBy(asc(standardReviewComments.line), asc(standardReviewComments.id));
  return rows.map((row) => ({
    ...row,
    submittedAt: row.submittedAt.toISOString(),
    decidedAt: row.decidedAt?.toISOString() ?? null,
    comments: comments
      .filter((comment) => comment.reviewId === row.id)
      .map(({ reviewId: _, ...comment }) => ({ ...comment, createdAt: comment.createdAt.toISOString() })),
  }));
}

export type AttachmentDto = {
  sha256: string;
  fileName: string;
  contentType: AttachmentType;
  bytes: number;
  uploadedByName: string;
  uploadedAt: string;
};

/** The files attached to a standard (hand calculations its verification cases cite), oldest first. */
export async function listAttachments(standardId: string): Promise<AttachmentDto[]> {
  const rows = await currentDb()
    .select({
      sha256: standardAttachments.sha256,
      fileName: standardAttachments.fileName,
      contentType: standardAttachments.contentType,
      bytes: standardAttachments.bytes,
      uploadedByName: user.name,
      uploadedAt: standardAttachments.uploadedAt,
    })
    .from(standardAttachments)
    .innerJoin(user, eq(user.id, standardAttachments.uploadedById))
    .where(eq(standardAttachments.standardId, standardId))
    .orderBy(asc(standardAttachments.uploadedAt), asc(standardAttachments.sha256));
  return rows.map((row) => ({ ...row, uploadedAt: row.uploadedAt.toISOString() }));
}

/** Attaches a file already stored under its sha256; attaching the same bytes again keeps the first row. */
export async function insertAttachment(values: {
  standardId: string;
  sha256: string;
  fileName: string;
  contentType: AttachmentType;
  bytes: number;
  uploadedById: string;
}): Promise<{ added: boolean }> {
  const inserted = await currentDb()
    .insert(standardAttachments)
    .values(values)
    .onConflictDoNothing({ target: [standardAttachments.standardId, standardAttachments.sha256] })
    .returning({ id: standardAttachments.id });
  return { added: inserted.length > 0 };
}

/** An attached file by its sha256 (any standard's: the bytes are the same), for download. */
export async function getAttachment(sha256: string): Promise<{ fileName: string; contentType: AttachmentType } | null> {
  const [row] = await currentDb()
    .select({ fileName: standardAttachments.fileName, contentType: standardAttachments.contentType })
    .from(standardAttachments)
    .where(eq(standardAttachments.sha256, sha256))
    .orderBy(asc(standardAttachments.uploadedAt))
    .limit(1);
  return row ?? null;
}
