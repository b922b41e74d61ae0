import "server-only";
// The library versions a published standard version's `latest` references were pinned to at its publication
// (db/schema/libraries.ts, standard_version_library_pins). Written once, in the publication's transaction; never
// changed (the database refuses). Permissions are checked by the use cases before any of this runs.
import { and, asc, desc, eq, inArray, lte, sql } from "drizzle-orm";
import { libraries, libraryVersionEvents, libraryVersions, standardVersionLibraryPins } from "@/db/schema";
import { currentDb } from "./transaction";

export type LibraryPinDto = { libraryId: string; slug: string; libraryVersionId: string; number: number; pinnedAt: string };

/**
 * Holds the libraries' rows against a publication or withdrawal (which lock them for update) until the transaction
 * ends: what the caller reads of their versions stays true while it pins them.
 */
export async function lockLibrariesForShare(slugs: readonly string[]): Promise<{ id: string; slug: string }[]> {
  if (slugs.length === 0) return [];
  return currentDb()
    .select({ id: libraries.id, slug: libraries.slug })
    .from(libraries)
    .where(inArray(libraries.slug, [...slugs]))
    .orderBy(asc(libraries.id))
    .for("share");
}

export async function insertLibraryPins(
  standardVersionId: string,
  pins: readonly { libraryId: string; libraryVersionId: string }[],
): Promise<void> {
  if (pins.length === 0) return;
  await currentDb()
    .insert(standardVersionLibraryPins)
    .values(pins.map((pin) => ({ ...pin, standardVersionId })));
}

/** A standard version's pins, by library slug. */
export async function listLibraryPins(standardVersionId: string): Promise<LibraryPinDto[]> {
  const rows = await currentDb()
    .select({
      libraryId: standardVersionLibraryPins.libraryId,
      slug: libraries.slug,
      libraryVersionId: standardVersionLibraryPins.libraryVersionId,
      number: libraryVersions.number,
      pinnedAt: standardVersionLibraryPins.pinnedAt,
    })
    .from(standardVersionLibraryPins)
    .innerJoin(libraries, eq(libraries.id, standardVersionLibraryPins.libraryId))
    .innerJoin(libraryVersions, eq(libraryVersions.id, standardVersionLibraryPins.libraryVersionId))
    .where(eq(standardVersionLibraryPins.standardVersionId, standardVersionId))
    .orderBy(asc(libraries.slug));
  return rows.map((row) => ({ ...row, pinnedAt: row.pinnedAt.toISOString() }));
}

/**
 * What `latest` meant at `at`: the number of the newest version of a library published then and not yet withdrawn;
 * null when there was none. For a version published before pins were recorded.
 */
export async function libraryVersionNumberAsOf(libraryId: string, at: Date): Promise<number | null> {
  const [row] = await currentDb()
    .select({ number: libraryVersions.number })
    .from(libraryVersions)
    .where(
      and(
        eq(libraryVersions.libraryId, libraryId),
        lte(libraryVersions.publishedAt, at),
        sql`not exists (select 1 from ${libraryVersionEvents} ev where ev.version_id = ${libraryVersions.id}
              and ev.kind = 'withdrawn' and ev.entry_key is null and ev.occurred_at <= ${at})`,
      ),
    )
    .orderBy(desc(libraryVersions.number))
    .limit(1);
  return row?.number ?? null;
}
