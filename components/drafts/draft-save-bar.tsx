"use client";
// Saving and discarding a draft (a standard's or a library's): Save is always possible, problems and all;
// Discard asks first. What the save did, or why it failed, is said beside and below.
import { startTransition, type ReactNode } from "react";
import type { ActionState } from "@/lib/domain/action-state";
import { Button } from "@/components/ui/button";
import { FormError } from "@/components/ui/notice";

export function DraftSaveBar<S, D>({
  save,
  saving,
  saveState,
  dirty,
  note,
  discard,
  discarding,
  discardState,
}: {
  save: () => void;
  saving: boolean;
  saveState: ActionState<S>;
  dirty: boolean;
  /** Said after the save state: what still stops the draft going forward. */
  note?: ReactNode;
  discard: () => void;
  discarding: boolean;
  discardState: ActionState<D>;
}) {
  return (
    <>
      <div className="flex flex-wrap items-center gap-3">
        <Button
          type="button"
          pending={saving}
          pendingLabel="Saving…"
          data-testid="draft-save"
          onClick={() => startTransition(save)}
        >
          Save draft
        </Button>
        <span className="text-sm text-ink-500" data-testid="draft-save-state" aria-live="polite">
          {dirty ? "Unsaved changes" : saveState?.ok ? "Saved" : "No unsaved changes"}
        </span>
        {note}
        <Button
          type="button"
          variant="danger"
          size="sm"
          pending={discarding}
          pendingLabel="Discarding…"
          data-testid="draft-discard"
          onClick={() => {
            if (window.confirm("Discard this draft? It cannot be recovered.")) startTransition(discard);
          }}
        >
          Discard draft
        </Button>
      </div>
      {saveState && !saveState.ok ? <FormError message={saveState.error.message} /> : null}
      {discardState && !discardState.ok ? <FormError message={discardState.error.message} /> : null}
    </>
  );
}
