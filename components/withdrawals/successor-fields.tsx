"use client";
// The successor of a withdrawn version and how the old inputs map onto its inputs, for the withdraw form and for
// naming the successor later on the impact report: each old input the successor has no input of the same kind and
// key for is renamed to one of its inputs or dropped, and each of its inputs nothing arrives at takes a value
// (its default to start with). The server checks the mapping against both versions and names each problem.
import { useMemo } from "react";
import type { ActionState } from "@/lib/domain/action-state";
import type { SuccessorInput, SuccessorOption } from "@/lib/use-cases/withdrawals";
import { SelectField, TextField } from "@/components/ui/field";
import { FormError } from "@/components/ui/notice";

const DROP = "(drop)";

export type SuccessorChoice = { successorId: string; renames: Record<string, string>; values: Record<string, string> };
export const NO_SUCCESSOR: SuccessorChoice = { successorId: "", renames: {}, values: {} };

type Plan = { successor: SuccessorOption | null; orphans: string[]; newcomers: string[] };

function planOf(inputs: Record<string, SuccessorInput>, successors: SuccessorOption[], choice: SuccessorChoice): Plan {
  const successor = successors.find((s) => s.id === choice.successorId) ?? null;
  if (!successor) return { successor, orphans: [], newcomers: [] };
  const orphans = Object.keys(inputs).filter((key) => successor.inputs[key]?.quantity !== inputs[key].quantity);
  const arriving = new Set([
    ...Object.keys(inputs).filter((key) => !orphans.includes(key)),
    ...orphans.map((key) => choice.renames[key]).filter((key) => key && key !== DROP),
  ]);
  return { successor, orphans, newcomers: Object.keys(successor.inputs).filter((key) => !arriving.has(key)) };
}

/** What the form sends: the successor's id ("" for none) and the mapping, when a successor is chosen. */
export function successorPayload(inputs: Record<string, SuccessorInput>, successors: SuccessorOption[], choice: SuccessorChoice) {
  const { successor, orphans, newcomers } = planOf(inputs, successors, choice);
  if (!successor) return { successorVersionId: "", mapping: undefined };
  const { renames, values } = choice;
  return {
    successorVersionId: successor.id,
    mapping: {
      rename: Object.fromEntries(orphans.filter((k) => renames[k] && renames[k] !== DROP).map((k) => [k, renames[k]])),
      drop: orphans.filter((k) => renames[k] === DROP),
      values: Object.fromEntries(newcomers.map((k) => [k, values[k] ?? String(successor.inputs[k].default)])),
    },
  };
}

export function SuccessorFields<T>({
  number,
  inputs,
  successors,
  choice,
  onChange,
  state,
}: {
  /** The withdrawn version's number. */
  number: number;
  inputs: Record<string, SuccessorInput>;
  successors: SuccessorOption[];
  choice: SuccessorChoice;
  onChange: (choice: SuccessorChoice) => void;
  state: ActionState<T>;
}) {
  const { successor, orphans, newcomers } = useMemo(() => planOf(inputs, successors, choice), [inputs, successors, choice]);
  const problems = state && !state.ok ? (state.error.fieldErrors ?? {}) : {};
  const mappingProblem = Object.keys(problems).some((key) => key.startsWith("mapping."));
  return (
    <>
      <SelectField
        label="The version that replaces it"
        value={choice.successorId}
        onChange={(event) => onChange({ ...choice, successorId: event.target.value })}
        error={problems.successorVersionId?.[0]}
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
              value={choice.renames[key] ?? ""}
              onChange={(event) => onChange({ ...choice, renames: { ...choice.renames, [key]: event.target.value } })}
              error={problems[`mapping.rename.${key}`]?.[0]}
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
              value={choice.values[key] ?? String(successor.inputs[key].default)}
              onChange={(event) => onChange({ ...choice, values: { ...choice.values, [key]: event.target.value } })}
              error={problems[`mapping.values.${key}`]?.[0]}
              data-testid={`mapping-value-${key}`}
            />
          ))}
          {mappingProblem && state && !state.ok ? <FormError message={state.error.message} /> : null}
        </fieldset>
      ) : null}
    </>
  );
}
