"use client";
// A second admin's or lead's review of a library submission: comments on any entry (or on the whole), a note,
// then Return with the comments or Approve and publish (the document is checked and hashed again, and the
// version gets the library's next number). The difference from the version it started from is shown above.
import { useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";
import { ReviewCommentDrafts } from "@/components/drafts/review-comments";
import { ReviewDecision } from "@/components/drafts/review-decision";
import { approveAndPublishLibraryAction, returnLibraryDraftAction } from "../../../actions";

type Comment = { entryKey: string | null; body: string };

const WHOLE = "";

export function LibraryReviewPanel({
  reviewId,
  round,
  changelog,
  authorName,
  keys,
  publishable,
}: {
  reviewId: string;
  round: number;
  changelog: string;
  authorName: string;
  /** The submission's entries, as it names them. */
  keys: string[];
  /** Why it cannot be published as it stands; null when it can. */
  publishable: string | null;
}) {
  const [comments, setComments] = useState<Comment[]>([]);
  const [about, setAbout] = useState(WHOLE);
  const [returnState, returnDraft, returning] = useActionState(returnLibraryDraftAction, null);
  const [approveState, approve, approving] = useActionState(approveAndPublishLibraryAction, null);

  return (
    <section aria-labelledby="review-heading" className="space-y-4" data-testid="review-panel">
      <h2 id="review-heading" className="text-lg font-semibold text-ink-900">
        Review submission {round} by {authorName}
      </h2>
      <p className="text-ink-700">
        Changelog: “{changelog}” — read the changes below, comment on an entry, or on the whole submission, then return it or
        approve and publish it.
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <SelectField
          label="Comment on"
          value={about}
          onChange={(event) => setAbout(event.target.value)}
          data-testid="review-comment-on"
          className="min-w-64"
        >
          <option value={WHOLE}>the whole submission</option>
          {keys.map((key) => (
            <option key={key} value={key}>
              {key}
            </option>
          ))}
        </SelectField>
        <Button
          type="button"
          variant="secondary"
          data-testid="review-add-comment"
          onClick={() => setComments((list) => [...list, { entryKey: about === WHOLE ? null : about, body: "" }])}
        >
          Add a comment
        </Button>
      </div>
      <div className="space-y-3" data-testid="review-comments">
        <ReviewCommentDrafts
          comments={comments}
          onChange={setComments}
          describe={(comment) => ({
            label: comment.entryKey ? `Comment on ${comment.entryKey}` : "Comment on the whole submission",
          })}
        />
      </div>
      <ReviewDecision
        authorName={authorName}
        noteLabel="Note to the author (optional with comments)"
        returnState={returnState}
        approveState={approveState}
        returning={returning}
        approving={approving}
        onReturn={(note) => returnDraft({ reviewId, note, comments: comments.filter((comment) => comment.body.trim() !== "") })}
        onApprove={(note) => approve({ reviewId, note })}
        approveBlocked={publishable}
      />
    </section>
  );
}
