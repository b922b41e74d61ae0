import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import { AppError } from "@/lib/domain/errors";
import { can } from "@/lib/domain/permissions";
import { runUseCase } from "@/lib/use-cases/run";
import { readDraft } from "@/lib/use-cases/standards";
import { checkDraft } from "@/lib/use-cases/standards";
import { diffStandards } from "@/lib/standards/diff";
import { VersionDiff } from "@/components/standards/version-diff";
import { DraftHeader } from "@/components/drafts/draft-header";
import { DraftEditor } from "./_components/draft-editor";
import { DraftPreview } from "./_components/draft-preview";
import { ReviewPanel } from "./_components/review-panel";
import { ReviewHistory } from "./_components/review-history";
import { HandCalculations } from "./_components/hand-calculations";

export const metadata: Metadata = { title: "Draft standard" };

export default async function DraftPage({ params }: PageProps<"/standards/drafts/[draftId]">) {
  const { draftId } = await params;
  const actor = await requirePageActor("templates.write-draft", { next: `/standards/drafts/${encodeURIComponent(draftId)}` });
  let view;
  try {
    view = await runUseCase(readDraft, { actor, input: { draftId } });
  } catch (error) {
    if (error instanceof AppError && (error.code === "not-found" || error.code === "invalid-input")) notFound();
    throw error;
  }
  const { draft, reviews, basedOn, attachments } = view;
  const mine = draft.authorId === actor.id;
  const open = reviews.find((review) => review.outcome === null) ?? null;
  const lastReturned = [...reviews].reverse().find((review) => review.outcome === "returned") ?? null;
  const check = await runUseCase(checkDraft, { actor, input: { draftId } }).catch((error: unknown) => {
    if (error instanceof AppError) return { failure: error.message };
    throw error;
  });
  const editing = draft.state === "editing" && mine;
  const savedPreview = <DraftPreview actor={actor} draftId={draft.id} check={"failure" in check ? null : check} />;
  return (
    <>
      <DraftHeader slug={draft.slug} mine={mine} authorName={draft.authorName} state={draft.state} reviews={reviews.length}>
        {basedOn ? `Started from v${basedOn.number} (${basedOn.title}).` : "A new standard."} Saved drafts are kept; a draft is
        submitted once it compiles and its verification cases pass, and a second standards lead reviews it.
      </DraftHeader>
      {editing ? (
        <DraftEditor
          savedPreview={savedPreview}
          draftId={draft.id}
          source={draft.source}
          problems={"failure" in check ? [] : check.problems}
          gate={"failure" in check ? [check.failure] : []}
          verification={"failure" in check ? [] : check.verification}
          commentLines={lastReturned?.comments.flatMap((comment) => (comment.line ? [comment.line] : [])) ?? []}
        />
      ) : null}
      {open && !mine && can(actor.role, "templates.review") ? (
        <ReviewPanel review={open} verification={"failure" in check ? [] : check.verification} />
      ) : null}
      {open && mine ? (
        <p className="rounded-plate bg-warn-100 p-4 text-warn-700" data-testid="waiting-review">
          Submitted for review: “{open.changelog}”. A second standards lead approves it or returns it with comments.
        </p>
      ) : null}
      {open && basedOn ? (
        <section className="mt-8" aria-labelledby="changes-heading">
          <h2 id="changes-heading" className="mb-3 text-lg font-semibold text-ink-900">
            Changes since v{basedOn.number}
          </h2>
          <VersionDiff
            diff={diffStandards(basedOn.source, open.source)}
            oldLabel={`v${basedOn.number}`}
            newLabel="This submission"
          />
        </section>
      ) : null}
      <HandCalculations draftId={draft.id} attachments={attachments} canAttach={editing} />
      <ReviewHistory reviews={reviews} />
      {editing ? null : savedPreview}
    </>
  );
}
