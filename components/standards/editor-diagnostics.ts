// Problems of a standard's source (a path, a message, a line and column from compileStandard) as the
// editor's lint diagnostics: a range of the document to underline. Pure, so it is tested without a browser.
import type { Diagnostic } from "@codemirror/lint";
import type { Text } from "@codemirror/state";

/** A problem as compileStandard reports it (SourceProblem); line and column are 1-based. */
export interface EditorProblem {
  readonly path: string;
  readonly message: string;
  readonly line?: number;
  readonly column?: number;
}

/**
 * Where a problem points is the start of a value (`default: 6 x` → `6 x`); underline that value up to the
 * end of its flow item (`,` `}` `]`), a comment or the line, so a problem in a one-line mapping marks its own
 * value and not the rest of the line. A quoted value runs to its closing quote.
 */
function valueEnd(text: string, start: number): number {
  const quote = text[start];
  if (quote === '"' || quote === "'") {
    const close = text.indexOf(quote, start + 1);
    if (close > start) return close + 1;
  }
  let end = start;
  while (end < text.length && !",}]".includes(text[end]!) && !(text[end] === "#" && /\s/.test(text[end - 1] ?? " "))) end++;
  while (end > start && /\s/.test(text[end - 1]!)) end--;
  return end;
}

/**
 * One diagnostic per problem. A problem without a line (the file as a whole) marks line 1; a line past the end
 * of the document (it was shortened since the problems were found) marks the last line; a column past the end
 * of its line marks the line's end. Sorted by position, as the lint state keeps them.
 */
export function diagnosticsOf(doc: Text, problems: readonly EditorProblem[]): Diagnostic[] {
  return problems
    .map((problem): Diagnostic => {
      const line = doc.line(Math.min(Math.max(problem.line ?? 1, 1), doc.lines));
      const indent = line.text.length - line.text.trimStart().length;
      const column = problem.column !== undefined ? Math.min(Math.max(problem.column - 1, 0), line.length) : indent;
      let end = valueEnd(line.text, column);
      // Pointing at a separator or past the value: underline the line's text instead of nothing.
      if (end <= column && line.text.trim() !== "")
        return { ...base(problem), from: line.from + indent, to: line.from + line.text.trimEnd().length };
      if (end < column) end = column;
      return { ...base(problem), from: line.from + column, to: line.from + end };
    })
    .sort((a, b) => a.from - b.from || a.to - b.to);
}

function base(problem: EditorProblem): Pick<Diagnostic, "severity" | "message" | "source"> {
  return { severity: "error", message: problem.message, ...(problem.path ? { source: problem.path } : {}) };
}
