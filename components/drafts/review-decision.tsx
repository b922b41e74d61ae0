"use client";
// The end of a review (a standard's or a library's): a note to the author, then Return with the comments or
// Approve and publish, with the server's answer to either in words.
import { startTransition, useState } from "react";
import type { ActionState } from "@/lib/domain/action-state";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";

export function ReviewDecision<A>({
  authorName,
  noteLabel,
  returnState,
  approveState,
  returning,
  approving,
  onReturn,
  onApprove,
  approveBlocked,
}: {
  authorName: string;
  noteLabel: string;
  returnState: ActionState<{ comments: number }>;
  approveState: ActionState<A>;
  returning: boolean;
  approving: boolean;
  onReturn: (note: string) => void;
  onApprove: (note: string) => void;
  /** Why it cannot be approved as it stands; null when it can. */
  approveBlocked: string | null;
}) {
  const [note, setNote] = useState("");
  const returnErrors = actionErrors(returnState, ["note", "comments"]);
  return (
    <>
      <TextField
        label={noteLabel}
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
          Returned to {authorName} with {returnState.data.comments} comment{returnState.data.comments === 1 ? "" : "s"}.
        </Notice>
      ) : (
        <div className="flex flex-wrap gap-3">
          <Button
            type="button"
            variant="secondary"
            pending={returning}
            pendingLabel="Returning…"
            data-testid="review-return"
            onClick={() => startTransition(() => onReturn(note))}
          >
            Return with comments
          </Button>
          <Button
            type="button"
            pending={approving}
            pendingLabel="Publishing…"
            disabled={approveBlocked !== null}
            data-testid="review-approve"
            onClick={() => startTransition(() => onApprove(note))}
          >
            Approve and publish
          </Button>
          {approveBlocked ? <span className="self-center text-sm text-ink-500">{approveBlocked}</span> : null}
        </div>
      )}
    </>
  );
}
