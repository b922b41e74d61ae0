"use client";
// What both entry forms share: react-hook-form on the entry's form values, checked with the form's schema (the
// library's own entry schema, after the values are turned into the entry) on every change — the whole entry, so a
// rule across fields (fu below fy) is named again when either changes — and the entry handed to the editor.
// `fieldOf` registers an input with its value as the input's own default too, so the page is drawn with the entry's
// values before it is hydrated (react-hook-form fills its inputs only then).
import { useEffect, useRef, useState } from "react";
import { useForm, type DefaultValues, type FieldValues, type Path, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { EntryFormKind } from "@/lib/libraries";

export function useEntryForm<Values extends FieldValues>(
  { schema, valuesOf, entryOf }: EntryFormKind<Values>,
  entry: unknown,
  onChange: (entry: unknown) => void,
) {
  const [opened] = useState(() => valuesOf(entry) as DefaultValues<Values>);
  const form = useForm<Values>({
    resolver: zodResolver(schema as never) as unknown as Resolver<Values>,
    defaultValues: opened,
  });
  const { subscribe, trigger } = form;
  const changed = useRef(onChange);
  useEffect(() => {
    changed.current = onChange;
  }, [onChange]);
  useEffect(() => {
    // What is wrong with the entry as it stands is shown from the start, beside each field.
    void trigger();
    return subscribe({
      formState: { values: true },
      callback: ({ values }) => {
        changed.current(entryOf(values as Values));
        void trigger();
      },
    });
  }, [subscribe, trigger, entryOf]);
  const fieldOf = (name: Path<Values>) => {
    // The form's value now, not as opened: a row of a list keeps its input when a row above it is removed.
    const value: unknown = form.getValues(name);
    return { ...form.register(name), ...(typeof value === "string" ? { defaultValue: value } : {}) };
  };
  return { ...form, fieldOf };
}

function valueAt(values: unknown, name: string): unknown {
  let at: unknown = values;
  for (const part of name.split(".")) at = at && typeof at === "object" ? (at as Record<string, unknown>)[part] : undefined;
  return at;
}

/** A field's error message, from react-hook-form's nested errors, by its dotted name. */
export function errorAt(errors: unknown, name: string): string | undefined {
  const message = (valueAt(errors, name) as { message?: unknown } | undefined)?.message;
  return typeof message === "string" ? message : undefined;
}
