"use client";
// Starts a draft from a published version (a standard's or a library's); the action opens it in the editor.
import { startTransition, useActionState } from "react";
import type { ActionState } from "@/lib/domain/action-state";
import { Button } from "@/components/ui/button";
import { FormError } from "@/components/ui/notice";

export function StartDraftButton<T>({
  action,
  versionId,
  label,
  testId,
}: {
  action: (previous: ActionState<T>, payload: { versionId: string }) => Promise<ActionState<T>>;
  versionId: string;
  label: string;
  testId: string;
}) {
  const [state, start, pending] = useActionState(action, null);
  return (
    <div>
      <Button
        type="button"
        variant="secondary"
        pending={pending}
        pendingLabel="Starting…"
        data-testid={testId}
        onClick={() => startTransition(() => start({ versionId }))}
      >
        {label}
      </Button>
      {state && !state.ok ? <FormError message={state.error.message} /> : null}
    </div>
  );
}
