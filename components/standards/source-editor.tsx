"use client";
// The editor of a standard's source: CodeMirror 6 with the YAML definition between the `---` lines
// highlighted as YAML and the narrative below as Markdown (yamlFrontmatter: a Markdown document whose front
// matter is parsed by the YAML parser through parseMixed), line numbers, and the problems compileStandard
// reported shown as lint diagnostics at their line and column.
//
// The editor lives in a shadow root. CodeMirror styles itself at run time (style-mod): in a document it
// writes a <style> element, which the Content-Security-Policy (style-src 'self', no nonce) refuses; in a
// shadow root it uses a constructed stylesheet (adoptedStyleSheets), which CSP does not govern. So the
// editor is styled by its own theme below, not by Tailwind, and is labelled by attributes on its content
// (an id outside the shadow root cannot be referenced from inside it).
//
// Keyboard: Tab indents; Escape then Tab (within two seconds) moves focus out of the editor, CodeMirror's
// own way of not trapping it. Ctrl-Shift-M (Cmd on macOS) lists the problems; F8 goes to the next one.
import { useCodeMirror } from "@uiw/react-codemirror";
import { markdown } from "@codemirror/lang-markdown";
import { yamlFrontmatter } from "@codemirror/lang-yaml";
import { lintGutter, linter, setDiagnostics } from "@codemirror/lint";
import { RangeSetBuilder, StateEffect, StateField, type Extension } from "@codemirror/state";
import { Decoration, EditorView, keymap, lineNumbers, type DecorationSet } from "@codemirror/view";
import { useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import { diagnosticsOf, type EditorProblem } from "./editor-diagnostics";

export type { EditorProblem } from "./editor-diagnostics";

const KEYBOARD_HINT = "Tab indents. Press Escape, then Tab, to leave the editor. Ctrl-Shift-M lists the problems.";

/** The house palette (app/globals.css), which Tailwind cannot reach inside the shadow root. */
const houseTheme = EditorView.theme(
  {
    "&": {
      backgroundColor: "#ffffff",
      color: "#1c2430",
      fontSize: "0.8125rem",
      // Fits a phone: never wider than its box, never taller than most of the screen.
      minHeight: "12rem",
      maxHeight: "70vh",
      width: "100%",
    },
    // Inside the rounded, clipped box, so the ring is drawn inwards.
    "&.cm-focused": { outline: "2px solid #31868c", outlineOffset: "-2px" },
    ".cm-scroller": {
      fontFamily: 'ui-monospace, SFMono-Regular, Menlo, Consolas, "Liberation Mono", monospace',
      lineHeight: "1.55",
    },
    ".cm-content": { caretColor: "#141a23" },
    ".cm-gutters": { backgroundColor: "#eeece6", color: "#4d566a", borderRight: "1px solid #d5d9e0" },
    ".cm-activeLine": { backgroundColor: "#eef6f5" },
    ".cm-activeLineGutter": { backgroundColor: "#dcedeb", color: "#123c40" },
    "&.cm-focused .cm-selectionBackground, .cm-selectionBackground, ::selection": { backgroundColor: "#b9dcd9" },
    ".cm-lineNumbers .cm-gutterElement": { padding: "0 0.5rem 0 0.75rem" },
    ".cm-review-line": { backgroundColor: "#f6ead2", boxShadow: "inset 3px 0 0 #8a5a12" },
    ".cm-tooltip": { border: "1px solid #d5d9e0", backgroundColor: "#ffffff" },
    ".cm-diagnostic-error": { borderLeftColor: "#a3271f" },
    // The lint extension draws its underline and gutter dot as data: SVG images, which the policy's
    // img-src 'self' refuses (a securitypolicyviolation each); plain CSS draws the same marks.
    ".cm-lintRange-error": {
      backgroundImage: "none",
      textDecoration: "underline wavy #a3271f",
      textDecorationSkipInk: "none",
      textUnderlineOffset: "3px",
    },
    ".cm-lint-marker-error, .cm-lint-marker-warning, .cm-lint-marker-info": {
      content: "normal",
      width: "0.7em",
      height: "0.7em",
      margin: "0.15em",
      borderRadius: "50%",
      backgroundColor: "#a3271f",
    },
  },
  { dark: false },
);

/** The lines marked for review comments, replaced whole by an effect whenever the prop changes. */
const setReviewLines = StateEffect.define<readonly number[]>();
const reviewLines = StateField.define<DecorationSet>({
  create: () => Decoration.none,
  update(marks, tr) {
    for (const effect of tr.effects) {
      if (!effect.is(setReviewLines)) continue;
      const builder = new RangeSetBuilder<Decoration>();
      const lines = [...new Set(effect.value)].filter((n) => n >= 1 && n <= tr.state.doc.lines).sort((a, b) => a - b);
      for (const n of lines) builder.add(tr.state.doc.line(n).from, tr.state.doc.line(n).from, REVIEW_LINE);
      return builder.finish();
    }
    return marks.map(tr.changes);
  },
  provide: (field) => EditorView.decorations.from(field),
});
const REVIEW_LINE = Decoration.line({ class: "cm-review-line" });

export interface SourceEditorProps {
  value: string;
  onChange?: (value: string) => void;
  /** Problems from compileStandard; each is shown at its line and column. */
  problems?: readonly EditorProblem[];
  readOnly?: boolean;
  /** The editor's accessible name, e.g. "Source of Simply supported steel beam, draft 3". */
  ariaLabel: string;
  /** Lines to mark (1-based), e.g. those with review comments. */
  highlightLines?: readonly number[];
  /** Called with a line number when its number in the gutter is clicked, or on Alt-Enter at the cursor's line. */
  onLineClick?: (line: number) => void;
  /** Wrap long lines (the default) so a phone never scrolls sideways; off, the editor scrolls inside its box. */
  wrapLines?: boolean;
  testId?: string;
}

export function SourceEditor({
  value,
  onChange,
  problems = NO_PROBLEMS,
  readOnly = false,
  ariaLabel,
  highlightLines = NO_LINES,
  onLineClick,
  wrapLines = true,
  testId = "source-editor",
}: SourceEditorProps) {
  const hostRef = useRef<HTMLDivElement>(null);
  const [shadow, setShadow] = useState<{ root: ShadowRoot; container: HTMLDivElement }>();

  // Props read by CodeMirror's callbacks, kept in refs so that a new callback each render does not
  // reconfigure the editor (the hook reconfigures whenever its extensions or onChange change).
  const onChangeRef = useRef(onChange);
  const onLineClickRef = useRef(onLineClick);
  useEffect(() => {
    onChangeRef.current = onChange;
    onLineClickRef.current = onLineClick;
  });
  const [handleChange] = useState(() => (next: string) => onChangeRef.current?.(next));
  const [handleLineClick] = useState(() => (line: number) => onLineClickRef.current?.(line));
  const clickable = onLineClick !== undefined;

  useLayoutEffect(() => {
    const host = hostRef.current;
    if (!host) return;
    const root = host.shadowRoot ?? host.attachShadow({ mode: "open" });
    const container = host.ownerDocument.createElement("div");
    root.append(container);
    setShadow({ root, container });
    return () => container.remove();
  }, []);

  const extensions = useMemo((): Extension[] => {
    const lineClick = (view: EditorView, pos: number) => {
      handleLineClick(view.state.doc.lineAt(pos).number);
      return true;
    };
    return [
      yamlFrontmatter({ content: markdown() }),
      lineNumbers(clickable ? { domEventHandlers: { click: (view, line) => lineClick(view, line.from) } } : {}),
      // No lint source of its own (problems come from the props), but the lint state is part of the
      // configuration, so a reconfiguration (a new label, read-only) keeps the diagnostics.
      linter(null),
      lintGutter(),
      reviewLines,
      houseTheme,
      ...(wrapLines ? [EditorView.lineWrapping] : []),
      ...(clickable ? [keymap.of([{ key: "Alt-Enter", run: (view) => lineClick(view, view.state.selection.main.head) }])] : []),
      EditorView.contentAttributes.of({
        // Focusable even when read-only (a reviewer reads and comments with the keyboard), and so the
        // scrolling box around it has something to focus (axe: scrollable-region-focusable).
        tabindex: "0",
        "aria-label": ariaLabel,
        "aria-description": KEYBOARD_HINT,
        ...(readOnly ? { "aria-readonly": "true" } : {}),
      }),
    ];
  }, [ariaLabel, readOnly, wrapLines, clickable, handleLineClick]);

  const { view } = useCodeMirror({
    container: shadow?.container,
    root: shadow?.root,
    value,
    onChange: handleChange,
    readOnly,
    extensions,
    theme: "none",
    basicSetup: BASIC_SETUP,
  });

  // Problems are replaced whole when they change; between compiles CodeMirror maps them through edits.
  useEffect(() => {
    if (view) view.dispatch(setDiagnostics(view.state, diagnosticsOf(view.state.doc, problems)));
  }, [view, problems]);
  useEffect(() => {
    if (view) view.dispatch({ effects: setReviewLines.of(highlightLines) });
  }, [view, highlightLines]);

  return (
    <div className="min-w-0" data-testid={testId}>
      <div
        ref={hostRef}
        className="block w-full min-w-0 overflow-hidden rounded-plate shadow-sheet ring-1 ring-ink-200"
        data-testid={`${testId}-host`}
      />
      <p className="mt-1.5 text-xs text-ink-500">
        {KEYBOARD_HINT}
        {clickable ? " Alt-Enter, or a click on a line number, comments on that line." : ""}
      </p>
    </div>
  );
}

/** lineNumbers is ours (for the click handler); no completion or folding to learn; the rest as it comes. */
const BASIC_SETUP = { lineNumbers: false, autocompletion: false, foldGutter: false } as const;
const NO_PROBLEMS: readonly EditorProblem[] = [];
const NO_LINES: readonly number[] = [];
