/**
 * The difference between two versions of a standard, for the review screen and the version history: a
 * structured part (metadata, inputs, derived values, model, extracts, checks, verification cases — what a
 * reviewer reads) and a line diff of the whole source with old and new line numbers (what review comments
 * attach to). The structured part compares the definitions as written, before validation, so a draft that
 * does not compile yet can still be compared; a source that does not parse gets the line diff only.
 */
import { diffArrays } from "diff";
import { diffSourceLines, type LineRow } from "./line-diff";
import { formatPath, parseSource, type ParsedSource, type SourceProblem } from "./source";

export { diffSourceLines, hunksOf, type LineHunk, type LineRow } from "./line-diff";

export type DiffSection =
  | "metadata"
  | "limitations"
  | "references"
  | "assumptions"
  | "inputs"
  | "derived"
  | "nodes"
  | "members"
  | "load_cases"
  | "combinations"
  | "envelopes"
  | "extracts"
  | "checks"
  | "verification"
  | "other";

/** One field of an entry: `old` absent when the field was added, `new` absent when it was removed. */
export interface FieldChange {
  /** The field's path inside its entry (`default`, `support.rz.if`, `loads[1].w`); "" when the entry is one value. */
  readonly field: string;
  readonly old?: string;
  readonly new?: string;
  readonly oldLine?: number;
  readonly newLine?: number;
}

/** An entry added, removed or changed: an input by its key, a model entry by its id, an assumption by its position. */
export interface EntryChange {
  readonly section: DiffSection;
  /** The input's or check's key, the model entry's id, the verification case's name, `#2` for a position, a metadata field's name. */
  readonly key: string;
  readonly kind: "added" | "removed" | "changed";
  /** Added: every field as written (`new` only). Removed: every field (`old` only). Changed: the fields that differ. */
  readonly fields: readonly FieldChange[];
  readonly oldLine?: number;
  readonly newLine?: number;
}

export type StructuredDiff =
  | { readonly comparable: true; readonly changes: readonly EntryChange[]; readonly narrativeChanged: boolean }
  | { readonly comparable: false; readonly problems: readonly { side: "old" | "new"; problem: SourceProblem }[] };

export interface StandardDiff {
  readonly identical: boolean;
  readonly structured: StructuredDiff;
  /** Every line of both sources, in order. */
  readonly lines: readonly LineRow[];
  readonly added: number;
  readonly removed: number;
}

type Path = readonly PropertyKey[];

/** Compare two sources of a standard. Line endings are normalised as parseSource does, so line numbers agree with problems. */
export function diffStandards(oldSource: string, newSource: string): StandardDiff {
  const lines = diffSourceLines(oldSource, newSource);
  const added = lines.filter((r) => r.kind === "added").length;
  const removed = lines.filter((r) => r.kind === "removed").length;
  return { identical: added + removed === 0, structured: diffDefinitions(oldSource, newSource), lines, added, removed };
}

// ---------------------------------------------------------------------------------------------------------
// The definition

const METADATA = ["title", "category", "tags", "summary", "scope"] as const;
const TEXT_LISTS = ["limitations", "references"] as const;
const MODEL_LISTS = ["nodes", "members", "load_cases", "combinations", "envelopes"] as const;
const KNOWN = new Set<string>([
  ...METADATA,
  ...TEXT_LISTS,
  "inputs",
  "derived",
  "extracts",
  "checks",
  "assumptions",
  "model",
  "verification",
]);

/**
 * Values the schema fills in when a field is left out: a changed entry that only writes out its default (or
 * drops it) has not changed. Added and removed entries are shown as written.
 */
const DEFAULTS: Partial<Record<DiffSection, Record<string, string>>> = {
  derived: { digits: "3" },
  extracts: { digits: "3" },
  checks: { relation: "<=", digits: "3" },
  members: { kind: "frame" },
};

