"use client";
// The second lead's review: the submission read-only, a comment on any line (click its number, or Alt-Enter),
// an overall note, then Return with the comments or Approve and publish (the gate runs again on the current
// engine, and the version gets the standard's next number).
import dynamic from "next/dynamic";
import { useActionState, useState } from "react";
import type { ReviewDto } from "@/lib/data/standards";
import type { VerificationResult } from "@/lib/standards/verify";
import { TextField } from "@/components/ui/field";
import { ReviewCommentDrafts } from "@/components/drafts/review-comments";
import { ReviewDecision } from "@/components/drafts/review-decision";
import { approveAndPublishAction, returnDraftAction } from "../../../actions";

const SourceEditor = dynamic(() => import("@/components/standards/source-editor").then((m) => m.SourceEditor), {
  ssr: false,
  loading: () => <div className="h-[28rem] rounded-plate bg-paper-sunk ring-1 ring-ink-200" aria-hidden />,
});

type Comment = { line: number | null; body: string };

export function ReviewPanel({ review, verification }: { review: ReviewDto; verification: VerificationResult[] }) {
  const [comments, setComments] = useState<Comment[]>([]);
  const [returnState, returnDraft, returning] = useActionState(returnDraftAction, null);
  const [approveState, approve, approving] = useActionState(approveAndPublishAction, null);
  const lines = review.source.split("\n");
  const addComment = (line: number | null) => setComments((list) => [...list, { line, body: "" }]);
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
        <ReviewCommentDrafts
          comments={comments}
          onChange={setComments}
          describe={(comment) => ({
            label: comment.line ? `Comment on line ${comment.line}` : "Comment",
            context: comment.line ? (
              <code className="mb-2 block truncate rounded bg-paper-sunk px-2 py-1 text-xs text-ink-700">
                {comment.line}: {lines[comment.line - 1]}
              </code>
            ) : null,
          })}
        />
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
      <ReviewDecision
        authorName={review.submittedByName}
        noteLabel="Note to the author (optional with line comments)"
        returnState={returnState}
        approveState={approveState}
        returning={returning}
        approving={approving}
        onReturn={(note) =>
          returnDraft({ reviewId: review.id, note, comments: comments.filter((comment) => comment.body.trim() !== "") })
        }
        onApprove={(note) => approve({ reviewId: review.id, note })}
        approveBlocked={passing ? null : "Every verification case must pass first."}
      />
    </section>
  );
}
