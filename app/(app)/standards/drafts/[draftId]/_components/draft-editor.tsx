"use client";
// The author's editor: the source in CodeMirror with its problems at their lines, Save (always possible,
// problems and all), then Submit with a changelog line once the saved source passes the gate. The preview
// below the editor is rendered by the server from the saved source.
import dynamic from "next/dynamic";
import { startTransition, useActionState, useState } from "react";
import type { SourceProblem } from "@/lib/standards/source";
import type { VerificationResult } from "@/lib/standards/verify";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { discardDraftAction, saveDraftAction, submitDraftAction } from "../../../actions";

// CodeMirror stays out of the page's first load; the textarea-sized box holds its place.
const SourceEditor = dynamic(() => import("@/components/standards/source-editor").then((m) => m.SourceEditor), {
  ssr: false,
  loading: () => <div className="h-[28rem] rounded-plate bg-paper-sunk ring-1 ring-ink-200" aria-hidden />,
});

export function DraftEditor({
  draftId,
  source,
  problems,
  gate,
  verification,
  commentLines,
}: {
  draftId: string;
  source: string;
  problems: SourceProblem[];
  gate: string[];
  verification: VerificationResult[];
  commentLines: number[];
}) {
  const [text, setText] = useState(source);
  const [saved, setSaved] = useState(source);
  const [saveState, save, saving] = useActionState(saveDraftAction, null);
  const [submitState, submit, submitting] = useActionState(submitDraftAction, null);
  const [discardState, discard, discarding] = useActionState(discardDraftAction, null);
  const [changelog, setChangelog] = useState("");
  // The problems of the last save, else those of the source the page was loaded with.
  const shownProblems = saveState?.ok ? saveState.data.check.problems : problems;

  const dirty = text !== saved;
  const failing = verification.filter((result) => !result.pass);
  const submitErrors = actionErrors(submitState, ["changelog"]);
  const ready = !dirty && shownProblems.length === 0 && gate.length === 0 && failing.length === 0 && verification.length > 0;

  return (
    <section aria-labelledby="editor-heading" className="space-y-4" data-testid="draft-editor">
      <h2 id="editor-heading" className="sr-only">
        Source
      </h2>
      <SourceEditor
        value={text}
        onChange={setText}
        problems={dirty ? [] : shownProblems}
        highlightLines={commentLines}
        ariaLabel="The standard's source: definition and narrative"
      />
      <div className="flex flex-wrap items-center gap-3">
        <Button
          type="button"
          pending={saving}
          pendingLabel="Saving…"
          data-testid="draft-save"
          onClick={() =>
            startTransition(() => {
              save({ draftId, source: text });
              setSaved(text);
            })
          }
        >
          Save draft
        </Button>
        <span className="text-sm text-ink-500" data-testid="draft-save-state" aria-live="polite">
          {dirty ? "Unsaved changes" : saveState?.ok ? "Saved" : "No unsaved changes"}
        </span>
        <Button
          type="button"
          variant="danger"
          size="sm"
          pending={discarding}
          pendingLabel="Discarding…"
          onClick={() => {
            if (window.confirm("Discard this draft? It cannot be recovered.")) startTransition(() => discard({ draftId }));
          }}
        >
          Discard draft
        </Button>
      </div>
      {saveState && !saveState.ok ? <FormError message={saveState.error.message} /> : null}
      {discardState && !discardState.ok ? <FormError message={discardState.error.message} /> : null}
      {!dirty && shownProblems.length > 0 ? (
        <Notice
          tone="fault"
          testId="draft-problems"
          title={`${shownProblems.length} problem${shownProblems.length === 1 ? "" : "s"} to fix before submitting`}
        >
          <ul className="list-disc pl-5">
            {shownProblems.slice(0, 12).map((problem, index) => (
              <li key={index}>
                {problem.line ? `Line ${problem.line}${problem.column ? `:${problem.column}` : ""} · ` : ""}
                <span className="font-mono text-xs">{problem.path}</span> {problem.message}
              </li>
            ))}
          </ul>
        </Notice>
      ) : null}
      {!dirty && gate.length > 0 ? <FormError message={gate.join(" ")} /> : null}
      <form
        noValidate
        className="grid items-end gap-3 rounded-plate bg-paper-raised p-4 ring-1 ring-ink-200 sm:grid-cols-[minmax(0,1fr)_auto]"
        data-testid="submit-form"
        onSubmit={(event) => {
          event.preventDefault();
          startTransition(() => submit({ draftId, changelog }));
        }}
      >
        <TextField
          label="What changed (one line for the changelog)"
          value={changelog}
          onChange={(event) => setChangelog(event.target.value)}
          error={submitErrors.field.changelog}
          data-testid="draft-changelog"
        />
        <Button type="submit" pending={submitting} pendingLabel="Submitting…" disabled={!ready} data-testid="draft-submit">
          Submit for review
        </Button>
        {!ready ? (
          <p className="text-sm text-ink-500 sm:col-span-2">
            {dirty
              ? "Save your changes first: what is submitted is the saved source."
              : verification.length === 0
                ? "Submitting needs a source that compiles and at least one verification case."
                : failing.length > 0
                  ? `${failing.length} verification case${failing.length === 1 ? " fails" : "s fail"}; see the preview below.`
                  : "Fix the problems above first."}
          </p>
        ) : null}
        {submitErrors.form ? (
          <div className="sm:col-span-2">
            <FormError message={submitErrors.form} />
          </div>
        ) : null}
        {submitState?.ok ? (
          <div className="sm:col-span-2">
            <Notice tone="pass" testId="draft-submitted">
              Submitted for review.
            </Notice>
          </div>
        ) : null}
      </form>
    </section>
  );
}
