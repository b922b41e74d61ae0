"use client";
// Names the successor of a withdrawn version after the withdrawal, with the mapping of inputs: a version that fixes
// it often comes out later. The latest mapping is in force; the batch re-run runs on it.
import { startTransition, useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { FormError, Notice } from "@/components/ui/notice";
import { NO_SUCCESSOR, SuccessorFields, successorPayload } from "@/components/withdrawals/successor-fields";
import type { SuccessorInput, SuccessorOption } from "@/lib/use-cases/withdrawals";
import { declareSuccessorAction } from "../../actions";

export function SuccessorForm({
  withdrawalId,
  number,
  inputs,
  successors,
}: {
  withdrawalId: string;
  number: number;
  inputs: Record<string, SuccessorInput>;
  successors: SuccessorOption[];
}) {
  const [state, declare, pending] = useActionState(declareSuccessorAction, null);
  const [choice, setChoice] = useState(NO_SUCCESSOR);
  if (state?.ok) return <Notice tone="pass">Version {state.data.successor} is named as the successor.</Notice>;
  if (successors.length === 0) return <p className="text-sm text-ink-700">No other version of this standard is in use yet.</p>;
  const fieldProblem = state && !state.ok && Object.keys(state.error.fieldErrors ?? {}).length > 0;
  return (
    <form
      noValidate
      className="max-w-2xl space-y-3"
      data-testid="successor-form"
      onSubmit={(event) => {
        event.preventDefault();
        const { successorVersionId, mapping } = successorPayload(inputs, successors, choice);
        startTransition(() => declare({ withdrawalId, successorVersionId, mapping }));
      }}
    >
      <FormError message={state && !state.ok && !fieldProblem ? state.error.message : null} />
      <SuccessorFields
        number={number}
        inputs={inputs}
        successors={successors}
        choice={choice}
        onChange={setChoice}
        state={state}
      />
      <Button type="submit" pending={pending} pendingLabel="Saving…" data-testid="successor-submit">
        Name the successor
      </Button>
    </form>
  );
}
