import "server-only";
// The library entries a standard's source needs, read from the firm's published libraries and bound in the form
// the evaluation takes (lib/standards/library-inputs.ts): for each section or material input, its library at
// the version it asks for (a number, or "latest": the newest not withdrawn), with only the entries its defaults,
// its verification cases and any extra names (a run's picks) name. What is withdrawn is left out, so the
// evaluation refuses it by name. Reads only; called from a use case's `prepare`, before its transaction.
import { definitionOfSource } from "@/lib/standards/read-definition";
import { entriesNeededBy, libraryReferencesOf, normaliseEntryKey, type LibraryEntries } from "@/lib/standards/library-inputs";
import { bindLibrary } from "@/lib/libraries/bind";
import type { LibraryDocument } from "@/lib/libraries/document";
import { getLibraryBySlug, getLibraryVersion, listLibraryVersionsOf, type LibraryVersionDto } from "@/lib/data/libraries";

async function versionFor(slug: string, wanted: number | "latest"): Promise<LibraryVersionDto | null> {
  const library = await getLibraryBySlug(slug);
  if (!library) return null;
  if (wanted !== "latest") return getLibraryVersion({ libraryId: library.id, number: wanted });
  const current = (await listLibraryVersionsOf(library.id)).find((summary) => summary.status !== "withdrawn");
  return current ? getLibraryVersion({ id: current.id }) : null;
}

/**
 * The entries a source's library inputs need, by library slug. A source that does not parse, or has no library
 * input, needs none. `extra` adds names per library (the entries a run picked), or "all" for every entry not
 * withdrawn (what a run form's picker and its preview offer). `asRun`: the library versions a stored run used, by slug
 * (its record's entries): those versions are read, and nothing is left out for being withdrawn since.
 */
export async function libraryEntriesFor(
  source: string,
  extra: Readonly<Record<string, readonly string[] | "all">> = {},
  asRun?: { readonly versions: Readonly<Record<string, number>> },
): Promise<LibraryEntries> {
  const definition = definitionOfSource(source);
  if (!definition) return {};
  const needed = new Map(entriesNeededBy(definition).map(({ library, keys }) => [library, keys]));
  const out: Record<string, LibraryEntries[string]> = {};
  for (const { library: slug, version: wanted } of libraryReferencesOf(definition)) {
    // Two inputs asking for different versions of one library cannot both be met; the first asked wins and
    // the evaluation names the other input's version as not given.
    if (out[slug]) continue;
    const version = await versionFor(slug, asRun?.versions[slug] ?? wanted);
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
