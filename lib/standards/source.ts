/**
 * A standard's source file: the definition in YAML between two `---` lines, then the narrative in MDX.
 * Reading it keeps where each value was written, so every later refusal can name its line and column.
 */
import { isMap, isSeq, LineCounter, parseDocument, type Document, type Node as YamlNode } from "yaml";

export const MAX_SOURCE_LENGTH = 200_000;

export interface Position {
  readonly line: number;
  readonly column: number;
}

/** A refusal with where it is: a path in the definition (`inputs.L.default`) and a line and column of the file. */
export interface SourceProblem {
  readonly path: string;
  readonly message: string;
  readonly line?: number;
  readonly column?: number;
}

export interface ParsedSource {
  /** The definition as plain data, before validation. */
  readonly data: unknown;
  readonly narrative: string;
  /** Line of the file where the narrative starts (1-based). */
  readonly narrativeLine: number;
  /** Where a path of the definition was written (the nearest written ancestor when it was not). */
  positionOf(path: ReadonlyArray<PropertyKey>): Position | undefined;
}

export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let out = "";
  for (const part of path) out += typeof part === "number" ? `[${part}]` : out === "" ? String(part) : `.${String(part)}`;
  return out;
}

/** Split and parse a source file; problems of the file's shape or of its YAML come back with their positions. */
export function parseSource(source: string): { ok: true; parsed: ParsedSource } | { ok: false; problems: SourceProblem[] } {
  if (source.length > MAX_SOURCE_LENGTH)
    return { ok: false, problems: [{ path: "", message: `The file is longer than ${MAX_SOURCE_LENGTH} characters` }] };
  const text = source.replace(/\r\n?/g, "\n");
  const lines = text.split("\n");
  if (lines[0]?.trim() !== "---")
    return {
      ok: false,
      problems: [{ path: "", line: 1, column: 1, message: "The file must start with a line `---`, then the definition in YAML" }],
    };
  const close = lines.findIndex((line, i) => i > 0 && line.trim() === "---");
  if (close < 0)
    return {
      ok: false,
      problems: [
        {
          path: "",
          line: 1,
          column: 1,
          message: "The definition is not closed: add a line `---` after it, before the narrative",
        },
      ],
    };
  const yamlText = lines.slice(1, close).join("\n");
  const lineCounter = new LineCounter();
  const doc = parseDocument(yamlText, { lineCounter, prettyErrors: false, uniqueKeys: true });
  const at = (offset: number): Position => {
    const p = lineCounter.linePos(offset);
    return { line: p.line + 1, column: p.col };
  };
  if (doc.errors.length > 0) {
    return {
      ok: false,
      problems: doc.errors.map((e) => {
        const p = at(e.pos[0]);
        return { path: "", line: p.line, column: p.column, message: `YAML: ${e.message.split("\n")[0]}` };
      }),
    };
  }
  const data = doc.toJS({ maxAliasCount: 0 }) as unknown;
  return {
    ok: true,
    parsed: {
      data,
      narrative: lines.slice(close + 1).join("\n"),
      narrativeLine: close + 2,
      positionOf: (path) => nodePosition(doc, path, at),
    },
  };
}

function nodePosition(doc: Document, path: ReadonlyArray<PropertyKey>, at: (offset: number) => Position): Position | undefined {
  let node: unknown = doc.contents;
  let found: YamlNode | undefined = (node as YamlNode) ?? undefined;
  for (const key of path) {
    if (isMap(node)) {
      const pair = node.items.find((p) => (p.key as { value?: unknown } | null)?.value === key);
      if (!pair) break;
      found = (pair.key as YamlNode) ?? found;
      node = pair.value;
      if (node && (node as YamlNode).range) found = node as YamlNode;
    } else if (isSeq(node) && typeof key === "number") {
      const item = node.items[key];
      if (!item) break;
      node = item;
      if ((item as YamlNode).range) found = item as YamlNode;
    } else break;
  }
  return found?.range ? at(found.range[0]) : undefined;
}
