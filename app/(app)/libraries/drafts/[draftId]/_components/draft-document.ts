// A library draft's document as the editor holds it: the title and description, and the entries as written
// (a section's dimensions without the builder's properties; a material or set as its JSON). The check is the
// library's own (checkLibraryDocument), run in the browser as the draft changes; its problems are put beside the
// entry they are in.
import { checkLibraryDocument, type LibraryKind, type LibraryProblem, type SectionShape } from "@/lib/libraries";

/** A section as a draft keeps it: what a person gives, the builder computes the rest when it is checked. */
export type DraftSection = {
  key: string;
  origin: { from: "builder" } | { from: "catalogue"; file: string; row: number };
  shape: SectionShape;
  /** The section builder's rules its properties follow; left out, rules 1. */
  rules?: number;
  /** Metres. */
  dimensions: Record<string, number>;
  listed?: Record<string, number>;
  note?: string;
};

export type DraftDocument = { kind: LibraryKind; title: string; description?: string; entries: unknown[] };

/** The stored document, whatever it holds, as the editor's: a document that is not an object starts empty. */
export function readDraftDocument(stored: unknown, kind: LibraryKind): DraftDocument {
  const value = (stored && typeof stored === "object" ? stored : {}) as Partial<DraftDocument>;
  return {
    kind,
    title: typeof value.title === "string" ? value.title : "",
    ...(typeof value.description === "string" ? { description: value.description } : {}),
    entries: Array.isArray(value.entries) ? value.entries : [],
  };
}

export type EntryProblems = { general: LibraryProblem[]; byEntry: Map<number, LibraryProblem[]> };

const entryIndex = (problem: LibraryProblem): number | null => {
  const [head, index] = problem.path.split(".");
  return head === "entries" && /^\d+$/.test(index ?? "") ? Number(index) : null;
};

/**
 * The document's problems: those of one entry by its position, and those of the whole. The check names the form's
 * problems before the builder's, so while only the library's own are wrong (a title too short) its entries are
 * checked again under a stand-in title, and their problems named too.
 */
export function problemsOf(document: DraftDocument): EntryProblems {
  const checked = checkLibraryDocument(document);
  const byEntry = new Map<number, LibraryProblem[]>();
  if (checked.ok) return { general: [], byEntry };
  const general = checked.problems.filter((problem) => entryIndex(problem) === null);
  let inEntries = checked.problems.filter((problem) => entryIndex(problem) !== null);
  if (inEntries.length === 0) {
    const again = checkLibraryDocument({ kind: document.kind, title: "Untitled library", entries: document.entries });
    inEntries = again.ok ? [] : again.problems.filter((problem) => entryIndex(problem) !== null);
  }
  for (const problem of inEntries) {
    const at = entryIndex(problem)!;
    byEntry.set(at, [...(byEntry.get(at) ?? []), problem]);
  }
  return { general, byEntry };
}

/** A problem as a sentence under its entry: where in the entry, then what is wrong. */
export function describeProblem(problem: LibraryProblem): string {
  const where = problem.path.split(".").slice(2).join(".");
  return where ? `${where}: ${problem.message}` : problem.message;
}

/** The key an entry is written with, for a heading ("entry 3" while it has none). */
export function entryLabel(entry: unknown, index: number): string {
  const key = (entry as { key?: unknown } | null)?.key;
  return typeof key === "string" && key.trim() !== "" ? key : `entry ${index + 1}`;
}
