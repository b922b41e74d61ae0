"use client";
// What both entry forms share: react-hook-form on the entry's form values, checked with the form's schema (the
// library's own entry schema, after the values are turned into the entry) on every change — the whole entry, so a
// rule across fields (fu below fy) is named again when either changes — and the entry handed to the editor.
import { useEffect, useRef } from "react";
import { useForm, type DefaultValues, type FieldValues, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { EntryFormKind } from "@/lib/libraries";

export function useEntryForm<Values extends FieldValues>(
  { schema, valuesOf, entryOf }: EntryFormKind<Values>,
  entry: unknown,
  onChange: (entry: unknown) => void,
) {
  const form = useForm<Values>({
    resolver: zodResolver(schema as never) as unknown as Resolver<Values>,
    defaultValues: valuesOf(entry) as DefaultValues<Values>,
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
  return form;
}

/** A field's error message, from react-hook-form's nested errors, by its dotted name. */
export function errorAt(errors: unknown, name: string): string | undefined {
  let at: unknown = errors;
  for (const part of name.split(".")) {
    if (!at || typeof at !== "object") return undefined;
    at = (at as Record<string, unknown>)[part];
  }
  const message = (at as { message?: unknown } | undefined)?.message;
  return typeof message === "string" ? message : undefined;
}
