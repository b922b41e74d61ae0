import "server-only";
// The libraries' lifecycle, the standards' own: an admin or lead creates a library (or starts a draft from any
// version), saves its document as often as they like (problems and all), and submits it with a changelog line
// once it passes the document check; a different admin or lead returns it with comments on its entries, or
// approves it, which publishes it as the library's next version with a row and a hash per entry. Publishing
// supersedes the version before (still usable until withdrawn). A whole version, or one entry of it (a wrong
// property in the catalogue), is withdrawn with a reason. Reads and references: ./library-reads.ts.
import { AppError } from "@/lib/domain/errors";
import { can } from "@/lib/domain/permissions";
import type { Actor } from "@/lib/domain/actor";
import {
  approveLibraryReviewSchema,
  createLibrarySchema,
  discardLibraryDraftSchema,
  returnLibraryDraftSchema,
  saveLibraryDraftSchema,
  startLibraryDraftSchema,
  submitLibraryDraftSchema,
  withdrawLibraryEntrySchema,
  withdrawLibraryVersionSchema,
} from "@/lib/domain/schemas/libraries";
import { normaliseKey } from "@/lib/libraries/document";
import {
  getLibraryBySlug,
  getLibraryOrThrow,
  getLibraryVersion,
  insertLibrary,
  insertLibraryVersion,
  insertLibraryVersionEntries,
  insertLibraryVersionEvent,
  listLibraryVersionsOf,
  lockLibrary,
  nextLibraryVersionNumber,
} from "@/lib/data/libraries";
import {
  countLibraryReviews,
  decideLibraryReview,
  getLibraryDraft,
  getLibraryReviewDocument,
  insertLibraryDraft,
  insertLibraryReview,
  insertLibraryReviewComments,
  lockLibraryDraftOrThrow,
  lockLibraryReviewOrThrow,
  updateLibraryDraft,
} from "@/lib/data/library-drafts";
import { getUserOrThrow } from "@/lib/data/users";
import {
  checkLibraryDraftDocument,
  libraryGateRefusals,
  ownEditableLibraryDraft,
  sameDocument,
  type LibraryCheck,
} from "./library-check";
import { defineUseCase } from "./use-case";
import { recordWithdrawal } from "./withdrawals";

const refuse = (sentences: string[]) =>
  new AppError("invalid-input", sentences.join(" "), { fieldErrors: { document: sentences } });

export const createLibrary = defineUseCase({
  name: "libraries.create",
  permission: "libraries.write-draft",
  input: createLibrarySchema,
  run: async ({ slug, kind, title }, { actor }) => {
    const taken = () =>
      new AppError("conflict", `A library called “${slug}” exists already.`, {
        fieldErrors: { slug: ["This short name is taken; open that library and start a draft from it instead."] },
      });
    if (await getLibraryBySlug(slug)) throw taken();
    const library = await insertLibrary({ slug, kind, createdById: actor.id });
    if (!library) throw taken(); // created by someone else between the look-up and the insert
    const draft = await insertLibraryDraft({
      libraryId: library.id,
      authorId: actor.id,
      document: { kind, title, entries: [] },
      basedOnVersionId: null,
    });
    return { slug, kind, title, draftId: draft.id };
  },
  audit: ({ result }) => ({
    action: "libraries.create",
    subject: `library-draft:${result.draftId}`,
    details: { slug: result.slug, kind: result.kind, title: result.title },
  }),
});

export const startLibraryDraft = defineUseCase({
  name: "libraries.draft.start",
  permission: "libraries.write-draft",
  input: startLibraryDraftSchema,
  run: async ({ versionId }, { actor }) => {
    const version = await getLibraryVersion({ id: versionId });
    if (!version) throw new AppError("not-found", "That library version does not exist.");
    // The checked document holds what the builder computed; a draft keeps only what a person writes.
    const document = draftDocumentOf(version.document);
    const draft = await insertLibraryDraft({
      libraryId: version.libraryId,
      authorId: actor.id,
      document,
      basedOnVersionId: version.id,
    });
    return { draftId: draft.id, slug: version.slug, fromVersion: version.number };
  },
  audit: ({ result }) => ({
    action: "libraries.draft.start",
    subject: `library-draft:${result.draftId}`,
    details: { slug: result.slug, fromVersion: result.fromVersion },
  }),
});

