// What changed between two versions of a library document, entry by entry: entries are matched by their
// normalised key (case and spacing aside, as findEntry matches them), and a changed entry lists each value
// that differs, by its path ("dimensions.tf", "combinations[ULS-2].factors.L"), old and new.
import { normaliseKey, type LibraryDocument, type LibraryEntry } from "@/lib/libraries";

export interface ValueChange {
  /** Where in the entry: "dimensions.tf"; list items with an id are named by it ("loadKinds[W].name"). */
  path: string;
  /** undefined where the value is new or gone. */
  before: unknown;
  after: unknown;
}

export interface ChangedEntry {
  key: string;
  /** The key as the earlier version spelt it, when only its case or spacing changed. */
  formerKey?: string;
  before: LibraryEntry;
  after: LibraryEntry;
  changes: ValueChange[];
}

export interface LibraryChanges {
  kind: LibraryDocument["kind"];
  /** The title and description when they changed. */
  document: ValueChange[];
  added: LibraryEntry[];
  removed: LibraryEntry[];
  changed: ChangedEntry[];
  unchanged: number;
}

/** A section entry's builder properties follow from its dimensions; the diff shows the dimensions and the values runs use. */
const DERIVED = new Set(["computed"]);

/** Every leaf value of an entry by its path. */
function leaves(value: unknown, path: string, out: Map<string, unknown>): Map<string, unknown> {
  if (Array.isArray(value)) {
    const named = value.every((v) => v !== null && typeof v === "object" && typeof (v as { id?: unknown }).id === "string");
    value.forEach((item, i) => leaves(item, `${path}[${named ? (item as { id: string }).id : i}]`, out));
    if (value.length === 0) out.set(path, "(none)");
  } else if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      if (path === "" && DERIVED.has(k)) continue;
      if (path === "dimensions" && k === "shape") continue; // the entry's shape, said once

      leaves(v, path === "" ? k : `${path}.${k}`, out);
    }
  } else if (value !== undefined) out.set(path, value);
  return out;
}

function changesBetween(before: unknown, after: unknown): ValueChange[] {
  const a = leaves(before, "", new Map());
  const b = leaves(after, "", new Map());
  const paths = [...new Set([...a.keys(), ...b.keys()])];
  return paths.filter((p) => !Object.is(a.get(p), b.get(p))).map((path) => ({ path, before: a.get(path), after: b.get(path) }));
}

/** The changes from `before` (null for a library's first version) to `after`. */
export function diffLibraryDocuments(before: LibraryDocument | null, after: LibraryDocument): LibraryChanges {
  const earlier = new Map<string, LibraryEntry>((before?.entries ?? []).map((e) => [normaliseKey(e.key), e]));
  const later = new Map<string, LibraryEntry>(after.entries.map((e) => [normaliseKey(e.key), e]));
  const added = after.entries.filter((e) => !earlier.has(normaliseKey(e.key)));
  const removed = (before?.entries ?? []).filter((e) => !later.has(normaliseKey(e.key)));
  const changed: ChangedEntry[] = [];
  let unchanged = 0;
  for (const [normal, now] of later) {
    const then = earlier.get(normal);
    if (!then) continue;
    const changes = changesBetween(then, now).filter((c) => c.path !== "key");
    if (changes.length === 0 && then.key === now.key) unchanged += 1;
    else
      changed.push({ key: now.key, formerKey: then.key !== now.key ? then.key : undefined, before: then, after: now, changes });
  }
  const document = before
    ? changesBetween(
        { title: before.title, description: before.description },
        { title: after.title, description: after.description },
      )
    : [];
  return { kind: after.kind, document, added, removed, changed, unchanged };
}
