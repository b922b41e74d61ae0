// The inputs and proofs of work for the libraries' server actions (app/(app)/libraries/actions.ts), for both
// access matrices: each call gets a library of its own, written and published by two leads made for it, so the
// caller (an admin or lead of the matrix, or a demo person) is never its author.
import { expect } from "vitest";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { NOT_THE_AUTHOR } from "@/lib/use-cases/draft-access";
import { runUseCase } from "@/lib/use-cases/run";
import { approveAndPublishLibrary, createLibrary, saveLibraryDraft, submitLibraryDraft } from "@/lib/use-cases/libraries";
import { readLibraryDraft } from "@/lib/use-cases/library-reads";
import { createTestUser } from "./people";
import type { ActionAnswer, ActionFixture } from "./action-fixtures";

let counter = 0;
const librarySlug = () => `matrix-lib-${Date.now().toString(36)}-${(counter++).toString(36)}`;
const ENTRY = "MX-T 168x6";
/** A tube made in the builder (metres; invented). */
const tubes = {
  kind: "sections",
  title: "Matrix tubes",
  entries: [{ key: ENTRY, origin: { from: "builder" }, shape: "circular-hollow", dimensions: { D: 0.1683, t: 0.006 } }],
};

/** A sections library's first draft by a lead made for the call, saved with one tube, submitted when asked. */
async function otherLeadsLibraryDraft({ submit }: { submit: boolean }) {
  const { actor: author } = await createTestUser({ role: "lead", label: "matrix-lib-author" });
  const slug = librarySlug();
  const { draftId } = await runUseCase(createLibrary, {
    actor: author,
    input: { slug, kind: "sections", title: "Matrix tubes" },
  });
  await runUseCase(saveLibraryDraft, { actor: author, input: { draftId, document: tubes } });
  const reviewId = submit
    ? (await runUseCase(submitLibraryDraft, { actor: author, input: { draftId, changelog: "For the matrix." } })).reviewId
    : null;
  return { author, slug, draftId, reviewId };
}

/** A sections library published as version 1 by two leads made for the call. */
async function publishedLibrary() {
  const { slug, reviewId } = await otherLeadsLibraryDraft({ submit: true });
  const { actor: reviewer } = await createTestUser({ role: "lead", label: "matrix-lib-reviewer" });
  const { versionId } = await runUseCase(approveAndPublishLibrary, { actor: reviewer, input: { reviewId: reviewId! } });
  return { slug, versionId };
}

async function libraryDraftRow(id: string) {
  const [row] = await db.select().from(schema.libraryDrafts).where(eq(schema.libraryDrafts.id, id));
  return row;
}

async function versionEvents(versionId: string) {
  return db
    .select()
    .from(schema.libraryVersionEvents)
    .where(eq(schema.libraryVersionEvents.versionId, versionId))
    .orderBy(schema.libraryVersionEvents.id);
}

/** Only the author edits a draft: an admin or lead who is not gets past the permission check and is told so. */
const notTheAuthor = (answer: ActionAnswer) =>
  expect(answer).toEqual({ state: { ok: false, error: { code: "forbidden", message: NOT_THE_AUTHOR } } });

/** Someone else's draft, and the proof that the action refused to touch it. */
async function someoneElsesDraft(input: (draftId: string) => Record<string, unknown>): Promise<ActionFixture> {
  const { draftId } = await otherLeadsLibraryDraft({ submit: false });
  const before = await libraryDraftRow(draftId);
  return {
    input: input(draftId),
    succeeded: async (answer) => {
      notTheAuthor(answer);
      expect(await libraryDraftRow(draftId)).toEqual(before);
    },
  };
}

const file = "app/(app)/libraries/actions.ts";

