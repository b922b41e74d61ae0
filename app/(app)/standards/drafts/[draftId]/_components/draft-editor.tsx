"use client";
// The author's editor: the source in CodeMirror with its problems at their lines, Save (always possible,
// problems and all), then Submit with a changelog line once the saved source passes the gate. The preview
// below follows the typing: a moment after the text stops changing, the server checks it and renders its
// preview (previewSourceAction; nothing is stored), and the problems move to their lines in the editor. With
// no unsaved changes it shows the saved draft's preview, rendered with the page.
import dynamic from "next/dynamic";
import { useActionState, useEffect, useRef, useState, type ReactNode } from "react";
import type { SourceProblem } from "@/lib/standards/source";
import type { VerificationResult } from "@/lib/standards/verify";
import { FormError, Notice } from "@/components/ui/notice";
import { DraftSaveBar } from "@/components/drafts/draft-save-bar";
import { SubmitForReview } from "@/components/drafts/submit-for-review";
import { discardDraftAction, previewSourceAction, saveDraftAction, submitDraftAction } from "../../../actions";

/** How long the text must rest before it is checked and previewed. */
const PREVIEW_PAUSE_MS = 700;

type LivePreview =
  | { text: string; state: "checking" }
  | { text: string; state: "ready"; problems: SourceProblem[]; preview: ReactNode }
  | { text: string; state: "failed"; message: string };

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
  savedPreview,
}: {
  /** The saved draft's preview, rendered with the page. */
  savedPreview: ReactNode;
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
  // The problems of the last save, else those of the source the page was loaded with.
  const shownProblems = saveState?.ok ? saveState.data.check.problems : problems;

  const dirty = text !== saved;
  const live = useLivePreview(draftId, text, dirty);
  // While the text differs from the saved draft, its own problems once checked (none until then).
  const editorProblems = dirty ? (live?.text === text && live.state === "ready" ? live.problems : []) : shownProblems;
  const failing = verification.filter((result) => !result.pass);
  const ready = !dirty && shownProblems.length === 0 && gate.length === 0 && failing.length === 0 && verification.length > 0;

  return (
    <section aria-labelledby="editor-heading" className="space-y-4" data-testid="draft-editor">
      <h2 id="editor-heading" className="sr-only">
        Source
      </h2>
      <SourceEditor
        value={text}
        onChange={setText}
        problems={editorProblems}
        highlightLines={commentLines}
        ariaLabel="The standard's source: definition and narrative"
      />
      <DraftSaveBar
        save={() => {
          save({ draftId, source: text });
          setSaved(text);
        }}
        saving={saving}
        saveState={saveState}
        dirty={dirty}
        discard={() => discard({ draftId })}
        discarding={discarding}
        discardState={discardState}
      />
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
      <SubmitForReview
        className="rounded-plate bg-paper-raised p-4 ring-1 ring-ink-200"
        submit={(changelog) => submit({ draftId, changelog })}
        state={submitState}
        pending={submitting}
        blocked={
          ready
            ? null
            : dirty
              ? "Save your changes first: what is submitted is the saved source."
              : verification.length === 0
                ? "Submitting needs a source that compiles and at least one verification case."
                : failing.length > 0
                  ? `${failing.length} verification case${failing.length === 1 ? " fails" : "s fail"}; see the preview below.`
                  : "Fix the problems above first."
        }
      />
      {dirty && live ? (
        <section
          aria-labelledby="live-preview-heading"
          className="mt-10"
          data-testid="live-preview"
          aria-busy={live.text !== text || live.state === "checking"}
        >
          <h2 id="live-preview-heading" className="mb-3 text-lg font-semibold text-ink-900">
            Preview of the text in the editor (not saved), at the default inputs
          </h2>
          <p className="mb-3 text-sm text-ink-500" aria-live="polite" data-testid="live-preview-state">
            {live.text !== text || live.state === "checking"
              ? "Checking the latest changes…"
              : live.state === "failed"
                ? live.message
                : live.problems.length > 0
                  ? `${live.problems.length} problem${live.problems.length === 1 ? "" : "s"}, marked in the editor.`
                  : "Up to date with the editor."}
          </p>
          {live.state === "ready" ? live.preview : null}
        </section>
      ) : (
        savedPreview
      )}
    </section>
  );
}

/**
 * Checks and previews `text` on the server once it has rested for PREVIEW_PAUSE_MS; only the answer for the
 * latest request is kept, so a slow answer never replaces a newer one.
 */
function useLivePreview(draftId: string, text: string, dirty: boolean): LivePreview | null {
  const [live, setLive] = useState<LivePreview | null>(null);
  const latest = useRef(0);
  useEffect(() => {
    if (!dirty) return;
    const request = ++latest.current;
    const timer = window.setTimeout(() => {
      setLive((previous) => (previous?.state === "ready" ? previous : { text, state: "checking" }));
      previewSourceAction(null, { draftId, source: text })
        .then((answer) => {
          if (request !== latest.current) return;
          if (answer?.ok) setLive({ text, state: "ready", problems: answer.data.problems, preview: answer.data.preview });
          else setLive({ text, state: "failed", message: answer?.error.message ?? "The preview could not be made." });
        })
        .catch(() => {
          if (request === latest.current)
            setLive({ text, state: "failed", message: "The preview could not be made: the server did not answer." });
        });
    }, PREVIEW_PAUSE_MS);
    return () => window.clearTimeout(timer);
  }, [draftId, text, dirty]);
  return dirty ? live : null;
}