interface Side {
  readonly data: Record<string, unknown>;
  readonly parsed: ParsedSource;
  readonly lines: readonly string[];
}

export function diffDefinitions(oldSource: string, newSource: string): StructuredDiff {
  const problems: { side: "old" | "new"; problem: SourceProblem }[] = [];
  const read = (source: string, side: "old" | "new"): Side | undefined => {
    const out = parseSource(source);
    if (!out.ok) {
      problems.push(...out.problems.map((problem) => ({ side, problem })));
      return undefined;
    }
    if (!isRecord(out.parsed.data)) {
      problems.push({
        side,
        problem: { path: "", line: 2, column: 1, message: "The definition is not a YAML mapping of fields" },
      });
      return undefined;
    }
    return { data: out.parsed.data, parsed: out.parsed, lines: source.replace(/\r\n?/g, "\n").split("\n") };
  };
  const before = read(oldSource, "old");
  const after = read(newSource, "new");
  if (!before || !after) return { comparable: false, problems };

  const changes: EntryChange[] = [];
  const ctx = { before, after, changes };
  for (const key of METADATA) compareEntry(ctx, "metadata", key, [key], [key]);
  for (const key of TEXT_LISTS) comparePositions(ctx, key, [key]);
  comparePositions(ctx, "assumptions", ["assumptions"]);
  compareRecord(ctx, "inputs", ["inputs"]);
  compareRecord(ctx, "derived", ["derived"]);
  const modelOld = before.data.model;
  const modelNew = after.data.model;
  if (isRecord(modelOld) && isRecord(modelNew)) {
    for (const list of MODEL_LISTS) compareKeyedList(ctx, list, ["model", list], (entry) => entry.id);
    for (const key of unionKeys(modelOld, modelNew).filter((k) => !(MODEL_LISTS as readonly string[]).includes(k)))
      compareEntry(ctx, "other", `model.${key}`, ["model", key], ["model", key]);
  } else compareEntry(ctx, "other", "model", ["model"], ["model"]);
  compareRecord(ctx, "extracts", ["extracts"]);
  compareRecord(ctx, "checks", ["checks"]);
  compareKeyedList(ctx, "verification", ["verification"], (entry) => entry.name);
  for (const key of unionKeys(before.data, after.data).filter((k) => !KNOWN.has(k)))
    compareEntry(ctx, "other", key, [key], [key]);

  return { comparable: true, changes, narrativeChanged: before.parsed.narrative !== after.parsed.narrative };
}

interface Context {
  readonly before: Side;
  readonly after: Side;
  readonly changes: EntryChange[];
}

interface Leaf {
  readonly value: string;
  readonly path: Path;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null && !Array.isArray(value);
}

function valueAt(data: unknown, path: Path): unknown {
  let node = data;
  for (const key of path) {
    if (Array.isArray(node) && typeof key === "number") node = node[key];
    else if (isRecord(node) && typeof key === "string") node = node[key];
    else return undefined;
  }
  return node;
}

function unionKeys(a: Record<string, unknown>, b: Record<string, unknown>): string[] {
  return [...new Set([...Object.keys(a), ...Object.keys(b)])];
}

function renderScalar(value: unknown): string {
  if (value === null) return "null";
  if (typeof value === "string") return value;
  if (Array.isArray(value)) return `[${value.map(renderScalar).join(", ")}]`;
  if (isRecord(value))
    return `{ ${Object.entries(value)
      .map(([k, v]) => `${k}: ${renderScalar(v)}`)
      .join(", ")} }`;
  return String(value);
}

/** The leaves of a value, keyed by their path inside it; a list of plain values stays one leaf (`[pinned, fixed]`). */
function leavesOf(value: unknown, path: Path = [], out = new Map<string, Leaf>()): Map<string, Leaf> {
  const plainList = Array.isArray(value) && value.every((v) => !isRecord(v) && !Array.isArray(v));
  if ((isRecord(value) && Object.keys(value).length > 0) || (Array.isArray(value) && !plainList && value.length > 0)) {
    const entries: [PropertyKey, unknown][] = Array.isArray(value)
      ? value.map((v, i) => [i, v])
      : Object.entries(value as object);
    for (const [key, child] of entries) leavesOf(child, [...path, key], out);
  } else if (value !== undefined) out.set(formatPath(path), { value: renderScalar(value), path });
  return out;
}

