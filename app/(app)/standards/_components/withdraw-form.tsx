"use client";

import { startTransition, useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { FormError } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { NO_SUCCESSOR, SuccessorFields, successorPayload } from "@/components/withdrawals/successor-fields";
import type { SuccessorInput, SuccessorOption } from "@/lib/use-cases/withdrawals";
import { withdrawVersionAction } from "../actions";

/**
 * Withdraws a version: it can no longer be run. Its record stays (nothing published is ever deleted), and every run
 * made with it remains traceable. Naming the version that replaces it, with how the old inputs map onto its inputs,
 * lets the impact report re-run every affected run on it (it can also be named there later).
 */
export function WithdrawForm({
  versionId,
  number,
  inputs,
  successors,
}: {
  versionId: string;
  number: number;
  inputs: Record<string, SuccessorInput>;
  successors: SuccessorOption[];
}) {
  const [state, withdraw, pending] = useActionState(withdrawVersionAction, null);
  const [reason, setReason] = useState("");
  const [choice, setChoice] = useState(NO_SUCCESSOR);
  const server = actionErrors(state, ["reason"]);
  const mappingProblem = state && !state.ok && Object.keys(state.error.fieldErrors ?? {}).some((k) => k !== "reason");
  return (
    <form
      noValidate
      className="max-w-2xl space-y-3"
      data-testid="withdraw-form"
      onSubmit={(event) => {
        event.preventDefault();
        startTransition(() => withdraw({ versionId, reason, ...successorPayload(inputs, successors, choice) }));
      }}
    >
      <p className="text-sm text-ink-700">
        A withdrawn version can no longer be run. It stays on record, with every run made with it; each run&apos;s preparer and
        each job&apos;s responsible engineer is e-mailed, and the impact report lists them all.
      </p>
      <FormError message={mappingProblem ? null : server.form} />
      <TextField
        label="Why is it withdrawn?"
        name="reason"
        value={reason}
        onChange={(event) => setReason(event.target.value)}
        error={server.field.reason}
        data-testid="withdraw-reason"
      />
      <SuccessorFields
        number={number}
        inputs={inputs}
        successors={successors}
        choice={choice}
        onChange={setChoice}
        state={state}
      />
      <Button type="submit" variant="danger" pending={pending} pendingLabel="Withdrawing…" data-testid="withdraw-submit">
        Withdraw v{number}
      </Button>
    </form>
  );
}
