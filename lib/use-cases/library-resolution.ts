import "server-only";
// The library entries a standard's source needs, read from the firm's published libraries and bound in the form
// the evaluation takes (lib/standards/library-inputs.ts): for each section or material input, its library at
// the version it asks for (a number, or "latest"), with only the entries its defaults, its verification cases and any
// extra names (a run's picks) name. What is withdrawn is left out, so the evaluation refuses it by name. Reads only;
// called from a use case's `prepare`, before its transaction (`latestPinsToRecord` aside, which publication calls
// under its locks).
//
// What "latest" means depends on what is read:
// - a draft, its preview and the check before publication: the newest version not withdrawn, today;
// - a published standard version: the version pinned when it was published (standard_version_library_pins), so
//   its runs read what its reviewer approved, not whatever was published since. A version published before pins
//   were recorded reads what "latest" meant at its publication time. A pinned library version that is superseded
//   stays in use; one withdrawn as a whole leaves the standard version unable to run until a lead publishes a new
//   version of it (which pins the newest); an entry withdrawn alone is refused by name, as always;
// - a stored run: the versions its record names, withdrawn since or not.
import { AppError } from "@/lib/domain/errors";
import { definitionOfSource } from "@/lib/standards/read-definition";
import { entriesNeededBy, libraryReferencesOf, normaliseEntryKey, type LibraryEntries } from "@/lib/standards/library-inputs";
import { bindLibrary } from "@/lib/libraries/bind";
import type { LibraryDocument } from "@/lib/libraries/document";
import {
  getLibraryBySlug,
  getLibraryVersion,
  listLibraryVersionsOf,
  type LibraryVersionDto,
  type LibraryVersionStatus,
} from "@/lib/data/libraries";
import { libraryVersionNumberAsOf, listLibraryPins, lockLibrariesForShare } from "@/lib/data/library-pins";
import type { VersionDto } from "@/lib/data/standards";

async function versionFor(slug: string, wanted: number | "latest"): Promise<LibraryVersionDto | null> {
  const library = await getLibraryBySlug(slug);
  if (!library) return null;
  if (wanted !== "latest") return getLibraryVersion({ libraryId: library.id, number: wanted });
  const current = (await listLibraryVersionsOf(library.id)).find((summary) => summary.status !== "withdrawn");
  return current ? getLibraryVersion({ id: current.id }) : null;
}

/** Which versions `latest` reads, besides the default (the newest version not withdrawn). */
export type LibraryResolution =
  /** A published standard version: the versions its `latest` references were pinned to, by slug. */
  | { readonly pinned: Readonly<Record<string, number>> }
  /** A stored run: the versions its record names, by slug; nothing is left out for being withdrawn since. */
  | { readonly asRun: Readonly<Record<string, number>> };

/**
 * The entries a source's library inputs need, by library slug. A source that does not parse, or has no library
 * input, needs none. `extra` adds names per library (the entries a run picked), or "all" for every entry not
 * withdrawn (what a run form's picker and its preview offer). `resolution`: see LibraryResolution.
 */
export async function libraryEntriesFor(
  source: string,
  extra: Readonly<Record<string, readonly string[] | "all">> = {},
  resolution?: LibraryResolution,
): Promise<LibraryEntries> {
  const asRun = resolution && "asRun" in resolution ? resolution.asRun : undefined;
  const pinned = resolution && "pinned" in resolution ? resolution.pinned : undefined;
  const definition = definitionOfSource(source);
  if (!definition) return {};
  const needed = new Map(entriesNeededBy(definition).map(({ library, keys }) => [library, keys]));
  const out: Record<string, LibraryEntries[string]> = {};
  for (const { library: slug, version: wanted } of libraryReferencesOf(definition)) {
    // Two inputs asking for different versions of one library cannot both be met; the first asked wins and
    // the evaluation names the other input's version as not given.
    if (out[slug]) continue;
    const target = asRun?.[slug] ?? (pinned && wanted === "latest" ? pinned[slug] : wanted);
    // A published version with no pin for the library had none to read when it was published.
    if (target === undefined) continue;
    const version = await versionFor(slug, target);
    if (!version || (!asRun && version.status === "withdrawn")) continue;
    // A stored run is evaluated again with what it used then, withdrawn since or not.
    const withdrawn = new Set(asRun ? [] : version.entryRows.filter((row) => row.withdrawn).map((row) => row.normalisedKey));
    const more = extra[slug] === "all" ? version.entryRows.map((row) => row.key) : (extra[slug] ?? []);
    const keys = [...(needed.get(slug) ?? []), ...more].filter((key) => !withdrawn.has(normaliseEntryKey(key)));
    out[slug] = await bindLibrary(
      version.document as LibraryDocument,
      { number: version.number, contentHash: version.contentHash },
      keys,
    );
  }
  return out;
}

/** One library a published standard version reads, and the version it reads of it. */
export type LibraryReferencePin = {
  library: string;
  /** The inputs that take entries from it. */
  inputs: string[];
  /** What the source asks for. */
  requested: number | "latest";
  /** The version read: the number named, or the one `latest` was pinned to; null when there was none to pin. */
  version: number | null;
  /**
   * named: the number the source names; pinned: recorded when the version was published; as-of-publication: worked out
   * from the publication time (the version was published before pins were recorded).
   */
  how: "named" | "pinned" | "as-of-publication";
  /** That library version's status today (a withdrawn one cannot be run). */
  status: LibraryVersionStatus | null;
  /** The newest version of the library not withdrawn today, when it is newer than `version`. */
  newer: number | null;
};