function lineOf(side: Side, path: Path): number | undefined {
  return side.parsed.positionOf(path)?.line;
}

/**
 * The line an entry is written on. positionOf gives where its value starts, which for a block mapping is the
 * line after its key; a reviewer looks for the key (`deflection_total:`), so step back to it when it is there.
 */
function entryLineOf(side: Side, path: Path): number | undefined {
  const line = lineOf(side, path);
  const key = path[path.length - 1];
  if (line === undefined || line < 2 || typeof key !== "string") return line;
  const escaped = key.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
  return new RegExp(`^\\s*(["']?)${escaped}\\1\\s*:\\s*(#.*)?$`).test(side.lines[line - 2] ?? "") ? line - 1 : line;
}

function withDefaults(section: DiffSection, value: unknown): unknown {
  const defaults = DEFAULTS[section];
  if (!defaults || !isRecord(value)) return value;
  return { ...defaults, ...value };
}

/** Compare the entry at `oldPath` in the old definition with the one at `newPath` in the new one. */
function compareEntry(ctx: Context, section: DiffSection, key: string, oldPath: Path | null, newPath: Path | null): void {
  const oldValue = oldPath ? valueAt(ctx.before.data, oldPath) : undefined;
  const newValue = newPath ? valueAt(ctx.after.data, newPath) : undefined;
  if (oldValue === undefined && newValue === undefined) return;
  const oldLine = oldPath && oldValue !== undefined ? entryLineOf(ctx.before, oldPath) : undefined;
  const newLine = newPath && newValue !== undefined ? entryLineOf(ctx.after, newPath) : undefined;
  const lines = { ...(oldLine ? { oldLine } : {}), ...(newLine ? { newLine } : {}) };
  if (oldValue === undefined || newValue === undefined) {
    const side = oldValue === undefined ? ctx.after : ctx.before;
    const path = (oldValue === undefined ? newPath : oldPath)!;
    const fields = [...leavesOf(oldValue ?? newValue).entries()].map(([field, leaf]): FieldChange => {
      const line = lineOf(side, [...path, ...leaf.path]);
      return oldValue === undefined
        ? { field, new: leaf.value, ...(line ? { newLine: line } : {}) }
        : { field, old: leaf.value, ...(line ? { oldLine: line } : {}) };
    });
    ctx.changes.push({ section, key, kind: oldValue === undefined ? "added" : "removed", fields, ...lines });
    return;
  }
  const before = leavesOf(withDefaults(section, oldValue));
  const after = leavesOf(withDefaults(section, newValue));
  const fields: FieldChange[] = [];
  for (const field of new Set([...before.keys(), ...after.keys()])) {
    const o = before.get(field);
    const n = after.get(field);
    if (o?.value === n?.value) continue;
    const ol = o && lineOf(ctx.before, [...oldPath!, ...o.path]);
    const nl = n && lineOf(ctx.after, [...newPath!, ...n.path]);
    fields.push({
      field,
      ...(o ? { old: o.value } : {}),
      ...(n ? { new: n.value } : {}),
      ...(ol ? { oldLine: ol } : {}),
      ...(nl ? { newLine: nl } : {}),
    });
  }
  if (fields.length > 0) ctx.changes.push({ section, key, kind: "changed", fields, ...lines });
}

