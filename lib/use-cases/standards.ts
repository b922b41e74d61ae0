import "server-only";
// The standards' lifecycle: a lead starts a draft (a new standard, or from any version), saves it as often as
// they like (problems and all), and submits it with a changelog line once it compiles and its verification
// cases pass; a different lead returns it with comments on its lines, or approves it, which publishes it as
// the standard's next version number. Publishing supersedes the version before (still runnable until
// withdrawn). Compiling and verifying run in `prepare`, before the transaction; the work re-checks under its
// locks that the source is still the one that was checked.
import { z } from "zod";
import { AppError } from "@/lib/domain/errors";
import {
  approveReviewSchema,
  createStandardSchema,
  discardDraftSchema,
  draftRefSchema,
  returnDraftSchema,
  saveDraftSchema,
  standardSlugSchema,
  startDraftSchema,
  submitDraftSchema,
  versionRefSchema,
  withdrawVersionSchema,
} from "@/lib/domain/schemas/standards";
import { can } from "@/lib/domain/permissions";
import type { Actor } from "@/lib/domain/actor";
import {
  countReviews,
  decideReview,
  getDraft,
  getStandardBySlug,
  getReviewSource,
  getVersion,
  insertDraft,
  insertReview,
  insertReviewComments,
  insertStandard,
  insertVersion,
  insertVersionEvent,
  listOpenDrafts,
  listReviews,
  listVersionsOf,
  listVersionSummaries,
  lockDraftOrThrow,
  lockReviewOrThrow,
  lockStandard,
  nextVersionNumber,
  slugTaken,
  updateDraft,
  type DraftDto,
  type ReviewDto,
  type VersionDto,
  type VersionSummaryDto,
  getSlugOf,
  listAttachments,
  type AttachmentDto,
} from "@/lib/data/standards";
import { getUserOrThrow } from "@/lib/data/users";
import { starterSource } from "@/lib/standards/starter";
import { DefinitionSchema, type Definition } from "@/lib/standards/definition";
import type { Evaluation } from "@/lib/standards/evaluate";
import { parseSource } from "@/lib/standards/source";
import { evaluationPool } from "@/lib/evaluation/pool";
import { checkSource, gateRefusals, VERIFIED_WITH, type SourceCheck } from "./standard-gate";
import { defineUseCase } from "./use-case";
import { recordWithdrawal } from "./withdrawals";
import { ownEditableDraft } from "./draft-access";
import { missingHandCalculations } from "./standard-attachments";
import { latestPinsToRecord, libraryEntriesFor, publishedLibraryEntries, type LibraryReferencePin } from "./library-resolution";
import { insertLibraryPins } from "@/lib/data/library-pins";
import type { LibraryEntries } from "@/lib/standards/library-inputs";

const noInput = z.object({}).default({});

/** Drafts are the leads' working space: others see only what is published. */
const seesDrafts = (actor: Actor) => can(actor.role, "templates.write-draft") || can(actor.role, "templates.review");

export type StandardListItem = {
  slug: string;
  /** The newest version that is not withdrawn (what engineers run), else the newest. */
  current: VersionSummaryDto;
  versions: number;
};

export const listStandards = defineUseCase({
  name: "standards.list",
  permission: "library.read",
  input: noInput,
  run: async (_, { actor }): Promise<{ standards: StandardListItem[]; drafts: DraftDto[] }> => {
    const all = await listVersionSummaries();
    const bySlug = new Map<string, VersionSummaryDto[]>();
    for (const version of all) bySlug.set(version.slug, [...(bySlug.get(version.slug) ?? []), version]);
    const standards = [...bySlug.entries()].map(([slug, versions]) => ({
      slug,
      current: versions.find((version) => version.status !== "withdrawn") ?? versions[0],
      versions: versions.length,
    }));
    standards.sort((a, b) => a.current.title.localeCompare(b.current.title, "en"));
    return { standards, drafts: seesDrafts(actor) ? await listOpenDrafts() : [] };
  },
  audit: null,
});