/**
 * A published document as a draft's: section entries as a person writes them, without what the builder adds
 * (its properties, the shape beside the dimensions), which the check computes again.
 */
export function draftDocumentOf(document: unknown): unknown {
  const doc = document as { kind: string; entries: Record<string, unknown>[] };
  if (doc.kind !== "sections") return doc;
  return {
    ...doc,
    entries: doc.entries.map(({ computed: _c, properties: _p, dimensions, ...entry }) => {
      const { shape: _s, ...lengths } = dimensions as Record<string, unknown>;
      return { ...entry, dimensions: lengths };
    }),
  };
}

/** Saves whatever was written, problems included; says what the problems are. */
export const saveLibraryDraft = defineUseCase({
  name: "libraries.draft.save",
  permission: "libraries.write-draft",
  input: saveLibraryDraftSchema,
  prepare: async ({ draftId, document }): Promise<LibraryCheck> => {
    const draft = await getLibraryDraft(draftId);
    if (!draft) throw new AppError("not-found", "That library draft does not exist.");
    return checkLibraryDraftDocument(document, draft.kind);
  },
  run: async ({ draftId, document }, { actor, prepared }) => {
    const draft = await ownEditableLibraryDraft(draftId, actor);
    await updateLibraryDraft(draftId, { document });
    const library = await getLibraryOrThrow(draft.libraryId);
    return {
      slug: library.slug,
      problems: prepared.problems,
      hash: prepared.checked?.contentHash ?? null,
      entries: prepared.checked?.entries.length ?? null,
    };
  },
  audit: ({ result }) => ({
    action: "libraries.draft.save",
    subject: null,
    details: { slug: result.slug, hash: result.hash, entries: result.entries, problems: result.problems.length },
  }),
});

export const discardLibraryDraft = defineUseCase({
  name: "libraries.draft.discard",
  permission: "libraries.write-draft",
  input: discardLibraryDraftSchema,
  run: async ({ draftId }, { actor }) => {
    const draft = await ownEditableLibraryDraft(draftId, actor);
    await updateLibraryDraft(draftId, { state: "discarded" });
    return { draftId, slug: (await getLibraryOrThrow(draft.libraryId)).slug };
  },
  audit: ({ result }) => ({
    action: "libraries.draft.discard",
    subject: `library-draft:${result.draftId}`,
    details: { slug: result.slug },
  }),
});

/** Submits the draft as saved: it must pass the document check and differ from the version it started from. */
export const submitLibraryDraft = defineUseCase({
  name: "libraries.draft.submit",
  permission: "libraries.write-draft",
  input: submitLibraryDraftSchema,
  prepare: async ({ draftId }) => {
    const draft = await getLibraryDraft(draftId);
    if (!draft) throw new AppError("not-found", "That library draft does not exist.");
    return { document: draft.document, check: await checkLibraryDraftDocument(draft.document, draft.kind) };
  },
  run: async ({ draftId, changelog }, { actor, prepared }) => {
    const draft = await ownEditableLibraryDraft(draftId, actor);
    if (!sameDocument(draft.document, prepared.document))
      throw new AppError("conflict", "The draft changed while it was being checked; submit it again.");
    const basedOn = draft.basedOnVersionId ? await getLibraryVersion({ id: draft.basedOnVersionId }) : null;
    const refusals = libraryGateRefusals(prepared.check, basedOn);
    if (refusals.length > 0) throw refuse(refusals);
    const { contentHash, entries } = prepared.check.checked!;
    const round = (await countLibraryReviews(draftId)) + 1;
    const review = await insertLibraryReview({
      draftId,
      round,
      document: draft.document,
      contentHash,
      changelog,
      submittedById: actor.id,
    });
    await updateLibraryDraft(draftId, { state: "in-review" });
    const library = await getLibraryOrThrow(draft.libraryId);
    return { draftId, reviewId: review.id, round, changelog, hash: contentHash, entries: entries.length, slug: library.slug };
  },
  audit: ({ result }) => ({
    action: "libraries.draft.submit",
    subject: `library-draft:${result.draftId}`,
    details: { slug: result.slug, round: result.round, changelog: result.changelog, hash: result.hash, entries: result.entries },
  }),
});

