import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { checkLibraryDocument, LIBRARY_KIND_NAMES, normaliseKey, type LibraryDocument } from "@/lib/libraries";
import { runUseCase } from "@/lib/use-cases/run";
import { readLibraryDraft, readLibraryVersion } from "@/lib/use-cases/library-reads";
import { DraftHeader } from "@/components/drafts/draft-header";
import { Notice } from "@/components/ui/notice";
import { EntryDiff } from "@/components/libraries/entry-diff";
import { diffLibraryDocuments } from "@/components/libraries/entry-changes";
import { orNotFound } from "../../../_components/or-not-found";
import { LibraryDraftEditor } from "./_components/library-draft-editor";
import { LibraryReviewPanel } from "./_components/library-review-panel";
import { LibraryReviewHistory } from "./_components/library-review-history";

export const metadata: Metadata = { title: "Library draft" };

// A library draft: its author edits it; once submitted, a second admin or lead reads its difference from the
// version it started from and returns it with comments or approves and publishes it. The author never reviews
// their own submission (the server refuses; the page says so).
export default async function LibraryDraftPage({ params }: PageProps<"/libraries/drafts/[draftId]">) {
  const { draftId } = await params;
  const actor = await requirePageActor("libraries.write-draft", { next: `/libraries/drafts/${encodeURIComponent(draftId)}` });
  const { draft, reviews, basedOn } = await orNotFound(() => runUseCase(readLibraryDraft, { actor, input: { draftId } }));
  const mine = draft.authorId === actor.id;
  const open = reviews.find((review) => review.outcome === null) ?? null;
  const lastReturned = reviews.findLast((review) => review.outcome === "returned") ?? null;
  const editing = draft.state === "editing" && mine;
  const kind = LIBRARY_KIND_NAMES[draft.kind];

  // What the difference is taken of: the submission under review, else the saved draft; checked as it is published.
  const shown = checkLibraryDocument(open ? open.document : draft.document);
  const before = basedOn
    ? ((await runUseCase(readLibraryVersion, { actor, input: { slug: draft.slug, number: basedOn.number } }))
        .document as LibraryDocument)
    : null;
  const entryComments: Record<string, string[]> = {};
  for (const comment of lastReturned?.comments ?? [])
    if (comment.entryKey) (entryComments[normaliseKey(comment.entryKey)] ??= []).push(comment.body);
  return (
    <>
      <DraftHeader
        slug={draft.slug}
        mine={mine}
        authorName={draft.authorName}
        state={draft.state}
        reviews={reviews.length}
        actions={
          <Link href={`/libraries/${draft.slug}`} className="self-center text-sm font-medium text-plate-800 hover:underline">
            The library
          </Link>
        }
      >
        {kind.many} · {basedOn ? `started from version ${basedOn.number} (${basedOn.title}).` : "a new library."} Saved drafts are
        kept; a draft is submitted once every entry passes the check, and a second admin or standards lead reviews it.
      </DraftHeader>
      {editing ? (
        <LibraryDraftEditor draftId={draft.id} kind={draft.kind} stored={draft.document} comments={entryComments} />
      ) : null}
      {draft.state === "editing" && !mine ? (
        <Notice testId="draft-not-yours">
          {draft.authorName} is editing this draft; only its author changes it. It can be reviewed here once it is submitted.
        </Notice>
      ) : null}
      {open && mine ? (
        <Notice tone="warn" testId="waiting-review">
          Submitted for review: “{open.changelog}”. You cannot review your own submission: a second admin or standards lead
          approves it or returns it with comments.
        </Notice>
      ) : null}
      {open && !mine ? (
        <LibraryReviewPanel
          reviewId={open.id}
          round={open.round}
          changelog={open.changelog}
          authorName={open.submittedByName}
          keys={shown.ok ? keysChangedFirst(before, shown.document) : []}
          publishable={
            shown.ok
              ? null
              : `It cannot be published as it stands: ${shown.problems[0].entry ?? shown.problems[0].path}: ${shown.problems[0].message}`
          }
        />
      ) : null}
      {draft.state === "published" && draft.publishedVersionId ? (
        <Notice tone="pass" testId="draft-published">
          Published.{" "}
          <Link href={`/libraries/${draft.slug}`} className="font-medium underline">
            Open the library
          </Link>
          .
        </Notice>
      ) : null}
      {shown.ok && (open || before) ? (
        <section className="mt-10" aria-labelledby="changes-heading">
          <h2 id="changes-heading" className="mb-3 text-lg font-semibold text-ink-900">
            {open ? "What the submission changes" : "What the saved draft changes"}
          </h2>
          <EntryDiff
            before={before}
            after={shown.document}
            beforeLabel={basedOn ? `version ${basedOn.number}` : "nothing (a new library)"}
            afterLabel={open ? `submission ${open.round}` : "the saved draft"}
          />
        </section>
      ) : null}
      <LibraryReviewHistory reviews={reviews} />
    </>
  );
}

/** The submission's keys for the reviewer's comments: those added or changed first, as the difference lists them. */
function keysChangedFirst(before: LibraryDocument | null, after: LibraryDocument): string[] {
  const diff = diffLibraryDocuments(before, after);
  const first = [...diff.added.map((entry) => entry.key), ...diff.changed.map((entry) => entry.key)];
  return [...first, ...after.entries.map((entry) => entry.key).filter((key) => !first.includes(key))];
}