export const readStandard = defineUseCase({
  name: "standards.read",
  permission: "library.read",
  input: standardSlugSchema,
  run: async ({ slug }, { actor }): Promise<{ slug: string; versions: VersionSummaryDto[]; drafts: DraftDto[] }> => {
    const standard = await getStandardBySlug(slug);
    if (!standard) throw new AppError("not-found", `There is no standard called “${slug}”.`);
    const versions = await listVersionsOf(standard.id);
    const drafts = seesDrafts(actor) ? await listOpenDrafts(standard.id) : [];
    if (versions.length === 0 && drafts.length === 0) throw new AppError("not-found", `“${slug}” has no published version yet.`);
    return { slug, versions, drafts };
  },
  audit: null,
});

/**
 * A version with the library entries its section and material inputs' defaults name, to evaluate it for its page,
 * and the library version each of its library references reads (pinned at publication for `latest`).
 */
export type VersionView = VersionDto & { libraries: LibraryEntries; libraryPins: LibraryReferencePin[] };

export const readVersion = defineUseCase({
  name: "standards.read-version",
  permission: "library.read",
  input: versionRefSchema,
  run: async ({ slug, number }): Promise<VersionView> => {
    const standard = await getStandardBySlug(slug);
    const version = standard ? await getVersion({ standardId: standard.id, number }) : null;
    if (!version) throw new AppError("not-found", `“${slug}” has no version ${number}.`);
    const { entries, pins } = await publishedLibraryEntries(version);
    return { ...version, libraries: entries, libraryPins: pins };
  },
  audit: null,
});

export type DraftView = { draft: DraftDto; reviews: ReviewDto[]; basedOn: VersionDto | null; attachments: AttachmentDto[] };

export const readDraft = defineUseCase({
  name: "standards.read-draft",
  permission: "templates.write-draft",
  input: draftRefSchema,
  run: async ({ draftId }): Promise<DraftView> => {
    const draft = await getDraft(draftId);
    if (!draft) throw new AppError("not-found", "That draft does not exist.");
    const basedOn = draft.basedOnVersionId ? await getVersion({ id: draft.basedOnVersionId }) : null;
    return { draft, reviews: await listReviews(draftId), basedOn, attachments: await listAttachments(draft.standardId) };
  },
  audit: null,
});

export const createStandard = defineUseCase({
  name: "standards.create",
  permission: "templates.write-draft",
  input: createStandardSchema,
  run: async ({ slug, title }, { actor }) => {
    const taken = () =>
      new AppError("conflict", `A standard called “${slug}” exists already.`, {
        fieldErrors: { slug: ["This short name is taken; open that standard and start a draft from it instead."] },
      });
    if (await slugTaken(slug)) throw taken();
    const standard = await insertStandard({ slug, createdById: actor.id });
    if (!standard) throw taken(); // created by someone else between the look-up and the insert
    const draft = await insertDraft({
      standardId: standard.id,
      authorId: actor.id,
      source: starterSource(title),
      basedOnVersionId: null,
    });
    return { slug, title, draftId: draft.id };
  },
  audit: ({ result }) => ({
    action: "standards.create",
    subject: `standard-draft:${result.draftId}`,
    details: { slug: result.slug, title: result.title },
  }),
});

export const startDraft = defineUseCase({
  name: "standards.draft.start",
  permission: "templates.write-draft",
  input: startDraftSchema,
  run: async ({ versionId }, { actor }) => {
    const version = await getVersion({ id: versionId });
    if (!version) throw new AppError("not-found", "That version does not exist.");
    const draft = await insertDraft({
      standardId: version.standardId,
      authorId: actor.id,
      source: version.source,
      basedOnVersionId: version.id,
    });
    return { draftId: draft.id, slug: version.slug, fromVersion: version.number };
  },
  audit: ({ result }) => ({
    action: "standards.draft.start",
    subject: `standard-draft:${result.draftId}`,
    details: { slug: result.slug, fromVersion: result.fromVersion },
  }),
});

