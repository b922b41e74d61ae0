"use client";
// The author's editor of a library draft: the title, the entries (sections from the builder or the firm's
// catalogue; materials and combination sets as forms, or as checked JSON), each entry's problems beside it as it changes,
// Save (always possible, problems and all), Discard, and Submit with a changelog line once the saved document
// passes the check.
import { useActionState, useState } from "react";
import { LIBRARY_KIND_NAMES, normaliseKey, type LibraryKind } from "@/lib/libraries";
import { Button } from "@/components/ui/button";
import { TextAreaField, TextField } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { DraftSaveBar } from "@/components/drafts/draft-save-bar";
import { SubmitForReview } from "@/components/drafts/submit-for-review";
import { discardLibraryDraftAction, saveLibraryDraftAction, submitLibraryDraftAction } from "../../../actions";
import { CatalogueImport } from "./catalogue-import";
import { entryLabel, problemsOf, readDraftDocument, type DraftDocument, type DraftSection } from "./draft-document";
import { entryOfText, JsonEntries, newEntry, textOfEntry } from "./json-entries";
import { AddSection, SectionEntries } from "./section-entries";

export function LibraryDraftEditor({
  draftId,
  kind,
  stored,
  comments,
}: {
  draftId: string;
  kind: LibraryKind;
  /** The saved document, as stored. */
  stored: unknown;
  /** The last return's comments on entries, by the entry's normalised key. */
  comments: Record<string, string[]>;
}) {
  const initial = readDraftDocument(stored, kind);
  const [title, setTitle] = useState(initial.title);
  const [description, setDescription] = useState(initial.description ?? "");
  const [sections, setSections] = useState<unknown[]>(kind === "sections" ? initial.entries : []);
  const [texts, setTexts] = useState<string[]>(kind === "sections" ? [] : initial.entries.map(textOfEntry));
  const [saveState, save, saving] = useActionState(saveLibraryDraftAction, null);
  const [submitState, submit, submitting] = useActionState(submitLibraryDraftAction, null);
  const [discardState, discard, discarding] = useActionState(discardLibraryDraftAction, null);

  const document: DraftDocument = {
    kind,
    title,
    ...(description.trim() !== "" ? { description } : {}),
    entries: kind === "sections" ? sections : texts.map(entryOfText),
  };
  const text = JSON.stringify(document);
  const [saved, setSaved] = useState(() => JSON.stringify(readDraftDocument(stored, kind)));
  const dirty = text !== saved;
  const problems = problemsOf(JSON.parse(text) as DraftDocument);
  const problemCount = problems.general.length + [...problems.byEntry.values()].reduce((n, list) => n + list.length, 0);
  const keys = document.entries.map(entryLabel);
  const byKey = new Map(Object.entries(comments));
  const ready = !dirty && problemCount === 0 && document.entries.length > 0;
  const noun = LIBRARY_KIND_NAMES[kind].one;

  const addSections = (added: DraftSection[]) =>
    setSections((list) => {
      const replaced = new Set(added.map((section) => normaliseKey(section.key)));
      return [...list.filter((entry, i) => !replaced.has(normaliseKey(entryLabel(entry, i)))), ...added];
    });

  return (
    <section aria-labelledby="editor-heading" className="space-y-8" data-testid="library-draft-editor">
      <h2 id="editor-heading" className="sr-only">
        The draft
      </h2>
      <div className="grid gap-4 lg:grid-cols-2">
        <TextField label="Title" value={title} onChange={(event) => setTitle(event.target.value)} data-testid="draft-title" />
        <TextAreaField
          label="Description (optional)"
          rows={2}
          value={description}
          onChange={(event) => setDescription(event.target.value)}
          data-testid="draft-description"
        />
      </div>

      <div className="space-y-3">
        <h3 className="text-base font-semibold text-ink-900">
          {LIBRARY_KIND_NAMES[kind].many} in the draft ({document.entries.length})
        </h3>
        {kind === "sections" ? (
          <SectionEntries
            entries={sections}
            problems={problems}
            comments={byKey}
            onRemove={(index) => setSections((list) => list.filter((_, i) => i !== index))}
          />
        ) : (
          <>
            <p className="text-sm text-ink-700">
              Each value with the standard it comes from (title, edition, clause). The form takes strengths and moduli in MPa; as
              JSON, values are in SI units (Pa, kg/m³, 1/K).
            </p>
            <JsonEntries
              kind={kind}
              texts={texts}
              problems={problems}
              comments={byKey}
              onChange={(index, value) => setTexts((list) => list.map((t, i) => (i === index ? value : t)))}
              onRemove={(index) => setTexts((list) => list.filter((_, i) => i !== index))}
            />
            <Button
              type="button"
              variant="secondary"
              data-testid="draft-add-entry"
              onClick={() => setTexts((list) => [...list, textOfEntry(newEntry(kind, keys))])}
            >
              Add a {noun}
            </Button>
          </>
        )}
      </div>

      {kind === "sections" ? (
        <>
          <details className="rounded-plate bg-paper-raised p-4 ring-1 ring-ink-200" open={sections.length === 0}>
            <summary className="cursor-pointer font-semibold text-ink-900" data-testid="open-add-section">
              Add a section with the builder
            </summary>
            <div className="mt-4">
              <AddSection draftKeys={keys} onAdd={(section) => addSections([section])} />
            </div>
          </details>
          <details className="rounded-plate bg-paper-raised p-4 ring-1 ring-ink-200">
            <summary className="cursor-pointer font-semibold text-ink-900" data-testid="open-catalogue-import">
              Import the firm&apos;s catalogue (CSV)
            </summary>
            <div className="mt-4">
              <CatalogueImport draftKeys={keys} onImport={addSections} />
            </div>
          </details>
        </>
      ) : null}

      <div className="space-y-3 rounded-plate bg-paper-sunk p-4 ring-1 ring-ink-200">
        {problems.general.length > 0 ? (
          <Notice tone="fault" testId="draft-problems" title="Problems with the library as a whole">
            <ul className="list-disc pl-5">
              {problems.general.map((problem, i) => (
                <li key={i}>
                  {problem.path ? <span className="font-mono text-xs">{problem.path}</span> : null} {problem.message}
                </li>
              ))}
            </ul>
          </Notice>
        ) : null}
        <DraftSaveBar
          save={() => {
            save({ draftId, document: JSON.parse(text) });
            setSaved(text);
          }}
          saving={saving}
          saveState={saveState}
          dirty={dirty}
          note={
            problemCount > 0 ? (
              <span className="text-sm text-fault-700" data-testid="draft-problem-count">
                {problemCount} problem{problemCount === 1 ? "" : "s"} to fix before submitting
              </span>
            ) : null
          }
          discard={() => discard({ draftId })}
          discarding={discarding}
          discardState={discardState}
        />
        <SubmitForReview
          submit={(changelog) => submit({ draftId, changelog })}
          state={submitState}
          pending={submitting}
          blocked={
            ready
              ? null
              : dirty
                ? "Save your changes first: what is submitted is the saved draft."
                : document.entries.length === 0
                  ? `Add at least one ${noun} first.`
                  : "Fix the problems named above first."
          }
        />
      </div>
    </section>
  );
}
