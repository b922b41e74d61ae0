"use client";
// A material entry as a form: its name and family, each value (strengths and moduli in MPa) with the standard it
// comes from, further values by symbol (SI units), and a note; each problem beside its field as it is typed.
import { useFieldArray } from "react-hook-form";
import {
  MATERIAL_FAMILIES,
  MATERIAL_FORM,
  MATERIAL_FORM_VALUES,
  MATERIAL_VALUE_UNITS,
  type MaterialFormValues,
} from "@/lib/libraries";
import { Button } from "@/components/ui/button";
import { SelectField, TextAreaField, TextField } from "@/components/ui/field";
import { errorAt, useEntryForm } from "./use-entry-form";
import { PlainOptions } from "./plain-options";

export function MaterialForm({ entry, onChange }: { entry: unknown; onChange: (entry: unknown) => void }) {
  const {
    fieldOf,
    control,
    formState: { errors },
  } = useEntryForm<MaterialFormValues>(MATERIAL_FORM, entry, onChange);
  const further = useFieldArray({ control, name: "values" });
  return (
    <div className="space-y-4" data-testid="material-form">
      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <TextField label="Name" error={errorAt(errors, "key")} data-testid="material-key" {...fieldOf("key")} />
        <SelectField label="Family" error={errorAt(errors, "family")} data-testid="material-family" {...fieldOf("family")}>
          <PlainOptions values={MATERIAL_FAMILIES} />
        </SelectField>
      </div>
      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-ink-700">
          Values, each with the standard it comes from (blank: not given)
        </legend>
        {MATERIAL_FORM_VALUES.map(({ name, label, unit }) => (
          <div
            key={name}
            className="grid gap-3 sm:grid-cols-[minmax(0,1fr)_minmax(0,2fr)]"
            data-testid="material-value"
            data-name={name}
          >
            <TextField
              label={unit ? `${label}, ${unit}` : label}
              inputMode="decimal"
              // A rule across values (fu below fy) is named on the value, too.
              error={errorAt(errors, `${name}.value`) ?? errorAt(errors, name)}
              errorTestId={`material-${name}-value-error`}
              data-testid={`material-${name}-value`}
              {...fieldOf(`${name}.value`)}
            />
            <TextField
              label={`Source of ${name}`}
              error={errorAt(errors, `${name}.source`)}
              errorTestId={`material-${name}-source-error`}
              data-testid={`material-${name}-source`}
              {...fieldOf(`${name}.source`)}
            />
          </div>
        ))}
      </fieldset>
      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-ink-700">Further values by symbol (f_ck, f_m_k…), in SI units</legend>
        {further.fields.map((field, i) => {
          // Problems are named on the row (values.2.value), where the field is: the form's schema puts them there.
          const symbol = field.symbol;
          const at = (part: string) => ({
            error: errorAt(errors, `values.${i}.${part}`),
            errorTestId: `material-value-${i}-${part}-error`,
            "data-testid": `material-value-${i}-${part}`,
          });
          return (
            <div
              key={field.id}
              className="grid items-start gap-3 sm:grid-cols-[8rem_minmax(0,1fr)_6rem_minmax(0,2fr)_auto]"
              data-testid="material-further-value"
            >
              <TextField label="Symbol" {...at("symbol")} {...fieldOf(`values.${i}.symbol`)} />
              <TextField label="Value" inputMode="decimal" {...at("value")} {...fieldOf(`values.${i}.value`)} />
              <SelectField label="Unit" {...at("unit")} {...fieldOf(`values.${i}.unit`)}>
                <PlainOptions values={MATERIAL_VALUE_UNITS} />
              </SelectField>
              <TextField label="Source" {...at("source")} {...fieldOf(`values.${i}.source`)} />
              <Button type="button" variant="quiet" size="sm" className="sm:mt-6" onClick={() => further.remove(i)}>
                Remove {symbol || "value"}
              </Button>
            </div>
          );
        })}
        <Button
          type="button"
          variant="secondary"
          size="sm"
          onClick={() => further.append({ symbol: "", value: "", unit: "Pa", source: "" })}
        >
          Add a further value
        </Button>
      </fieldset>
      <TextAreaField label="Note (optional)" rows={2} error={errorAt(errors, "note")} {...fieldOf("note")} />
    </div>
  );
}