/** Saves whatever the lead wrote, problems included; says what the problems are. */
export const saveDraft = defineUseCase({
  name: "standards.draft.save",
  permission: "templates.write-draft",
  input: saveDraftSchema,
  // A source the pool could not finish checking (too slow, out of memory, pool full) is still saved:
  // nothing the lead wrote is lost, and the reason is listed as its problem.
  prepare: async ({ source }): Promise<SourceCheck> =>
    checkSource(source).catch((error: unknown) => {
      if (!(error instanceof AppError)) throw error;
      return {
        problems: [{ path: "", message: error.message }],
        metadata: null,
        verification: [],
        hash: null,
        verifiedWith: VERIFIED_WITH,
      };
    }),
  run: async ({ draftId, source }, { actor, prepared }): Promise<{ slug: string; check: SourceCheck }> => {
    const draft = await ownEditableDraft(draftId, actor);
    if (draft.source !== source) await updateDraft(draftId, { source });
    return { slug: await getSlugOf(draft.standardId), check: prepared };
  },
  audit: ({ result }) => ({
    action: "standards.draft.save",
    subject: null,
    details: { slug: result.slug, hash: result.check.hash, problems: result.check.problems.length },
  }),
});

export const discardDraft = defineUseCase({
  name: "standards.draft.discard",
  permission: "templates.write-draft",
  input: discardDraftSchema,
  run: async ({ draftId }, { actor }) => {
    const draft = await ownEditableDraft(draftId, actor);
    await updateDraft(draftId, { state: "discarded" });
    return { draftId, slug: await getSlugOf(draft.standardId) };
  },
  audit: ({ result }) => ({
    action: "standards.draft.discard",
    subject: `standard-draft:${result.draftId}`,
    details: { slug: result.slug },
  }),
});

/** Submits the draft as saved: it must compile and every verification case must pass. */
export const submitDraft = defineUseCase({
  name: "standards.draft.submit",
  permission: "templates.write-draft",
  input: submitDraftSchema,
  prepare: async ({ draftId }) => {
    const draft = await getDraft(draftId);
    if (!draft) throw new AppError("not-found", "That draft does not exist.");
    return { source: draft.source, check: await checkSource(draft.source) };
  },
  run: async ({ draftId, changelog }, { actor, prepared }) => {
    const draft = await ownEditableDraft(draftId, actor);
    if (draft.source !== prepared.source)
      throw new AppError("conflict", "The draft changed while it was being checked; submit it again.");
    const refusals = [...gateRefusals(prepared.check), ...(await missingHandCalculations(draft.standardId, prepared.check))];
    if (refusals.length > 0) throw new AppError("invalid-input", refusals.join(" "), { fieldErrors: { source: refusals } });
    const round = (await countReviews(draftId)) + 1;
    const review = await insertReview({ draftId, round, source: draft.source, changelog, submittedById: actor.id });
    await updateDraft(draftId, { state: "in-review" });
    return {
      draftId,
      reviewId: review.id,
      round,
      changelog,
      hash: prepared.check.hash!,
      slug: await getSlugOf(draft.standardId),
    };
  },
  audit: ({ result }) => ({
    action: "standards.draft.submit",
    subject: `standard-draft:${result.draftId}`,
    details: { slug: result.slug, round: result.round, changelog: result.changelog, hash: result.hash },
  }),
});

/** The submission, locked, if it awaits a decision and `actor` did not submit it (four eyes). */
async function reviewToDecide(reviewId: string, actor: Actor) {
  const review = await lockReviewOrThrow(reviewId);
  if (review.outcome !== null) throw new AppError("conflict", `This submission was already ${review.outcome}.`);
  if (review.submittedById === actor.id)
    throw new AppError("forbidden", "A second standards lead reviews a submission: nobody approves or returns their own.");
  return review;
}

export const returnDraft = defineUseCase({
  name: "standards.draft.return",
  permission: "templates.review",
  input: returnDraftSchema,
  run: async ({ reviewId, note, comments }, { actor }) => {
    const review = await reviewToDecide(reviewId, actor);
    const lines = review.source.split("\n").length;
    const outside = comments.find((comment) => comment.line !== null && comment.line > lines);
    if (outside)
      throw new AppError("invalid-input", `Line ${outside.line} is past the end of the submission (${lines} lines).`, {
        fieldErrors: { comments: [`Line ${outside.line} is past the end of the submission (${lines} lines).`] },
      });
    await insertReviewComments(reviewId, actor.id, comments);
    await decideReview(reviewId, { reviewerId: actor.id, outcome: "returned", note: note || null });
    const draft = await lockDraftOrThrow(review.draftId);
    await updateDraft(review.draftId, { state: "editing" });
    const author = await getUserOrThrow(draft.authorId);
    return {
      draftId: review.draftId,
      round: review.round,
      comments: comments.length,
      authorName: author.name,
      slug: await getSlugOf(draft.standardId),
    };
  },
  audit: ({ result }) => ({
    action: "standards.draft.return",
    subject: `standard-draft:${result.draftId}`,
    details: { slug: result.slug, round: result.round, comments: result.comments, authorName: result.authorName },
  }),
});

