"use client";
// Submitting a draft (a standard's or a library's) for review: one changelog line and the button, which waits
// until the saved draft may go forward and says why not until then.
import { startTransition, useState } from "react";
import type { ActionState } from "@/lib/domain/action-state";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";

export function SubmitForReview<T>({
  submit,
  state,
  pending,
  blocked,
  className,
}: {
  submit: (changelog: string) => void;
  state: ActionState<T>;
  pending: boolean;
  /** Why the draft cannot be submitted yet; null when it can. */
  blocked: string | null;
  className?: string;
}) {
  const [changelog, setChangelog] = useState("");
  const errors = actionErrors(state, ["changelog"]);
  return (
    <form
      noValidate
      className={`grid items-end gap-3 sm:grid-cols-[minmax(0,1fr)_auto] ${className ?? ""}`}
      data-testid="submit-form"
      onSubmit={(event) => {
        event.preventDefault();
        startTransition(() => submit(changelog));
      }}
    >
      <TextField
        label="What changed (one line for the changelog)"
        value={changelog}
        onChange={(event) => setChangelog(event.target.value)}
        error={errors.field.changelog}
        data-testid="draft-changelog"
      />
      <Button type="submit" pending={pending} pendingLabel="Submitting…" disabled={blocked !== null} data-testid="draft-submit">
        Submit for review
      </Button>
      {blocked ? <p className="text-sm text-ink-500 sm:col-span-2">{blocked}</p> : null}
      {errors.form ? (
        <div className="sm:col-span-2">
          <FormError message={errors.form} />
        </div>
      ) : null}
      {state?.ok ? (
        <div className="sm:col-span-2">
          <Notice tone="pass" testId="draft-submitted">
            Submitted for review.
          </Notice>
        </div>
      ) : null}
    </form>
  );
}