/** Entries of a mapping by key: removed and changed in the old order, then the added ones in the new order. */
function compareRecord(ctx: Context, section: DiffSection, path: Path): void {
  const before = valueAt(ctx.before.data, path);
  const after = valueAt(ctx.after.data, path);
  if ((before !== undefined && !isRecord(before)) || (after !== undefined && !isRecord(after)))
    return compareEntry(ctx, "other", formatPath(path), path, path);
  const oldKeys = Object.keys(before ?? {});
  const newKeys = Object.keys(after ?? {});
  for (const key of oldKeys) compareEntry(ctx, section, key, [...path, key], newKeys.includes(key) ? [...path, key] : null);
  for (const key of newKeys) if (!oldKeys.includes(key)) compareEntry(ctx, section, key, null, [...path, key]);
}

/** Keys of a list's entries: their id (or name), `id #2` for a repeated one, `#3` (position) for one without. */
function keysOf(list: readonly unknown[], idOf: (entry: Record<string, unknown>) => unknown): string[] {
  const seen = new Map<string, number>();
  return list.map((entry, i) => {
    const id = isRecord(entry) ? idOf(entry) : undefined;
    if (typeof id !== "string" && typeof id !== "number") return `#${i + 1}`;
    const count = (seen.get(String(id)) ?? 0) + 1;
    seen.set(String(id), count);
    return count === 1 ? String(id) : `${String(id)} #${count}`;
  });
}

function compareKeyedList(
  ctx: Context,
  section: DiffSection,
  path: Path,
  idOf: (entry: Record<string, unknown>) => unknown,
): void {
  const before = valueAt(ctx.before.data, path);
  const after = valueAt(ctx.after.data, path);
  if ((before !== undefined && !Array.isArray(before)) || (after !== undefined && !Array.isArray(after)))
    return compareEntry(ctx, "other", formatPath(path), path, path);
  const oldKeys = keysOf((before as unknown[] | undefined) ?? [], idOf);
  const newKeys = keysOf((after as unknown[] | undefined) ?? [], idOf);
  oldKeys.forEach((key, i) => {
    const j = newKeys.indexOf(key);
    compareEntry(ctx, section, key, [...path, i], j >= 0 ? [...path, j] : null);
  });
  newKeys.forEach((key, j) => {
    if (!oldKeys.includes(key)) compareEntry(ctx, section, key, null, [...path, j]);
  });
}

function fingerprint(value: unknown): string {
  return JSON.stringify([...leavesOf(value).entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}

/**
 * A list without ids, by position: unchanged entries are matched first (so an entry inserted at the top does
 * not shift every other one into a change), then a run of removed entries pairs with the run of added entries
 * that replaces it.
 */
function comparePositions(ctx: Context, section: DiffSection, path: Path): void {
  const before = valueAt(ctx.before.data, path);
  const after = valueAt(ctx.after.data, path);
  if ((before !== undefined && !Array.isArray(before)) || (after !== undefined && !Array.isArray(after)))
    return compareEntry(ctx, "other", formatPath(path), path, path);
  const oldList = ((before as unknown[] | undefined) ?? []).map(fingerprint);
  const newList = ((after as unknown[] | undefined) ?? []).map(fingerprint);
  let i = 0;
  let j = 0;
  let removedRun: number[] = [];
  const flush = (addedRun: number[]) => {
    for (let k = 0; k < Math.max(removedRun.length, addedRun.length); k++) {
      const o = k < removedRun.length ? removedRun[k]! : undefined;
      const n = k < addedRun.length ? addedRun[k]! : undefined;
      const key = `#${(n ?? o)! + 1}`;
      compareEntry(ctx, section, key, o !== undefined ? [...path, o] : null, n !== undefined ? [...path, n] : null);
    }
    removedRun = [];
  };
  for (const part of diffArrays(oldList, newList)) {
    const indices = part.value.map((_, k) => (part.added ? j : i) + k);
    if (part.removed) {
      removedRun = indices;
      i += part.count;
    } else if (part.added) {
      flush(indices);
      j += part.count;
    } else {
      flush([]);
      i += part.count;
      j += part.count;
    }
  }
  flush([]);
}
