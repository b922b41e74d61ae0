"use client";
// A materials or load-combination-set draft's entries, each as its JSON in a box of its own: the text is checked
// as it is typed (the library's own check, in the browser), and every problem is named under the entry it is in.
// Values are in SI units (Pa, kg/m³, 1/K), each with the standard it comes from.
import { Button } from "@/components/ui/button";
import { TextAreaField } from "@/components/ui/field";
import { normaliseKey, type LibraryKind } from "@/lib/libraries";
import { entryLabel, type EntryProblems } from "./draft-document";
import { EntryRemarks } from "./entry-remarks";

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
  texts,
  problems,
  comments,
  onChange,
  onRemove,
}: {
  texts: string[];
  problems: EntryProblems;
  comments: Map<string, string[]>;
  onChange: (index: number, text: string) => void;
  onRemove: (index: number) => void;
}) {
  if (texts.length === 0)
    return (
      <p className="rounded-plate border border-dashed border-ink-300 p-6 text-sm text-ink-500" data-testid="draft-no-entries">
        No entries yet: add one below.
      </p>
    );
  return (
    <ol className="space-y-4">
      {texts.map((text, index) => {
        const entry = entryOfText(text);
        const label = entryLabel(entry, index);
        const own = problems.byEntry.get(index) ?? [];
        const remarks = comments.get(normaliseKey(label)) ?? [];
        const notJson = typeof entry === "string";
        return (
          <li
            key={index}
            className="space-y-2 rounded-plate bg-paper-raised p-4 ring-1 ring-ink-200"
            data-testid="draft-entry"
            data-key={label}
          >
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h3 className="font-semibold text-ink-900">{label}</h3>
              <Button type="button" variant="quiet" size="sm" data-testid="draft-entry-remove" onClick={() => onRemove(index)}>
                Remove {label}
              </Button>
            </div>
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
            <div className="text-sm">
              {/* While the text is not JSON, the check's problems would only repeat that. */}
              <EntryRemarks problems={notJson ? [] : own} comments={remarks} />
            </div>
          </li>
        );
      })}
    </ol>
  );
}
