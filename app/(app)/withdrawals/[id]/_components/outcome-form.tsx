"use client";
// The signed outcome of one affected calc revision: no action needed (with why), re-run and re-checked (naming the
// checked revision), or drawings revised (their reference). Shown only to whoever may sign it; the server decides.
import { startTransition, useActionState, useState } from "react";
import { OUTCOME_IDS, OUTCOME_LABELS } from "@/lib/domain/schemas/withdrawals";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { recordOutcomeAction } from "../../actions";

type OutcomeId = (typeof OUTCOME_IDS)[number];

export function OutcomeForm({
  withdrawalId,
  revisionId,
  label,
  candidates,
}: {
  withdrawalId: string;
  revisionId: string;
  label: string;
  candidates: { id: string; letter: string }[];
}) {
  const [state, record, pending] = useActionState(recordOutcomeAction, null);
  const [outcome, setOutcome] = useState<OutcomeId>("no-action");
  const [reason, setReason] = useState("");
  const [newRevisionId, setNewRevisionId] = useState(candidates[0]?.id ?? "");
  const [reference, setReference] = useState("");
  const server = actionErrors(state, ["outcome", "reason", "newRevisionId", "reference"]);
  if (state?.ok) return <Notice tone="pass">Recorded for {label}.</Notice>;
  return (
    <form
      noValidate
      className="mt-2 grid gap-2 sm:grid-cols-[12rem_minmax(0,1fr)_auto] sm:items-end"
      data-testid="outcome-form"
      onSubmit={(event) => {
        event.preventDefault();
        startTransition(() => record({ withdrawalId, revisionId, outcome, reason, newRevisionId, reference }));
      }}
    >
      <SelectField
        label={`Outcome for ${label}`}
        value={outcome}
        onChange={(event) => setOutcome(event.target.value as OutcomeId)}
        error={server.field.outcome}
        data-testid="outcome-kind"
      >
        {OUTCOME_IDS.map((id) => (
          <option key={id} value={id}>
            {OUTCOME_LABELS[id]}
          </option>
        ))}
      </SelectField>
      {outcome === "no-action" ? (
        <TextField
          label="Why no action is needed"
          value={reason}
          onChange={(event) => setReason(event.target.value)}
          error={server.field.reason}
          data-testid="outcome-reason"
        />
      ) : outcome === "rerun-checked" ? (
        <SelectField
          label="The checked revision"
          value={newRevisionId}
          onChange={(event) => setNewRevisionId(event.target.value)}
          error={server.field.newRevisionId ?? (candidates.length === 0 ? "No checked revision of this calc yet." : undefined)}
          data-testid="outcome-revision"
        >
          {candidates.map((c) => (
            <option key={c.id} value={c.id}>
              rev {c.letter}
            </option>
          ))}
        </SelectField>
      ) : (
        <TextField
          label="Revised drawings (numbers and revision)"
          value={reference}
          onChange={(event) => setReference(event.target.value)}
          error={server.field.reference}
          data-testid="outcome-reference"
        />
      )}
      <Button type="submit" size="sm" pending={pending} pendingLabel="Recording…" data-testid="outcome-submit">
        Sign outcome
      </Button>
      <div className="sm:col-span-3">
        <FormError message={server.form} />
      </div>
    </form>
  );
}
