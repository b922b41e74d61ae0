"use client";
// A materials or load-combination-set draft's entries, each in a box of its own: as a form (the default), each
// problem beside its field, or as its JSON; either is checked as it is typed (the library's own check, in the
// browser), and every problem the check finds is named under the entry too. The JSON's values are in SI units
// (Pa, kg/m³, 1/K), each with the standard it comes from; the form takes strengths and moduli in MPa.
import { useCallback, useState } from "react";
import { Button } from "@/components/ui/button";
import { TextAreaField } from "@/components/ui/field";
import { normaliseKey, type LibraryKind } from "@/lib/libraries";
import { entryLabel, type EntryProblems } from "./draft-document";
import { EntryRemarks } from "./entry-remarks";
import { MaterialForm } from "./material-form";
import { CombinationSetForm } from "./combination-set-form";

/** An entry's text as the document holds it: its JSON, or the text itself when it was not JSON. */
export const textOfEntry = (entry: unknown) => (typeof entry === "string" ? entry : JSON.stringify(entry, null, 2));

/** The entry a text gives, or the text itself (which the check names as not an entry) when it is not JSON. */
export function entryOfText(text: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}

/** What a new entry starts as: the shape of one, with the sources left for the engineer to name. */
export function newEntry(kind: Exclude<LibraryKind, "sections">, existing: string[]): unknown {
  const taken = new Set(existing.map(normaliseKey));
  const base = kind === "materials" ? "New material" : "New combination set";
  let key = base;
  for (let n = 2; taken.has(normaliseKey(key)); n++) key = `${base} ${n}`;
  if (kind === "materials")
    return {
      key,
      family: "steel",
      E: { value: 210e9, source: "" },
      G: { value: 81e9, source: "" },
      density: { value: 7850, source: "" },
      fy: { value: 355e6, source: "" },
      fu: { value: 470e6, source: "" },
    };
  return {
    key,
    reference: "",
    purpose: "strength",
    loadKinds: [
      { id: "D", name: "Dead", action: "permanent" },
      { id: "L", name: "Live", action: "variable" },
    ],
    combinations: [{ id: "1", label: "1.35D + 1.5L", factors: { D: 1.35, L: 1.5 }, leading: "L" }],
  };
}

export function JsonEntries({
  kind,
  texts,
  problems,
  comments,
  onChange,
  onRemove,
}: {
  kind: Exclude<LibraryKind, "sections">;
  texts: string[];
  problems: EntryProblems;
  comments: Map<string, string[]>;
  onChange: (index: number, text: string) => void;
  onRemove: (index: number) => void;
}) {
  // Forms keep their own values from when they were opened: after a removal, each is opened again on its entry.
  const [generation, setGeneration] = useState(0);
  if (texts.length === 0)
    return (
      <p className="rounded-plate border border-dashed border-ink-300 p-6 text-sm text-ink-500" data-testid="draft-no-entries">
        No entries yet: add one below.
      </p>
    );
  return (
    <ol className="space-y-4">
      {texts.map((text, index) => (
        <EntryEditor
          key={`${generation}:${index}`}
          kind={kind}
          index={index}
          text={text}
          problems={problems.byEntry.get(index) ?? []}
          comments={comments}
          onChange={onChange}
          onRemove={() => {
            setGeneration((g) => g + 1);
            onRemove(index);
          }}
        />
      ))}
    </ol>
  );
}

function EntryEditor({
  kind,
  index,
  text,
  problems,
  comments,
  onChange,
  onRemove,
}: {
  kind: Exclude<LibraryKind, "sections">;
  index: number;
  text: string;
  problems: EntryProblems["general"];
  comments: Map<string, string[]>;
  onChange: (index: number, text: string) => void;
  onRemove: () => void;
}) {
  const entry = entryOfText(text);
  const label = entryLabel(entry, index);
  const remarks = comments.get(normaliseKey(label)) ?? [];
  const notJson = typeof entry === "string";
  // A text that is not an entry's object is mended as JSON; the form opens again from what it then holds.
  const formable = entry !== null && typeof entry === "object" && !Array.isArray(entry);
  const [asJson, setAsJson] = useState(!formable);
  const fromForm = useCallback((next: unknown) => onChange(index, textOfEntry(next)), [index, onChange]);
  const Form = kind === "materials" ? MaterialForm : CombinationSetForm;
  return (
    <li className="space-y-3 rounded-plate bg-paper-raised p-4 ring-1 ring-ink-200" data-testid="draft-entry" data-key={label}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="font-semibold text-ink-900">{label}</h3>
        <div className="flex flex-wrap gap-2">
          <Button
            type="button"
            variant="quiet"
            size="sm"
            data-testid="draft-entry-mode"
            disabled={asJson && !formable}
            onClick={() => setAsJson((json) => !json)}
          >
            {asJson ? `Edit ${label} as a form` : `Edit ${label} as JSON`}
          </Button>
          <Button type="button" variant="quiet" size="sm" data-testid="draft-entry-remove" onClick={onRemove}>
            Remove {label}
          </Button>
        </div>
      </div>
      {asJson ? (
        <TextAreaField
          label={`${label} as JSON`}
          value={text}
          rows={Math.min(24, Math.max(6, text.split("\n").length))}
          spellCheck={false}
          monospace
          onChange={(event) => onChange(index, event.target.value)}
          error={notJson ? "This is not JSON yet: check the quotes, commas and braces." : undefined}
          data-testid="draft-entry-json"
        />
      ) : (
        <Form entry={entry} onChange={fromForm} />
      )}
      <div className="text-sm">
        {/* While the text is not JSON, the check's problems would only repeat that. */}
        <EntryRemarks problems={notJson ? [] : problems} comments={remarks} />
      </div>
    </li>
  );
}