/** The submission, locked, if it awaits a decision and `actor` did not submit it (four eyes). */
async function reviewToDecide(reviewId: string, actor: Actor) {
  const review = await lockLibraryReviewOrThrow(reviewId);
  if (review.outcome !== null) throw new AppError("conflict", `This submission was already ${review.outcome}.`);
  if (review.submittedById === actor.id)
    throw new AppError(
      "forbidden",
      "A second admin or standards lead reviews a library submission: nobody approves or returns their own.",
    );
  return review;
}

export const returnLibraryDraft = defineUseCase({
  name: "libraries.draft.return",
  permission: "libraries.review",
  input: returnLibraryDraftSchema,
  run: async ({ reviewId, note, comments }, { actor }) => {
    const review = await reviewToDecide(reviewId, actor);
    // A comment names an entry of what was submitted; it is kept under the key as the document writes it.
    const submitted = (review.document as { entries?: { key?: unknown }[] }).entries ?? [];
    const keys = new Map(
      submitted.flatMap((entry) => (typeof entry.key === "string" ? [[normaliseKey(entry.key), entry.key] as const] : [])),
    );
    const unknown = comments.find((comment) => comment.entryKey !== null && !keys.has(normaliseKey(comment.entryKey)));
    if (unknown) {
      const message = `The submission has no entry “${unknown.entryKey}”; comment on one of its entries or on the whole.`;
      throw new AppError("invalid-input", message, { fieldErrors: { comments: [message] } });
    }
    await insertLibraryReviewComments(
      reviewId,
      actor.id,
      comments.map((comment) => ({
        body: comment.body,
        entryKey: comment.entryKey === null ? null : keys.get(normaliseKey(comment.entryKey))!,
      })),
    );
    await decideLibraryReview(reviewId, { reviewerId: actor.id, outcome: "returned", note: note || null });
    const draft = await lockLibraryDraftOrThrow(review.draftId);
    await updateLibraryDraft(review.draftId, { state: "editing" });
    const author = await getUserOrThrow(draft.authorId);
    return {
      draftId: review.draftId,
      round: review.round,
      comments: comments.length,
      authorName: author.name,
      slug: (await getLibraryOrThrow(draft.libraryId)).slug,
    };
  },
  audit: ({ result }) => ({
    action: "libraries.draft.return",
    subject: `library-draft:${result.draftId}`,
    details: { slug: result.slug, round: result.round, comments: result.comments, authorName: result.authorName },
  }),
});

/**
 * Approves a submission and publishes it: the document is checked and hashed again (before the transaction) and
 * must hash as it did when submitted; the library's row is locked so two publications take consecutive numbers;
 * the version and a row per entry are inserted (never to change), and the versions it supersedes get their event.
 */
export const approveAndPublishLibrary = defineUseCase({
  name: "libraries.publish",
  permission: "libraries.publish",
  input: approveLibraryReviewSchema,
  prepare: async ({ reviewId }, { actor }) => {
    if (!can(actor.role, "libraries.review")) throw new AppError("forbidden");
    const found = await getLibraryReviewDocument(reviewId);
    return { document: found.document, check: await checkLibraryDraftDocument(found.document, found.kind) };
  },
  run: async ({ reviewId, note }, { actor, prepared }) => {
    const review = await reviewToDecide(reviewId, actor);
    if (!sameDocument(review.document, prepared.document))
      throw new AppError("conflict", "The submission changed while it was checked; try again.");
    const { check } = prepared;
    if (!check.checked)
      throw new AppError("invalid-input", `It cannot be published: ${libraryGateRefusals(check, null).join(" ")}`);
    if (check.checked.contentHash !== review.contentHash)
      throw new AppError(
        "conflict",
        "The document no longer gives the properties it gave when submitted (the section builder has changed); return it so the author submits it again.",
      );
    const draft = await lockLibraryDraftOrThrow(review.draftId);
    await lockLibrary(draft.libraryId);
    const library = await getLibraryOrThrow(draft.libraryId);
    const previous = (await listLibraryVersionsOf(draft.libraryId)).filter((version) => version.status === "published");
    const number = await nextLibraryVersionNumber(draft.libraryId);
    const { document, contentHash, entries } = check.checked;
    const version = await insertLibraryVersion({
      libraryId: draft.libraryId,
      number,
      kind: document.kind,
      title: document.title,
      document,
      contentHash,
      changelog: review.changelog,
      authorId: review.submittedById,
      reviewerId: actor.id,
      basedOnVersionId: draft.basedOnVersionId,
      draftId: draft.id,
      reviewId: review.id,
    });
    await insertLibraryVersionEntries(version.id, entries);
    await insertLibraryVersionEvent({ versionId: version.id, kind: "published", actorId: actor.id });
    for (const old of previous)
      await insertLibraryVersionEvent({
        versionId: old.id,
        kind: "superseded",
        reason: `by version ${number}`,
        actorId: actor.id,
      });
    await decideLibraryReview(review.id, { reviewerId: actor.id, outcome: "approved", note: note || null });
    await updateLibraryDraft(draft.id, { state: "published", publishedVersionId: version.id });
    const author = await getUserOrThrow(review.submittedById);
    return {
      versionId: version.id,
      slug: library.slug,
      kind: library.kind,
      number,
      hash: contentHash,
      title: document.title,
      entries: entries.length,
      authorName: author.name,
      supersedes: previous.map((old) => old.number),
    };
  },
  audit: ({ result }) => ({
    action: "libraries.publish",
    subject: `library-version:${result.versionId}`,
    details: {
      slug: result.slug,
      kind: result.kind,
      number: result.number,
      hash: result.hash,
      title: result.title,
      entries: result.entries,
      authorName: result.authorName,
      supersedes: result.supersedes,
    },
  }),
});

