"use client";
// The run form, generated from a published version's inputs: one field per input with its unit, default, bounds and
// help, the value converted to the input's unit as it is typed, and errors beside the field (from the browser's
// check, then the server's). Beside it, the live preview from the evaluation bundle in a Web Worker. The form
// works before the worker has loaded, and without it: Run sends the inputs to the server, which checks and
// evaluates them again and stores the run.
import { startTransition, useActionState, useEffect, useMemo, useState } from "react";
import { useForm, useWatch, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
// zod's smaller build: the run page's first load stays small (the full build is ~90 kB gzip; lib/domain/zod.ts
// holds the full one for the other forms). jitless for the Content-Security-Policy, as lib/domain/zod.ts explains.
import * as z from "zod/mini";
import type { RunFormData, RunField } from "@/lib/use-cases/run-form";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { FormError } from "@/components/ui/notice";
import { formatConverted, readQuantityText } from "@/components/runs/quantity-text";
import { usePreview } from "@/components/runs/use-preview";
import { createRunAction } from "../../../../actions";
import { RunPreview } from "./run-preview";
import { EntryPicker } from "./entry-picker";

z.config({ jitless: true });

type Values = { inputs: Record<string, string>; unitSystem: "si" | "us" };

function fieldSchema(field: RunField) {
  const filled = z.string().check(z.trim(), z.minLength(1, `${field.label}: enter a value.`));
  if (field.kind === "choice")
    return filled.check(z.refine((v) => field.choices.includes(v), `${field.label}: choose one of ${field.choices.join(", ")}.`));
  if (field.kind === "entry")
    return filled.check(
      z.refine(
        (v) => field.options.some((o) => o.key.toLowerCase() === v.toLowerCase()),
        `${field.label}: choose an entry of ${field.library}.`,
      ),
    );
  return filled.check(
    z.superRefine((v, ctx) => {
      const read = readQuantityText(v, field.units, field.unit);
      if (!read.ok) ctx.addIssue({ code: "custom", message: `${field.label}: ${read.message}`, input: v });
    }),
  );
}

function ConvertedHint({ field, text }: { field: Extract<RunField, { kind: "number" }>; text: string }) {
  const read = readQuantityText(text ?? "", field.units, field.unit);
  const bounds = [field.min ? `at least ${field.min}` : null, field.max ? `at most ${field.max}` : null]
    .filter(Boolean)
    .join(", ");
  const parts: string[] = [];
  if (read.ok && field.unit && read.unit !== field.unit)
    parts.push(
      read.inOwnUnit === null ? `${read.unit}: checked when you run` : `= ${formatConverted(read.inOwnUnit)} ${field.unit}`,
    );
  if (bounds) parts.push(bounds);
  if (field.help) parts.push(field.help);
  return parts.length > 0 ? parts.join(" · ") : undefined;
}

export function RunForm({ data }: { data: RunFormData }) {
  const [state, run, pending] = useActionState(createRunAction, null);
  const schema = useMemo(
    () =>
      z.object({
        inputs: z.object(Object.fromEntries(data.fields.map((field) => [field.key, fieldSchema(field)]))),
        unitSystem: z.enum(["si", "us"]),
      }),
    [data.fields],
  );
  const {
    register,
    handleSubmit,
    control,
    setValue,
    formState: { errors },
  } = useForm<Values>({
    resolver: zodResolver(schema) as unknown as Resolver<Values>,
    mode: "onChange",
    defaultValues: {
      inputs: Object.fromEntries(data.fields.map((field) => [field.key, field.initial])),
      unitSystem: data.from?.unitSystem ?? "si",
    },
  });
  const inputs = useWatch({ control, name: "inputs" });
  const preview = usePreview(data.bundle.url, data.source, data.libraries);
  const { request } = preview;
  const [debounced, setDebounced] = useState(inputs);
  useEffect(() => {
    const timer = setTimeout(() => setDebounced(inputs), 150);
    return () => clearTimeout(timer);
  }, [inputs]);
  useEffect(() => request({ ...debounced }), [debounced, request]);

  const serverErrors = state && !state.ok ? (state.error.fieldErrors ?? {}) : {};
  const placed = data.fields.some((field) => serverErrors[`inputs.${field.key}`]);
  const formMessage = state && !state.ok && !placed ? state.error.message : null;

  return (
    <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <form
        noValidate
        className="space-y-4"
        data-testid="run-form"
        onSubmit={handleSubmit((values) =>
          startTransition(() =>
            run({
              jobId: data.job.id,
              versionId: data.version.id,
              inputs: values.inputs,
              unitSystem: values.unitSystem,
              ...(data.from ? { parentRunId: data.from.id } : {}),
            }),
          ),
        )}
      >
        <FormError message={formMessage} />
        {data.fields.map((field) => {
          const name = `inputs.${field.key}` as const;
          const error = errors.inputs?.[field.key]?.message ?? serverErrors[name]?.[0];
          const label = field.symbol ? `${field.label} (${field.symbol.replace(/\\/g, "")})` : field.label;
          if (field.kind === "choice")
            return (
              <SelectField
                key={field.key}
                label={label}
                hint={field.help}
                error={error}
                data-testid={`field-${field.key}`}
                {...register(name)}
              >
                {field.choices.map((choice) => (
                  <option key={choice} value={choice}>
                    {choice}
                  </option>
                ))}
              </SelectField>
            );
          if (field.kind === "entry")
            return (
              <EntryPicker
                key={field.key}
                field={field}
                label={label}
                error={error}
                value={inputs?.[field.key] ?? field.initial}
                onChange={(value) => setValue(name, value, { shouldValidate: true })}
              />
            );
          return (
            <TextField
              key={field.key}
              label={field.unitShown ? `${label}, ${field.unitShown}` : label}
              hint={ConvertedHint({ field, text: inputs?.[field.key] ?? "" })}
              error={error}
              autoComplete="off"
              spellCheck={false}
              data-testid={`field-${field.key}`}
              {...register(name)}
            />
          );
        })}
        <SelectField
          label="Units to show the results in"
          hint="Kept with the run. Values may be typed in any unit either way."
          data-testid="field-unit-system"
          {...register("unitSystem")}
        >
          <option value="si">SI (kN, m, MPa)</option>
          <option value="us">US customary (kip, ft, ksi)</option>
        </SelectField>
        <Button type="submit" pending={pending} pendingLabel="Running…" data-testid="run-submit">
          Run and store
        </Button>
        <p className="text-sm text-ink-500">
          A run is stored for good against version {data.version.number} and the engine that computes it.
        </p>
      </form>
      <RunPreview state={preview.state} bundleKb={Math.round(data.bundle.gzipBytes / 1024)} />
    </div>
  );
}
