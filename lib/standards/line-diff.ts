/**
 * The line diff of two sources of a standard: every line with its old and new line number (review comments
 * attach to lines), and hunks of changed lines with context. Line endings are normalised as parseSource
 * does, so the numbers agree with the problems compileStandard reports.
 */
import { diffArrays } from "diff";

export interface LineRow {
  readonly kind: "same" | "added" | "removed";
  /** 1-based line of the old source (absent for an added line). */
  readonly oldLine?: number;
  /** 1-based line of the new source (absent for a removed line). */
  readonly newLine?: number;
  readonly text: string;
  /** The file ends on this line without a line break (shown, since it differs from a file that has one). */
  readonly noNewlineAtEnd?: true;
}

/** A run of changed lines with the unchanged lines around them. */
export interface LineHunk {
  readonly oldStart: number;
  readonly oldCount: number;
  readonly newStart: number;
  readonly newCount: number;
  readonly rows: readonly LineRow[];
}

interface SourceLine {
  readonly text: string;
  readonly eol: boolean;
}

function splitLines(source: string): SourceLine[] {
  const text = source.replace(/\r\n?/g, "\n");
  if (text === "") return [];
  const parts = text.split("\n");
  const endsWithBreak = parts[parts.length - 1] === "";
  if (endsWithBreak) parts.pop();
  return parts.map((line, i) => ({ text: line, eol: endsWithBreak || i < parts.length - 1 }));
}

/** Every line of both sources with its old and new line number; a file past the time limit is shown as replaced whole. */
export function diffSourceLines(oldSource: string, newSource: string): LineRow[] {
  const before = splitLines(oldSource);
  const after = splitLines(newSource);
  const parts = diffArrays(before, after, { comparator: (a, b) => a.text === b.text && a.eol === b.eol, timeout: 5000 }) ?? [
    { value: before, count: before.length, added: false, removed: true },
    { value: after, count: after.length, added: true, removed: false },
  ];
  const rows: LineRow[] = [];
  let oldLine = 1;
  let newLine = 1;
  for (const part of parts) {
    for (const line of part.value) {
      const tail = line.eol ? {} : { noNewlineAtEnd: true as const };
      if (part.added) rows.push({ kind: "added", newLine: newLine++, text: line.text, ...tail });
      else if (part.removed) rows.push({ kind: "removed", oldLine: oldLine++, text: line.text, ...tail });
      else rows.push({ kind: "same", oldLine: oldLine++, newLine: newLine++, text: line.text, ...tail });
    }
  }
  return rows;
}

/** The changed lines with `context` unchanged lines either side; hunks closer than twice that merge. */
export function hunksOf(rows: readonly LineRow[], context = 3): LineHunk[] {
  const changed = rows.flatMap((row, i) => (row.kind === "same" ? [] : [i]));
  const ranges: [number, number][] = [];
  for (const i of changed) {
    const from = Math.max(0, i - context);
    const to = Math.min(rows.length - 1, i + context);
    const last = ranges[ranges.length - 1];
    if (last && from <= last[1] + 1) last[1] = Math.max(last[1], to);
    else ranges.push([from, to]);
  }
  return ranges.map(([from, to]) => {
    const slice = rows.slice(from, to + 1);
    const olds = slice.filter((r) => r.oldLine !== undefined);
    const news = slice.filter((r) => r.newLine !== undefined);
    // An empty side starts after the line before the hunk, as in a unified diff.
    const lineBefore = (pick: (r: LineRow) => number | undefined) => {
      for (let i = from - 1; i >= 0; i--) {
        const n = pick(rows[i]!);
        if (n !== undefined) return n;
      }
      return 0;
    };
    return {
      oldStart: olds[0]?.oldLine ?? lineBefore((r) => r.oldLine),
      oldCount: olds.length,
      newStart: news[0]?.newLine ?? lineBefore((r) => r.newLine),
      newCount: news.length,
      rows: slice,
    };
  });
}
