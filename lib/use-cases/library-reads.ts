import "server-only";
// Reading the firm's libraries: everyone reads what is published (drafts are the editors' working space), and a
// standard or a run resolves a reference { library, version | "latest", entry } to the entry it names, with the
// ids and hashes it records so that a withdrawal's impact report can find it later.
import { AppError } from "@/lib/domain/errors";
import { can } from "@/lib/domain/permissions";
import type { Actor } from "@/lib/domain/actor";
import {
  libraryDraftRefSchema,
  libraryReferenceSchema,
  librarySlugSchema,
  libraryVersionRefSchema,
  listLibrariesSchema,
  type LibraryKindId,
} from "@/lib/domain/schemas/libraries";
import { libraryEntryHash, normaliseKey, type LibraryDocument, type LibraryEntry } from "@/lib/libraries/document";
import {
  getLibraryBySlug,
  getLibraryVersion,
  listLibraryRows,
  listLibraryVersionsOf,
  listLibraryVersionSummaries,
  type LibraryEntryRowDto,
  type LibraryVersionDto,
  type LibraryVersionSummaryDto,
} from "@/lib/data/libraries";
import {
  getLibraryDraft,
  listLibraryReviews,
  listOpenLibraryDrafts,
  type LibraryDraftDto,
  type LibraryReviewDto,
} from "@/lib/data/library-drafts";
import { checkLibraryDraftDocument } from "./library-check";
import { defineUseCase } from "./use-case";

/** Drafts are the editors' working space: others see only what is published. */
const seesDrafts = (actor: Actor) => can(actor.role, "libraries.write-draft") || can(actor.role, "libraries.review");

export type LibraryListItem = {
  slug: string;
  kind: LibraryKindId;
  /** The newest version that is not withdrawn (what "latest" resolves to), else the newest; null before the first. */
  current: LibraryVersionSummaryDto | null;
  versions: number;
};

export const listLibraries = defineUseCase({
  name: "libraries.list",
  permission: "libraries.read",
  input: listLibrariesSchema,
  run: async ({ kind }, { actor }): Promise<{ libraries: LibraryListItem[]; drafts: LibraryDraftDto[] }> => {
    const editor = seesDrafts(actor);
    const versions = await listLibraryVersionSummaries(kind);
    const items = (await listLibraryRows(kind)).map((library) => {
      const own = versions.filter((version) => version.libraryId === library.id);
      return {
        slug: library.slug,
        kind: library.kind,
        current: own.find((version) => version.status !== "withdrawn") ?? own[0] ?? null,
        versions: own.length,
      };
    });
    const drafts = editor ? (await listOpenLibraryDrafts()).filter((draft) => !kind || draft.kind === kind) : [];
    // A library with nothing published yet is a draft: only editors see it.
    const libraries = items.filter((item) => item.current !== null || editor);
    libraries.sort((a, b) => (a.current?.title ?? a.slug).localeCompare(b.current?.title ?? b.slug, "en"));
    return { libraries, drafts };
  },
  audit: null,
});

export const readLibrary = defineUseCase({
  name: "libraries.read",
  permission: "libraries.read",
  input: librarySlugSchema,
  run: async ({ slug }, { actor }) => {
    const library = await getLibraryBySlug(slug);
    if (!library) throw new AppError("not-found", `There is no library called “${slug}”.`);
    const versions = await listLibraryVersionsOf(library.id);
    const drafts = seesDrafts(actor) ? await listOpenLibraryDrafts(library.id) : [];
    if (versions.length === 0 && drafts.length === 0) throw new AppError("not-found", `“${slug}” has no published version yet.`);
    return { slug, kind: library.kind, versions, drafts };
  },
  audit: null,
});

export type LibraryVersionView = LibraryVersionDto & {
  /** Entries that may no longer be used: withdrawn alone, or every entry when the version is withdrawn. */
  withdrawnEntries: LibraryEntryRowDto[];
};

export const readLibraryVersion = defineUseCase({
  name: "libraries.read-version",
  permission: "libraries.read",
  input: libraryVersionRefSchema,
  run: async ({ slug, number }): Promise<LibraryVersionView> => {
    const library = await getLibraryBySlug(slug);
    const version = library ? await getLibraryVersion({ libraryId: library.id, number }) : null;
    if (!version) throw new AppError("not-found", `The library “${slug}” has no version ${number}.`);
    const withdrawnEntries =
      version.status === "withdrawn" ? version.entryRows : version.entryRows.filter((entry) => entry.withdrawn !== null);
    return { ...version, withdrawnEntries };
  },
  audit: null,
});

