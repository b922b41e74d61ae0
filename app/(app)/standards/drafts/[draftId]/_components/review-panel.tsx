"use client";
// The second lead's review: the submission read-only, a comment on any line (click its number, or Alt-Enter),
// an overall note, then Return with the comments or Approve and publish (the gate runs again on the current
// engine, and the version gets the standard's next number).
import dynamic from "next/dynamic";
import { startTransition, useActionState, useState } from "react";
import type { ReviewDto } from "@/lib/data/standards";
import type { VerificationResult } from "@/lib/standards/verify";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { approveAndPublishAction, returnDraftAction } from "../../../actions";

const SourceEditor = dynamic(() => import("@/components/standards/source-editor").then((m) => m.SourceEditor), {
  ssr: false,
  loading: () => <div className="h-[28rem] rounded-plate bg-paper-sunk ring-1 ring-ink-200" aria-hidden />,
});

type Comment = { line: number | null; body: string };

export function ReviewPanel({ review, verification }: { review: ReviewDto; verification: VerificationResult[] }) {
  const [comments, setComments] = useState<Comment[]>([]);
  const [note, setNote] = useState("");
  const [returnState, returnDraft, returning] = useActionState(returnDraftAction, null);
  const [approveState, approve, approving] = useActionState(approveAndPublishAction, null);
  const lines = review.source.split("\n");
  const addComment = (line: number | null) => setComments((list) => [...list, { line, body: "" }]);
  const returnErrors = actionErrors(returnState, ["note", "comments"]);
  const passing = verification.length > 0 && verification.every((result) => result.pass);

  return (
    <section aria-labelledby="review-heading" className="space-y-4" data-testid="review-panel">
      <h2 id="review-heading" className="text-lg font-semibold text-ink-900">
        Review submission {review.round} by {review.submittedByName}
      </h2>
      <p className="text-ink-700">
        Changelog: “{review.changelog}”. Click a line number (or press Alt-Enter on a line) to comment on that line.
      </p>
      <SourceEditor
        value={review.source}
        readOnly
        highlightLines={comments.flatMap((comment) => (comment.line ? [comment.line] : []))}
        onLineClick={addComment}
        ariaLabel={`Submission ${review.round}, read-only`}
        testId="review-source"
      />
      <div className="space-y-3" data-testid="review-comments">
        {comments.map((comment, index) => (
          <div key={index} className="rounded-plate bg-paper-raised p-3 ring-1 ring-ink-200" data-testid="review-comment-draft">
            {comment.line ? (
              <code className="mb-2 block truncate rounded bg-paper-sunk px-2 py-1 text-xs text-ink-700">
                {comment.line}: {lines[comment.line - 1]}
              </code>
            ) : null}
            <TextField
              label={comment.line ? `Comment on line ${comment.line}` : "Comment"}
              value={comment.body}
              data-testid="review-comment-body"
              onChange={(event) =>
                setComments((list) => list.map((c, i) => (i === index ? { ...c, body: event.target.value } : c)))
              }
            />
            <Button
              type="button"
              variant="quiet"
              size="sm"
              onClick={() => setComments((list) => list.filter((_, i) => i !== index))}
            >
              Remove comment
            </Button>
          </div>
        ))}
        <TextField
          label="Line to comment on (or click its number above)"
          type="number"
          min={1}
          max={lines.length}
          data-testid="review-line"
          onKeyDown={(event) => {
            if (event.key !== "Enter") return;
            event.preventDefault();
            const line = Number(event.currentTarget.value);
            if (Number.isInteger(line) && line >= 1 && line <= lines.length) addComment(line);
            event.currentTarget.value = "";
          }}
        />
      </div>
      <TextField
        label="Note to the author (optional with line comments)"
        value={note}
        onChange={(event) => setNote(event.target.value)}
        error={returnErrors.field.note}
        data-testid="review-note"
      />
      {returnErrors.form ? <FormError message={returnErrors.form} /> : null}
      {returnErrors.field.comments ? <FormError message={returnErrors.field.comments} /> : null}
      {approveState && !approveState.ok ? <FormError message={approveState.error.message} /> : null}
      {returnState?.ok ? (
        <Notice tone="pass" testId="review-returned">
          Returned to {review.submittedByName} with {returnState.data.comments} comment
          {returnState.data.comments === 1 ? "" : "s"}.
        </Notice>
      ) : (
        <div className="flex flex-wrap gap-3">
          <Button
            type="button"
            variant="secondary"
            pending={returning}
            pendingLabel="Returning…"
            data-testid="review-return"
            onClick={() =>
              startTransition(() =>
                returnDraft({ reviewId: review.id, note, comments: comments.filter((comment) => comment.body.trim() !== "") }),
              )
            }
          >
            Return with comments
          </Button>
          <Button
            type="button"
            pending={approving}
            pendingLabel="Publishing…"
            disabled={!passing}
            data-testid="review-approve"
            onClick={() => startTransition(() => approve({ reviewId: review.id, note }))}
          >
            Approve and publish
          </Button>
          {!passing ? <span className="self-center text-sm text-ink-500">Every verification case must pass first.</span> : null}
        </div>
      )}
    </section>
  );
}