export const LIBRARY_ACTION_FIXTURES: Record<string, () => Promise<ActionFixture>> = {
  [`${file}#createLibraryAction`]: async () => {
    const slug = librarySlug();
    return {
      input: { slug, kind: "materials", title: "Matrix materials" },
      succeeded: async (answer) => {
        const [library] = await db.select().from(schema.libraries).where(eq(schema.libraries.slug, slug));
        const [draft] = await db.select().from(schema.libraryDrafts).where(eq(schema.libraryDrafts.libraryId, library.id));
        expect(answer).toEqual({ redirect: `/libraries/drafts/${draft.id}` });
        expect(draft).toMatchObject({
          state: "editing",
          document: { kind: "materials", title: "Matrix materials", entries: [] },
        });
      },
    };
  },
  [`${file}#startLibraryDraftAction`]: async () => {
    const { versionId } = await publishedLibrary();
    return {
      input: { versionId },
      succeeded: async (answer) => {
        const drafts = await db.select().from(schema.libraryDrafts).where(eq(schema.libraryDrafts.basedOnVersionId, versionId));
        expect(drafts).toHaveLength(1);
        expect(answer).toEqual({ redirect: `/libraries/drafts/${drafts[0].id}` });
        expect(drafts[0].document).toMatchObject({
          kind: "sections",
          entries: [{ key: ENTRY, dimensions: { D: 0.1683, t: 0.006 } }],
        });
      },
    };
  },
  [`${file}#saveLibraryDraftAction`]: () =>
    someoneElsesDraft((draftId) => ({ draftId, document: { ...tubes, title: "Changed by someone else" } })),
  [`${file}#submitLibraryDraftAction`]: () => someoneElsesDraft((draftId) => ({ draftId, changelog: "Not mine to submit." })),
  [`${file}#discardLibraryDraftAction`]: () => someoneElsesDraft((draftId) => ({ draftId })),
  [`${file}#returnLibraryDraftAction`]: async () => {
    const { author, draftId, reviewId } = await otherLeadsLibraryDraft({ submit: true });
    return {
      input: { reviewId, note: "", comments: [{ entryKey: ENTRY, body: "Give the tube's steel grade in a note." }] },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({ state: { ok: true, data: { draftId, round: 1, comments: 1, authorName: author.name } } });
        const view = await runUseCase(readLibraryDraft, { actor: author, input: { draftId } });
        expect(view.draft.state).toBe("editing");
        expect(view.reviews[0].comments.map((c) => [c.entryKey, c.body])).toEqual([
          [ENTRY, "Give the tube's steel grade in a note."],
        ]);
      },
    };
  },
  [`${file}#approveAndPublishLibraryAction`]: async () => {
    const { slug, draftId, reviewId } = await otherLeadsLibraryDraft({ submit: true });
    return {
      input: { reviewId },
      succeeded: async (answer) => {
        expect(answer).toEqual({ redirect: `/libraries/${slug}/versions/1` });
        const versions = await db.select().from(schema.libraryVersions).where(eq(schema.libraryVersions.draftId, draftId));
        expect(versions.map((v) => [v.number, v.title])).toEqual([[1, "Matrix tubes"]]);
        expect((await libraryDraftRow(draftId)).state).toBe("published");
      },
    };
  },
  [`${file}#withdrawLibraryVersionAction`]: async () => {
    const { slug, versionId } = await publishedLibrary();
    return {
      input: { versionId, reason: "Withdrawn by the access matrix." },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({
          state: { ok: true, data: { versionId, slug, number: 1, reason: "Withdrawn by the access matrix.", notified: 0 } },
        });
        expect((await versionEvents(versionId)).map((e) => [e.kind, e.entryKey])).toEqual([
          ["published", null],
          ["withdrawn", null],
        ]);
      },
    };
  },
  [`${file}#withdrawLibraryEntryAction`]: async () => {
    const { slug, versionId } = await publishedLibrary();
    return {
      input: { versionId, entryKey: ENTRY, reason: "t is 6.3 mm, not 6 mm." },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({
          state: { ok: true, data: { versionId, slug, number: 1, entryKey: ENTRY, reason: "t is 6.3 mm, not 6 mm." } },
        });
        const events = await versionEvents(versionId);
        expect(events.map((e) => e.kind)).toEqual(["published", "withdrawn"]);
        expect(events[1].entryKey).not.toBeNull();
        // The version itself stays published: only the entry is withdrawn.
        const whole = await db
          .select()
          .from(schema.libraryVersionEvents)
          .where(and(eq(schema.libraryVersionEvents.versionId, versionId), isNull(schema.libraryVersionEvents.entryKey)));
        expect(whole.map((e) => e.kind)).toEqual(["published"]);
      },
    };
  },
};