export type LibraryDraftView = {
  draft: LibraryDraftDto;
  reviews: LibraryReviewDto[];
  basedOn: LibraryVersionSummaryDto | null;
  /** The saved document's problems (empty when it passes) and, when it passes, its content hash. */
  problems: Awaited<ReturnType<typeof checkLibraryDraftDocument>>["problems"];
  hash: string | null;
};

/** A draft with its submissions and comments, and the saved document's problems, for the editor. */
export const readLibraryDraft = defineUseCase({
  name: "libraries.read-draft",
  permission: "libraries.write-draft",
  input: libraryDraftRefSchema,
  prepare: async ({ draftId }) => {
    const draft = await getLibraryDraft(draftId);
    if (!draft) throw new AppError("not-found", "That library draft does not exist.");
    return checkLibraryDraftDocument(draft.document, draft.kind);
  },
  run: async ({ draftId }, { prepared }): Promise<LibraryDraftView> => {
    const draft = await getLibraryDraft(draftId);
    if (!draft) throw new AppError("not-found", "That library draft does not exist.");
    const basedOn = draft.basedOnVersionId ? await getLibraryVersion({ id: draft.basedOnVersionId }) : null;
    return {
      draft,
      reviews: await listLibraryReviews(draftId),
      basedOn,
      problems: prepared.problems,
      hash: prepared.checked?.contentHash ?? null,
    };
  },
  audit: null,
});

export type ResolvedLibraryEntry = {
  library: string;
  kind: LibraryKindId;
  versionId: string;
  versionNumber: number;
  /** The version's content hash. */
  contentHash: string;
  /** The entry's row: what a run records, with `entryHash`, to name the entry it used. */
  entryId: string;
  entryKey: string;
  entryHash: string;
  entry: LibraryEntry;
};

/**
 * Resolves a reference to one entry: a pinned version, or "latest" (the newest version that is not withdrawn).
 * A withdrawn version or entry is refused with a sentence naming it and why, never quietly replaced.
 */
export const resolveLibraryReference = defineUseCase({
  name: "libraries.resolve",
  permission: "libraries.read",
  input: libraryReferenceSchema,
  run: async ({ library: slug, version: wanted, entry: key }): Promise<ResolvedLibraryEntry> => {
    const library = await getLibraryBySlug(slug);
    if (!library) throw new AppError("not-found", `There is no library called “${slug}”.`);
    let version: LibraryVersionDto | null;
    if (wanted === "latest") {
      const current = (await listLibraryVersionsOf(library.id)).find((summary) => summary.status !== "withdrawn");
      if (!current) throw new AppError("not-found", `The library “${slug}” has no version in use.`);
      version = await getLibraryVersion({ id: current.id });
    } else {
      version = await getLibraryVersion({ libraryId: library.id, number: wanted });
      if (!version) throw new AppError("not-found", `The library “${slug}” has no version ${wanted}.`);
    }
    if (!version) throw new AppError("not-found", `The library “${slug}” has no version in use.`);
    const label = `version ${version.number} of ${slug}`;
    if (version.status === "withdrawn") {
      const reason = version.events.findLast((event) => event.kind === "withdrawn" && event.entryKey === null)?.reason;
      throw new AppError("conflict", `${capitalise(label)} was withdrawn (${reason ?? "no reason given"}); use a later version.`);
    }
    const { entryRows } = version;
    const row = entryRows.find((entry) => entry.normalisedKey === normaliseKey(key));
    if (!row) throw new AppError("not-found", `${capitalise(label)} has no entry “${key}”.`);
    if (row.withdrawn)
      throw new AppError(
        "conflict",
        `${row.key} in ${label} was withdrawn (${row.withdrawn.reason}); choose another entry or a version that corrects it.`,
      );
    const entry = (version.document as LibraryDocument).entries[row.position];
    // The stored document and its entry row must still agree: a run records this hash as its evidence.
    if (!entry || (await libraryEntryHash(entry)) !== row.entryHash)
      throw new Error(`library ${slug} version ${version.number}: entry ${row.key} does not match its recorded hash`);
    return {
      library: slug,
      kind: library.kind,
      versionId: version.id,
      versionNumber: version.number,
      contentHash: version.contentHash,
      entryId: row.id,
      entryKey: row.key,
      entryHash: row.entryHash,
      entry,
    };
  },
  audit: null,
});

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);
