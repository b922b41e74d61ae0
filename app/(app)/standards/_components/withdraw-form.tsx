"use client";

import { startTransition, useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { withdrawVersionAction } from "../actions";

/**
 * Withdraws a version: it can no longer be run. Its record stays (nothing published is ever deleted), and
 * every run made with it remains traceable.
 */
export function WithdrawForm({ versionId, number }: { versionId: string; number: number }) {
  const [state, withdraw, pending] = useActionState(withdrawVersionAction, null);
  const [reason, setReason] = useState("");
  const server = actionErrors(state, ["reason"]);
  if (state?.ok) return <Notice tone="pass">Version {number} is withdrawn.</Notice>;
  return (
    <form
      noValidate
      className="max-w-xl space-y-3"
      data-testid="withdraw-form"
      onSubmit={(event) => {
        event.preventDefault();
        startTransition(() => withdraw({ versionId, reason }));
      }}
    >
      <p className="text-sm text-ink-700">
        A withdrawn version can no longer be run. It stays on record, with every run made with it.
      </p>
      <FormError message={server.form} />
      <TextField
        label="Why is it withdrawn?"
        name="reason"
        value={reason}
        onChange={(event) => setReason(event.target.value)}
        error={server.field.reason}
        data-testid="withdraw-reason"
      />
      <Button type="submit" variant="danger" pending={pending} pendingLabel="Withdrawing…" data-testid="withdraw-submit">
        Withdraw v{number}
      </Button>
    </form>
  );
}
