"use client";
// A load-combination set as a form: its name, reference and purpose; its load kinds (symbol, name, action, what
// several cases of the kind are); its combinations, each with a factor per load kind (blank: the kind takes no
// part) and the variable action it is led by; each problem beside its field as it is typed.
import { useFieldArray, useWatch } from "react-hook-form";
import {
  COMBINATION_PURPOSES,
  COMBINATION_SET_FORM,
  LOAD_ACTIONS,
  LOAD_CASE_RULES,
  type CombinationSetFormValues,
} from "@/lib/libraries";
import { Button } from "@/components/ui/button";
import { SelectField, TextAreaField, TextField } from "@/components/ui/field";
import { errorAt, useEntryForm } from "./use-entry-form";
import { PlainOptions } from "./plain-options";

export function CombinationSetForm({ entry, onChange }: { entry: unknown; onChange: (entry: unknown) => void }) {
  const {
    fieldOf,
    control,
    formState: { errors },
  } = useEntryForm<CombinationSetFormValues>(COMBINATION_SET_FORM, entry, onChange);
  const kinds = useFieldArray({ control, name: "loadKinds" });
  const combinations = useFieldArray({ control, name: "combinations" });
  const loadKinds = useWatch({ control, name: "loadKinds" }) ?? [];
  const kindIds = loadKinds.map((kind) => kind.id);
  const variable = loadKinds.filter((kind) => kind.action === "variable").map((kind) => kind.id);
  return (
    <div className="space-y-4" data-testid="combination-set-form">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Name" error={errorAt(errors, "key")} data-testid="set-key" {...fieldOf("key")} />
        <SelectField label="Purpose" error={errorAt(errors, "purpose")} data-testid="set-purpose" {...fieldOf("purpose")}>
          <PlainOptions values={COMBINATION_PURPOSES} />
        </SelectField>
      </div>
      <TextField
        label="Reference (standard and clause)"
        error={errorAt(errors, "reference")}
        data-testid="set-reference"
        {...fieldOf("reference")}
      />
      <fieldset className="space-y-2">
        <legend className="text-sm font-medium text-ink-700">Load kinds</legend>
        {errorAt(errors, "loadKinds") ? (
          <p role="alert" className="text-sm text-fault-700">
            {errorAt(errors, "loadKinds")}
          </p>
        ) : null}
        {kinds.fields.map((field, i) => (
          <div
            key={field.id}
            className="grid items-end gap-3 sm:grid-cols-[6rem_minmax(0,1fr)_9rem_9rem_auto]"
            data-testid="set-load-kind"
          >
            <TextField label="Symbol" error={errorAt(errors, `loadKinds.${i}.id`)} {...fieldOf(`loadKinds.${i}.id`)} />
            <TextField label="Name" error={errorAt(errors, `loadKinds.${i}.name`)} {...fieldOf(`loadKinds.${i}.name`)} />
            <SelectField label="Action" {...fieldOf(`loadKinds.${i}.action`)}>
              <PlainOptions values={LOAD_ACTIONS} />
            </SelectField>
            <SelectField label="Several cases" {...fieldOf(`loadKinds.${i}.cases`)}>
              <PlainOptions values={LOAD_CASE_RULES} />
            </SelectField>
            <Button type="button" variant="quiet" size="sm" onClick={() => kinds.remove(i)}>
              Remove {kindIds[i] || "load kind"}
            </Button>
          </div>
        ))}
        <Button
          type="button"
          variant="secondary"
          size="sm"
          onClick={() => kinds.append({ id: "", name: "", action: "variable", cases: "add" })}
        >
          Add a load kind
        </Button>
      </fieldset>
      <fieldset className="space-y-2">
        <legend className="text-sm font-medium text-ink-700">Combinations (a factor per load kind; blank: no part)</legend>
        {errorAt(errors, "combinations") ? (
          <p role="alert" className="text-sm text-fault-700">
            {errorAt(errors, "combinations")}
          </p>
        ) : null}
        {combinations.fields.map((field, i) => (
          <div key={field.id} className="space-y-2 rounded-plate p-3 ring-1 ring-ink-200" data-testid="set-combination">
            <div className="grid items-end gap-3 sm:grid-cols-[6rem_minmax(0,1fr)_8rem_auto]">
              <TextField label="Id" error={errorAt(errors, `combinations.${i}.id`)} {...fieldOf(`combinations.${i}.id`)} />
              <TextField
                label="As the standard writes it"
                error={errorAt(errors, `combinations.${i}.label`)}
                {...fieldOf(`combinations.${i}.label`)}
              />
              <SelectField
                label="Led by"
                error={errorAt(errors, `combinations.${i}.leading`)}
                {...fieldOf(`combinations.${i}.leading`)}
              >
                <option value="">—</option>
                <PlainOptions values={variable} />
              </SelectField>
              <Button type="button" variant="quiet" size="sm" onClick={() => combinations.remove(i)}>
                Remove combination {i + 1}
              </Button>
            </div>
            <div className="flex flex-wrap gap-3">
              {kindIds
                .filter((id) => id.trim() !== "")
                .map((id) => (
                  <TextField
                    key={id}
                    className="w-28"
                    label={`Factor on ${id}`}
                    inputMode="decimal"
                    error={errorAt(errors, `combinations.${i}.factors.${id}`)}
                    errorTestId={`set-factor-error-${i}-${id}`}
                    data-testid={`set-factor-${i}-${id}`}
                    {...fieldOf(`combinations.${i}.factors.${id}`)}
                  />
                ))}
            </div>
          </div>
        ))}
        <Button
          type="button"
          variant="secondary"
          size="sm"
          data-testid="set-add-combination"
          onClick={() => combinations.append({ id: "", label: "", leading: "", factors: {} })}
        >
          Add a combination
        </Button>
      </fieldset>
      <TextAreaField label="Note (optional)" rows={2} error={errorAt(errors, "note")} {...fieldOf("note")} />
    </div>
  );
}