/** The libraries a published standard version reads and which version of each. Reads only. */
export async function libraryPinsOf(version: Pick<VersionDto, "id" | "source" | "publishedAt">): Promise<LibraryReferencePin[]> {
  const definition = definitionOfSource(version.source);
  if (!definition) return [];
  const references = libraryReferencesOf(definition);
  // Most standards read no library: no query for them (a run's path counts its round trips).
  if (references.length === 0) return [];
  const recorded = new Map((await listLibraryPins(version.id)).map((pin) => [pin.slug, pin.number]));
  const out: LibraryReferencePin[] = [];
  for (const { library: slug, version: requested, inputs } of references) {
    const library = await getLibraryBySlug(slug);
    const versions = library ? await listLibraryVersionsOf(library.id) : [];
    let number: number | null = requested === "latest" ? null : requested;
    let how: LibraryReferencePin["how"] = "named";
    if (requested === "latest") {
      how = recorded.has(slug) ? "pinned" : "as-of-publication";
      number = recorded.get(slug) ?? (library ? await libraryVersionNumberAsOf(library.id, new Date(version.publishedAt)) : null);
    }
    const newest = versions.find((summary) => summary.status !== "withdrawn");
    out.push({
      library: slug,
      inputs,
      requested,
      version: number,
      how,
      status: versions.find((summary) => summary.number === number)?.status ?? null,
      newer: newest && number !== null && newest.number > number ? newest.number : null,
    });
  }
  return out;
}

/** The pins as libraryEntriesFor takes them. */
export function pinnedVersions(pins: readonly LibraryReferencePin[]): { pinned: Record<string, number> } {
  const pinned: Record<string, number> = {};
  for (const pin of pins) if (pin.requested === "latest" && pin.version !== null) pinned[pin.library] ??= pin.version;
  return { pinned };
}

/**
 * The entries a published standard version's inputs need, each library at the version the standard version reads.
 * `forRun`: refuses, with what to do, a version that reads a library version withdrawn as a whole (or none at all).
 */
export async function publishedLibraryEntries(
  version: Pick<VersionDto, "id" | "source" | "publishedAt" | "number" | "title">,
  extra: Readonly<Record<string, readonly string[] | "all">> = {},
  { forRun = false }: { forRun?: boolean } = {},
): Promise<{ entries: LibraryEntries; pins: LibraryReferencePin[] }> {
  const pins = await libraryPinsOf(version);
  if (forRun)
    for (const pin of pins) {
      const which = pin.how === "named" ? "names" : "was pinned to when it was published";
      if (pin.version === null)
        throw new AppError(
          "conflict",
          `Version ${version.number} of ${version.title} has no version of the library “${pin.library}” to read: none was ` +
            "published when it was. A standards lead publishes a new version of the standard to use the library.",
        );
      if (pin.status === "withdrawn")
        throw new AppError(
          "conflict",
          `Version ${version.number} of ${version.title} reads version ${pin.version} of the library “${pin.library}”, which it ` +
            `${which}, and that library version is withdrawn. It cannot be run until a standards lead publishes a new ` +
            "version of the standard on a library version in use.",
        );
    }
  // Read for its page, a version on a withdrawn library version is shown as it was published (it cannot be run).
  const resolution = pins.some((pin) => pin.status === "withdrawn")
    ? { asRun: pinnedVersions(pins).pinned }
    : pinnedVersions(pins);
  return { entries: await libraryEntriesFor(version.source, extra, resolution), pins };
}

/**
 * For publication, under its transaction: each library the source asks for at `latest`, locked against a
 * publication or withdrawal until the commit, with its newest version not withdrawn, which must be the one the
 * source was verified against (`verified`, from prepare). What the new version's pins record.
 */
export async function latestPinsToRecord(
  source: string,
  verified: LibraryEntries,
): Promise<{ libraryId: string; libraryVersionId: string; library: string; version: number; contentHash: string }[]> {
  const definition = definitionOfSource(source);
  if (!definition) return [];
  const slugs = [
    ...new Set(
      libraryReferencesOf(definition)
        .filter((ref) => ref.version === "latest")
        .map((ref) => ref.library),
    ),
  ];
  const locked = await lockLibrariesForShare(slugs);
  const pins = [];
  for (const slug of slugs) {
    const library = locked.find((row) => row.slug === slug);
    const newest = library
      ? (await listLibraryVersionsOf(library.id)).find((summary) => summary.status !== "withdrawn")
      : undefined;
    if (!library || !newest)
      throw new AppError(
        "invalid-input",
        `It cannot be published: the library “${slug}” has no published version in use to pin.`,
      );
    if (verified[slug]?.version !== newest.number)
      throw new AppError(
        "conflict",
        `The library “${slug}” changed while the submission was being checked (its newest version in use is now ` +
          `${newest.number}); approve it again to check and pin it against that version.`,
      );
    pins.push({
      libraryId: library.id,
      libraryVersionId: newest.id,
      library: slug,
      version: newest.number,
      contentHash: newest.contentHash,
    });
  }
  return pins;
}
