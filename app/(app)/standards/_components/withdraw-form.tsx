"use client";

import { startTransition, useActionState, useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { FormError } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import type { SuccessorInput, SuccessorOption } from "@/lib/use-cases/withdrawals";
import { withdrawVersionAction } from "../actions";

const DROP = "(drop)";

/**
 * Withdraws a version: it can no longer be run. Its record stays (nothing published is ever deleted), and every run
 * made with it remains traceable. Naming the version that replaces it, with how the old inputs map onto its inputs,
 * lets the impact report re-run every affected run on it. The server checks the mapping against both versions.
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
  const [successorId, setSuccessorId] = useState("");
  const [renames, setRenames] = useState<Record<string, string>>({});
  const [values, setValues] = useState<Record<string, string>>({});
  const successor = successors.find((s) => s.id === successorId) ?? null;

  // Old inputs the successor has no same-kind input of the same key for: each is renamed or dropped.
  const orphans = useMemo(
    () => (successor ? Object.keys(inputs).filter((key) => successor.inputs[key]?.quantity !== inputs[key].quantity) : []),
    [inputs, successor],
  );
  // The successor's inputs nothing old arrives at: each takes a value.
  const newcomers = useMemo(() => {
    if (!successor) return [];
    const arriving = new Set([
      ...Object.keys(inputs).filter((key) => !orphans.includes(key)),
      ...orphans.map((key) => renames[key]).filter((key) => key && key !== DROP),
    ]);
    return Object.keys(successor.inputs).filter((key) => !arriving.has(key));
  }, [inputs, orphans, renames, successor]);

  const fields = ["reason", "successorVersionId", ...Object.keys(state && !state.ok ? (state.error.fieldErrors ?? {}) : {})];
  const server = actionErrors(state, fields);
  const mappingProblems =
    state && !state.ok ? Object.entries(state.error.fieldErrors ?? {}).filter(([key]) => key.startsWith("mapping.")) : [];

  return (
    <form
      noValidate
      className="max-w-2xl space-y-3"
      data-testid="withdraw-form"
      onSubmit={(event) => {
        event.preventDefault();
        const mapping = successor
          ? {
              rename: Object.fromEntries(orphans.filter((k) => renames[k] && renames[k] !== DROP).map((k) => [k, renames[k]])),
              drop: orphans.filter((k) => renames[k] === DROP),
              values: Object.fromEntries(newcomers.map((k) => [k, values[k] ?? String(successor.inputs[k].default)])),
            }
          : undefined;
        startTransition(() => withdraw({ versionId, reason, successorVersionId: successorId, mapping }));
      }}
    >
      <p className="text-sm text-ink-700">
        A withdrawn version can no longer be run. It stays on record, with every run made with it; each run&apos;s preparer and
        each job&apos;s responsible engineer is e-mailed, and the impact report lists them all.
      </p>
      <FormError message={mappingProblems.length > 0 ? null : server.form} />
      <TextField
        label="Why is it withdrawn?"
        name="reason"
        value={reason}
        onChange={(event) => setReason(event.target.value)}
        error={server.field.reason}
        data-testid="withdraw-reason"
      />
      <SelectField
        label="The version that replaces it"
        value={successorId}
        onChange={(event) => setSuccessorId(event.target.value)}
        error={server.field.successorVersionId}
        hint="Affected runs can be re-run on it from the impact report."
        data-testid="withdraw-successor"
      >
        <option value="">None yet</option>
        {successors.map((s) => (
          <option key={s.id} value={s.id}>
            v{s.number} — {s.title}
          </option>
        ))}
      </SelectField>
      {successor ? (
        <fieldset className="space-y-3 rounded-plate p-3 ring-1 ring-ink-200" data-testid="withdraw-mapping">
          <legend className="px-1 text-sm font-medium text-ink-700">
            How v{number}&apos;s inputs map onto v{successor.number}
          </legend>
          {orphans.length === 0 && newcomers.length === 0 ? (
            <p className="text-sm text-ink-700">Every input carries over as it is.</p>
          ) : null}
          {orphans.map((key) => (
            <SelectField
              key={key}
              label={`${inputs[key].label} (${key}) becomes`}
              value={renames[key] ?? ""}
              onChange={(event) => setRenames({ ...renames, [key]: event.target.value })}
              error={server.field[`mapping.rename.${key}`]}
              data-testid={`mapping-rename-${key}`}
            >
              <option value="">Choose…</option>
              {Object.entries(successor.inputs)
                .filter(([, input]) => input.quantity === inputs[key].quantity)
                .map(([target, input]) => (
                  <option key={target} value={target}>
                    {input.label} ({target})
                  </option>
                ))}
              <option value={DROP}>Nothing: drop it</option>
            </SelectField>
          ))}
          {newcomers.map((key) => (
            <TextField
              key={key}
              label={`New input ${successor.inputs[key].label} (${key}): value for old runs`}
              value={values[key] ?? String(successor.inputs[key].default)}
              onChange={(event) => setValues({ ...values, [key]: event.target.value })}
              error={server.field[`mapping.values.${key}`]}
              data-testid={`mapping-value-${key}`}
            />
          ))}
          {mappingProblems.length > 0 ? <FormError message={state && !state.ok ? state.error.message : null} /> : null}
        </fieldset>
      ) : null}
      <Button type="submit" variant="danger" pending={pending} pendingLabel="Withdrawing…" data-testid="withdraw-submit">
        Withdraw v{number}
      </Button>
    </form>
  );
}
