"use client";

import { startTransition, useActionState } from "react";
import { Button } from "@/components/ui/button";
import { FormError } from "@/components/ui/notice";
import { startDraftAction } from "../actions";

/** Starts a draft with this version's source; the draft opens in the editor. */
export function StartDraftButton({ versionId, number }: { versionId: string; number: number }) {
  const [state, start, pending] = useActionState(startDraftAction, null);
  return (
    <div>
      <Button
        type="button"
        variant="secondary"
        pending={pending}
        pendingLabel="Starting…"
        data-testid="start-draft"
        onClick={() => startTransition(() => start({ versionId }))}
      >
        Start a draft from v{number}
      </Button>
      {state && !state.ok ? <FormError message={state.error.message} /> : null}
    </div>
  );
}