/**
 * Approves a submission and publishes it: the gate runs again on the current engine, the standard's row is
 * locked so two publications take consecutive numbers, the version is inserted (never to change), and the
 * versions it supersedes get their event.
 */
export const approveAndPublish = defineUseCase({
  name: "standards.publish",
  permission: "templates.publish",
  input: approveReviewSchema,
  prepare: async ({ reviewId }, { actor }) => {
    if (!can(actor.role, "templates.review")) throw new AppError("forbidden");
    const source = await getReviewSource(reviewId);
    // Checked against the libraries' newest versions, which are the ones pinned below.
    const libraries = await libraryEntriesFor(source);
    return { source, libraries, check: await checkSource(source, { libraries }) };
  },
  run: async ({ reviewId, note }, { actor, prepared }) => {
    const review = await reviewToDecide(reviewId, actor);
    if (review.source !== prepared.source)
      throw new AppError("conflict", "The submission changed while it was checked; try again.");
    const { check } = prepared;
    const draft = await lockDraftOrThrow(review.draftId);
    const refusals = [...gateRefusals(check), ...(await missingHandCalculations(draft.standardId, check))];
    if (refusals.length > 0) throw new AppError("invalid-input", `It cannot be published: ${refusals.join(" ")}`);
    await lockStandard(draft.standardId);
    // Each `latest` library reference is pinned to the version it was just verified against (still the newest).
    const pins = await latestPinsToRecord(review.source, prepared.libraries);
    const previous = (await listVersionsOf(draft.standardId)).filter((version) => version.status === "published");
    const number = await nextVersionNumber(draft.standardId);
    const version = await insertVersion({
      standardId: draft.standardId,
      number,
      source: review.source,
      contentHash: check.hash!,
      title: check.metadata!.title,
      category: check.metadata!.category,
      tags: check.metadata!.tags,
      summary: check.metadata!.summary,
      changelog: review.changelog,
      authorId: review.submittedById,
      reviewerId: actor.id,
      basedOnVersionId: draft.basedOnVersionId,
      draftId: draft.id,
      reviewId: review.id,
      verifiedWith: check.verifiedWith,
      verification: check.verification,
    });
    await insertLibraryPins(version.id, pins);
    await insertVersionEvent({ versionId: version.id, kind: "published", actorId: actor.id });
    for (const old of previous)
      await insertVersionEvent({ versionId: old.id, kind: "superseded", reason: `by version ${number}`, actorId: actor.id });
    await decideReview(review.id, { reviewerId: actor.id, outcome: "approved", note: note || null });
    await updateDraft(draft.id, { state: "published", publishedVersionId: version.id });
    const author = await getUserOrThrow(review.submittedById);
    return {
      versionId: version.id,
      slug: await getSlugOf(draft.standardId),
      number,
      hash: version.contentHash,
      title: version.title,
      authorName: author.name,
      supersedes: previous.map((old) => old.number),
      cases: check.verification.length,
      libraries: pins.map(({ library, version: pinned, contentHash }) => ({ library, version: pinned, contentHash })),
    };
  },
  audit: ({ result }) => ({
    action: "standards.publish",
    subject: `standard-version:${result.versionId}`,
    details: {
      slug: result.slug,
      number: result.number,
      hash: result.hash,
      title: result.title,
      authorName: result.authorName,
      supersedes: result.supersedes,
      cases: result.cases,
      // The pins, sealed in the verifiable log with the audit event.
      ...(result.libraries.length > 0 ? { libraries: result.libraries } : {}),
    },
  }),
});