/** The version, its library locked; refused when it is withdrawn already. */
async function versionToWithdraw(versionId: string) {
  const found = await getLibraryVersion({ id: versionId });
  if (!found) throw new AppError("not-found", "That library version does not exist.");
  await lockLibrary(found.libraryId);
  const version = (await getLibraryVersion({ id: versionId }))!;
  if (version.status === "withdrawn")
    throw new AppError("conflict", `Version ${version.number} of ${version.slug} is already withdrawn, with every entry in it.`);
  return version;
}

export const withdrawLibraryVersion = defineUseCase({
  name: "libraries.withdraw",
  permission: "libraries.withdraw",
  input: withdrawLibraryVersionSchema,
  run: async ({ versionId, reason, replacementKey }, { actor }) => {
    const version = await versionToWithdraw(versionId);
    await insertLibraryVersionEvent({ versionId, kind: "withdrawn", reason, actorId: actor.id });
    const { withdrawalId, notified, replacement } = await recordWithdrawal(
      { libraryVersionId: versionId },
      { actor, reason, library: { slug: version.slug, replacementKey } },
    );
    return { versionId, slug: version.slug, number: version.number, reason, withdrawalId, replacement, notified };
  },
  audit: ({ result }) => ({
    action: "libraries.withdraw",
    subject: `library-version:${result.versionId}`,
    details: {
      slug: result.slug,
      number: result.number,
      reason: result.reason,
      replacement: result.replacement,
      notified: result.notified,
    },
  }),
});

/** Withdraws one entry of a version (a wrong value): the rest of the version stays in use. */
export const withdrawLibraryEntry = defineUseCase({
  name: "libraries.entry.withdraw",
  permission: "libraries.withdraw",
  input: withdrawLibraryEntrySchema,
  run: async ({ versionId, entryKey, reason, replacementKey }, { actor }) => {
    const version = await versionToWithdraw(versionId);
    const entry = version.entryRows.find((row) => row.normalisedKey === normaliseKey(entryKey));
    if (!entry) throw new AppError("not-found", `Version ${version.number} of ${version.slug} has no entry “${entryKey}”.`);
    if (entry.withdrawn)
      throw new AppError("conflict", `${entry.key} in version ${version.number} of ${version.slug} is already withdrawn.`);
    await insertLibraryVersionEvent({ versionId, kind: "withdrawn", entryKey: entry.normalisedKey, reason, actorId: actor.id });
    const { withdrawalId, notified, replacement } = await recordWithdrawal(
      { libraryEntryId: entry.id },
      { actor, reason, library: { slug: version.slug, replacementKey } },
    );
    return {
      versionId,
      entryId: entry.id,
      slug: version.slug,
      number: version.number,
      entryKey: entry.key,
      entryHash: entry.entryHash,
      reason,
      withdrawalId,
      replacement,
      notified,
    };
  },
  audit: ({ result }) => ({
    action: "libraries.entry.withdraw",
    subject: `library-version:${result.versionId}`,
    details: {
      slug: result.slug,
      number: result.number,
      entryKey: result.entryKey,
      entryHash: result.entryHash,
      reason: result.reason,
      replacement: result.replacement,
      notified: result.notified,
    },
  }),
});
