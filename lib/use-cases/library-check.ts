import "server-only";
// What a library draft's document must pass before it is submitted, and again before it is published: the
// document check (lib/libraries: zod and the section builder), the library's own kind, at least one entry, and
// a difference from the version it started from. The check and the hashing are CPU work on what a person
// wrote, so the use cases run them in `prepare`, before the transaction opens.
import canonicalize from "canonicalize";
import type { Actor } from "@/lib/domain/actor";
import { LIBRARY_KIND_NAMES, type LibraryKind } from "@/lib/libraries";
import {
  checkLibraryDocument,
  libraryContentHash,
  libraryEntryHash,
  normaliseKey,
  type LibraryDocument,
  type LibraryProblem,
} from "@/lib/libraries/document";
import { lockLibraryDraftOrThrow } from "@/lib/data/library-drafts";
import { refuseUnlessOwnEditable } from "./draft-access";

export type LibraryCheck = {
  /** Everything that stops the document going forward, each with where it is and the entry it is in. */
  problems: LibraryProblem[];
  /** The checked document (section entries completed) and its hashes; null while there are problems. */
  checked: {
    document: LibraryDocument;
    contentHash: string;
    entries: { key: string; normalisedKey: string; entryHash: string }[];
  } | null;
};

/** Checks a document for a library of `kind` and, when it passes, hashes it and every entry. */
export async function checkLibraryDraftDocument(document: unknown, kind: LibraryKind): Promise<LibraryCheck> {
  const result = checkLibraryDocument(document);
  if (!result.ok) return { problems: result.problems, checked: null };
  if (result.document.kind !== kind)
    return {
      problems: [
        {
          path: "kind",
          entry: null,
          message: `This library holds ${LIBRARY_KIND_NAMES[kind].many.toLowerCase()}; the document is of ${LIBRARY_KIND_NAMES[result.document.kind].many.toLowerCase()}.`,
        },
      ],
      checked: null,
    };
  const entries = [];
  for (const entry of result.document.entries)
    entries.push({ key: entry.key, normalisedKey: normaliseKey(entry.key), entryHash: await libraryEntryHash(entry) });
  return {
    problems: [],
    checked: { document: result.document, contentHash: await libraryContentHash(result.document), entries },
  };
}

/** Why the document may not go forward (to review, or to publication), as sentences; empty when it may. */
export function libraryGateRefusals(check: LibraryCheck, basedOn: { number: number; contentHash: string } | null): string[] {
  if (!check.checked) {
    const [first] = check.problems;
    const where = first.entry ? `${first.entry}: ` : first.path ? `${first.path}: ` : "";
    return [
      `The document has ${check.problems.length} problem${check.problems.length === 1 ? "" : "s"} to fix first, e.g. ${where}${first.message}`,
    ];
  }
  if (check.checked.document.entries.length === 0) return ["Add at least one entry before submitting the library."];
  if (basedOn && basedOn.contentHash === check.checked.contentHash)
    return [`The draft is the same as version ${basedOn.number}; change something before submitting it.`];
  return [];
}

/** The library draft, locked, if `actor` wrote it and it is still being edited; else a refusal that says why. */
export async function ownEditableLibraryDraft(draftId: string, actor: Actor) {
  const draft = await lockLibraryDraftOrThrow(draftId);
  refuseUnlessOwnEditable(draft, actor);
  return draft;
}

/** A document read before the transaction is still the one stored (jsonb gives keys back in its own order). */
export function sameDocument(a: unknown, b: unknown): boolean {
  return canonicalize(a) === canonicalize(b);
}