export const withdrawVersion = defineUseCase({
  name: "standards.withdraw",
  permission: "templates.withdraw",
  input: withdrawVersionSchema,
  run: async ({ versionId, reason, successorVersionId, mapping }, { actor }) => {
    const version = await getVersion({ id: versionId });
    if (!version) throw new AppError("not-found", "That version does not exist.");
    await lockStandard(version.standardId);
    const current = await getVersion({ id: versionId });
    if (current?.status === "withdrawn") throw new AppError("conflict", `Version ${version.number} is already withdrawn.`);
    await insertVersionEvent({ versionId, kind: "withdrawn", reason, actorId: actor.id });
    // The impact report's record, the mapping onto the successor and the notices, in the same transaction.
    const { withdrawalId, notified, successorNumber } = await recordWithdrawal(
      { standardVersionId: versionId },
      { actor, reason, successorVersionId, mapping },
    );
    return { versionId, slug: version.slug, number: version.number, reason, withdrawalId, successor: successorNumber, notified };
  },
  audit: ({ result }) => ({
    action: "standards.withdraw",
    subject: `standard-version:${result.versionId}`,
    details: {
      slug: result.slug,
      number: result.number,
      reason: result.reason,
      successor: result.successor,
      notified: result.notified,
    },
  }),
});

export type DraftPreviewData =
  { ok: true; definition: Definition; narrative: string; evaluation: Evaluation } | { ok: false; message: string };

/** A source evaluated at its default inputs, in the evaluation pool, for a preview. */
async function previewOf(source: string, which: "saved draft" | "text"): Promise<DraftPreviewData> {
  const notYet = `The preview appears once the ${which} compiles.`;
  const read = parseSource(source);
  const definition = read.ok ? DefinitionSchema.safeParse(read.parsed.data) : null;
  if (!read.ok || !definition?.success) return { ok: false, message: notYet };
  const evaluated = await evaluationPool().evaluate(source, undefined, await libraryEntriesFor(source));
  if (!evaluated.ok) return { ok: false, message: evaluated.message };
  if (!evaluated.result.ok) return { ok: false, message: notYet };
  if (!evaluated.result.outcome.ok) return { ok: false, message: "The default inputs could not be evaluated." };
  return {
    ok: true,
    definition: definition.data,
    narrative: read.parsed.narrative,
    evaluation: evaluated.result.outcome.evaluation,
  };
}

/** The draft evaluated at its default inputs, in the evaluation pool, for the editor's preview. */
export const previewDraft = defineUseCase({
  name: "standards.draft.preview",
  permission: "templates.write-draft",
  input: draftRefSchema,
  prepare: async ({ draftId }): Promise<DraftPreviewData> => {
    const draft = await getDraft(draftId);
    if (!draft) throw new AppError("not-found", "That draft does not exist.");
    return previewOf(draft.source, "saved draft");
  },
  run: async (_, { prepared }) => prepared,
  audit: null,
});

/**
 * What the author has typed and not saved: its problems, its verification cases and the preview at the default
 * inputs, for the editor to follow the typing. Nothing is stored; only the draft's author may ask.
 */
export const previewSource = defineUseCase({
  name: "standards.draft.preview-text",
  permission: "templates.write-draft",
  input: saveDraftSchema,
  prepare: async ({ source }): Promise<{ check: SourceCheck; preview: DraftPreviewData | null }> => {
    const check = await checkSource(source);
    return { check, preview: check.problems.length === 0 ? await previewOf(source, "text") : null };
  },
  run: async ({ draftId }, { actor, prepared }) => {
    await ownEditableDraft(draftId, actor);
    return prepared;
  },
  audit: null,
});

/** The draft's saved source through the gate (problems, verification), for the editor page. */
export const checkDraft = defineUseCase({
  name: "standards.draft.check",
  permission: "templates.write-draft",
  input: draftRefSchema,
  prepare: async ({ draftId }) => {
    const draft = await getDraft(draftId);
    if (!draft) throw new AppError("not-found", "That draft does not exist.");
    return checkSource(draft.source);
  },
  run: async (_, { prepared }) => prepared,
  audit: null,
});
