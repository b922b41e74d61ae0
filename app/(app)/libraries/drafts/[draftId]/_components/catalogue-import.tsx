"use client";
// Importing the firm's catalogue into a sections draft: the CSV pasted or chosen as a file, a choice per column
// (what it holds and its unit, guessed from the header), and the import preview worked out in the browser as the
// mapping changes: every problem by row and every listed value more than 1 % from the builder's. Nothing is added
// to the draft while the file has a problem; then its sections are added (replacing any of the same designation),
// and the draft is saved with the rest.
import { useDeferredValue, useState } from "react";
import {
  catalogueSectionEntries,
  importCatalogue,
  normaliseKey,
  parseCsv,
  SECTION_SHAPES,
  type CatalogueImport,
  type SectionShape,
} from "@/lib/libraries";
import { ImportPreview } from "@/components/libraries/import-preview";
import { SHAPE_TITLES } from "@/components/libraries/format";
import { Button } from "@/components/ui/button";
import { SelectField, TextAreaField, TextField } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import {
  DIMENSION_KEYS,
  guessChoices,
  mappingOf,
  PROPERTY_KEYS,
  startingUnit,
  type ColumnChoice,
  type ColumnRole,
} from "./catalogue-mapping";
import type { DraftSection } from "./draft-document";

/** Most characters read from a chosen file; the import itself refuses a longer one in words. */
const MAX_FILE_CHARACTERS = 2_500_000;

export function CatalogueImport({
  draftKeys,
  onImport,
}: {
  /** The designations already in the draft. */
  draftKeys: string[];
  onImport: (sections: DraftSection[]) => void;
}) {
  const [text, setText] = useState("");
  const [fileName, setFileName] = useState("");
  const [choices, setChoices] = useState<ColumnChoice[]>([]);
  const [everyRow, setEveryRow] = useState<SectionShape>("i");
  const [imported, setImported] = useState<number | null>(null);
  const deferredText = useDeferredValue(text);

  // The React compiler keeps these from one render to the next while the text and the choices stay the same.
  const csv = parseCsv(deferredText);
  const headers = csv.ok && csv.records[0] ? csv.records[0].fields.map((field) => field.trim()) : [];
  // The choices follow the header: a new header is guessed afresh, the same one keeps what was chosen.
  const current = sameColumns(choices, headers) ? choices : guessChoices(headers);
  const mapping = mappingOf(current, everyRow);
  const result: CatalogueImport | null =
    deferredText.trim() !== "" && mapping.ok ? importCatalogue(deferredText, mapping.mapping) : null;
  const known = new Set(draftKeys.map(normaliseKey));
  const replacing = result?.rows.filter((row) => known.has(normaliseKey(row.designation))).length ?? 0;
  const source = fileName || "pasted catalogue";

  const choose = (index: number, change: Partial<ColumnChoice>) =>
    setChoices(current.map((choice, i) => (i === index ? { ...choice, ...change } : choice)));

  return (
    <div className="space-y-5" data-testid="catalogue-import">
      <div className="grid gap-4 lg:grid-cols-2">
        <TextAreaField
          label="Paste the catalogue (CSV: a header line, then a line per section)"
          rows={6}
          value={text}
          spellCheck={false}
          monospace
          onChange={(event) => {
            setText(event.target.value);
            setFileName("");
            setImported(null);
          }}
          data-testid="catalogue-text"
        />
        <div>
          <label className="mb-1 block text-sm font-medium text-ink-700" htmlFor="catalogue-file">
            Or choose the CSV file
          </label>
          <input
            id="catalogue-file"
            type="file"
            accept=".csv,text/csv,text/plain"
            className="block w-full text-sm text-ink-700 file:mr-3 file:rounded-plate file:border-0 file:bg-plate-50 file:px-3 file:py-2 file:text-plate-800"
            data-testid="catalogue-file"
            onChange={async (event) => {
              const file = event.target.files?.[0];
              if (!file) return;
              const read = await file.slice(0, MAX_FILE_CHARACTERS * 4).text();
              setText(read);
              setFileName(file.name.slice(0, 200));
              setImported(null);
            }}
          />
          <p className="mt-1 text-xs text-ink-500">Read in your browser; nothing is sent until you save the draft.</p>
        </div>
      </div>

      {headers.length > 0 ? (
        <fieldset className="space-y-3" data-testid="catalogue-mapping">
          <legend className="text-sm font-semibold text-ink-900">What each column holds, and its unit</legend>
          <div className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
            {current.map((choice, index) => (
              <div
                key={`${index}-${choice.column}`}
                className="grid grid-cols-[minmax(0,1fr)_6rem] gap-2 rounded-plate bg-paper-raised p-3 ring-1 ring-ink-200"
              >
                <SelectField
                  label={`Column “${choice.column || index + 1}”`}
                  value={choice.role}
                  data-testid="catalogue-column-role"
                  onChange={(event) => {
                    const role = event.target.value as ColumnRole;
                    choose(index, { role, unit: startingUnit(role) });
                  }}
                >
                  <option value="">not imported</option>
                  <option value="designation">designation</option>
                  <option value="shape">shape</option>
                  {DIMENSION_KEYS.map((key) => (
                    <option key={key} value={`dimension:${key}`}>
                      dimension {key}
                    </option>
                  ))}
                  {PROPERTY_KEYS.map((key) => (
                    <option key={key} value={`property:${key}`}>
                      listed {key}
                    </option>
                  ))}
                </SelectField>
                <TextField
                  label="Unit"
                  value={choice.unit}
                  disabled={!choice.role.startsWith("dimension:") && !choice.role.startsWith("property:")}
                  onChange={(event) => choose(index, { unit: event.target.value })}
                  data-testid="catalogue-column-unit"
                />
              </div>
            ))}
          </div>
          {current.some((choice) => choice.role === "shape") ? null : (
            <SelectField
              label="No column holds the shape: every row is"
              value={everyRow}
              onChange={(event) => setEveryRow(event.target.value as SectionShape)}
              className="max-w-xs"
            >
              {SECTION_SHAPES.map((shape) => (
                <option key={shape} value={shape}>
                  {SHAPE_TITLES[shape]}
                </option>
              ))}
            </SelectField>
          )}
        </fieldset>
      ) : null}

      {text.trim() !== "" && !mapping.ok ? <Notice tone="warn">{mapping.message}</Notice> : null}
      {result ? (
        <>
          <ImportPreview result={result} fileName={fileName || undefined} />
          <div className="flex flex-wrap items-center gap-3">
            <Button
              type="button"
              disabled={!result.ok || result.rows.length === 0}
              data-testid="catalogue-add"
              onClick={() => {
                onImport(catalogueSectionEntries(result.rows, source) as DraftSection[]);
                setImported(result.rows.length);
              }}
            >
              Add {result.rows.length} section{result.rows.length === 1 ? "" : "s"} to the draft
            </Button>
            <span className="text-sm text-ink-500">
              {!result.ok
                ? "Fix every problem in the file first."
                : replacing > 0
                  ? `${replacing} of them replace the draft's sections of the same designation.`
                  : "Save the draft afterwards to keep them."}
            </span>
          </div>
        </>
      ) : null}
      {imported !== null ? (
        <Notice tone="pass" testId="catalogue-imported">
          {imported} section{imported === 1 ? "" : "s"} added to the draft; save it to keep them.
        </Notice>
      ) : null}
    </div>
  );
}

function sameColumns(choices: ColumnChoice[], headers: string[]): boolean {
  return choices.length === headers.length && choices.every((choice, i) => choice.column === headers[i]);
}
