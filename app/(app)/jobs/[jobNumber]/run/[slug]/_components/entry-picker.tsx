"use client";
// A library input's picker: search by name and filter by shape (or material family), then choose from the list.
import { useId, useMemo, useState } from "react";
import type { RunField } from "@/lib/use-cases/run-form";
import { SelectField, TextField } from "@/components/ui/field";

type EntryField = Extract<RunField, { kind: "entry" }>;

export function EntryPicker({
  field,
  label,
  error,
  value,
  onChange,
}: {
  field: EntryField;
  label: string;
  error?: string;
  value: string;
  onChange: (value: string) => void;
}) {
  const [search, setSearch] = useState("");
  const [type, setType] = useState("");
  const types = useMemo(() => [...new Set(field.options.map((o) => o.type))].sort(), [field.options]);
  const words = search.toLowerCase().split(/\s+/).filter(Boolean);
  const shown = field.options.filter(
    (o) =>
      ((type === "" || o.type === type) && words.every((word) => o.key.toLowerCase().includes(word))) ||
      o.key.toLowerCase() === value.toLowerCase(),
  );
  const id = useId();
  return (
    <fieldset className="rounded-plate p-3 ring-1 ring-ink-200" data-testid={`picker-${field.key}`}>
      <legend className="px-1 text-sm font-medium text-ink-700">{label}</legend>
      <div className="grid gap-2 sm:grid-cols-[minmax(0,1fr)_10rem]">
        <TextField
          label="Search"
          value={search}
          onChange={(event) => setSearch(event.target.value)}
          data-testid={`picker-search-${field.key}`}
        />
        {types.length > 1 ? (
          <SelectField
            label="Shape"
            value={type}
            onChange={(event) => setType(event.target.value)}
            data-testid={`picker-type-${field.key}`}
          >
            <option value="">All</option>
            {types.map((t) => (
              <option key={t} value={t}>
                {t}
              </option>
            ))}
          </SelectField>
        ) : null}
      </div>
      <SelectField
        id={id}
        className="mt-2"
        label={`${field.library}${field.libraryVersion ? ` v${field.libraryVersion}` : ""}: ${shown.length} of ${field.options.length}`}
        hint={field.help}
        error={error}
        value={field.options.find((o) => o.key.toLowerCase() === value.toLowerCase())?.key ?? value}
        onChange={(event) => onChange(event.target.value)}
        data-testid={`field-${field.key}`}
      >
        {shown.map((o) => (
          <option key={o.key} value={o.key}>
            {o.key} ({o.type})
          </option>
        ))}
      </SelectField>
    </fieldset>
  );
}
