import "server-only";
// The firm's libraries, their published versions, entries and events (db/schema/libraries.ts). Permissions are
// checked by the use cases (lib/use-cases/libraries.ts) before any of this runs. A version's status is its
// latest event without an entry key; an entry is withdrawn when an event names it or its version is withdrawn.
// Nothing here updates a published version, entry or event (the database would refuse). Drafts and reviews are
// in ./library-drafts.ts.
import { and, asc, desc, eq, isNull, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import {
  libraries,
  libraryVersionEntries,
  libraryVersionEvents,
  libraryVersions,
  user,
  type LibraryVersion,
  type VersionEventKind,
} from "@/db/schema";
import type { LibraryKindId } from "@/lib/domain/schemas/libraries";
import { AppError } from "@/lib/domain/errors";
import { currentDb } from "./transaction";

export type LibraryVersionStatus = VersionEventKind;

export type LibraryRow = { id: string; slug: string; kind: LibraryKindId };

export type LibraryVersionSummaryDto = {
  id: string;
  libraryId: string;
  slug: string;
  kind: LibraryKindId;
  number: number;
  title: string;
  changelog: string;
  contentHash: string;
  status: LibraryVersionStatus;
  entries: number;
  authorName: string;
  reviewerName: string;
  publishedAt: string;
};

export type WithdrawalDto = { reason: string; actorName: string | null; occurredAt: string };

export type LibraryEntryRowDto = {
  /** What a run records to name the entry it used, beside `entryHash`. */
  id: string;
  position: number;
  key: string;
  normalisedKey: string;
  entryHash: string;
  /** Set when this entry alone was withdrawn (a withdrawn version withdraws every entry: see `status`). */
  withdrawn: WithdrawalDto | null;
};

export type LibraryVersionDto = LibraryVersionSummaryDto & {
  document: unknown;
  basedOnVersionId: string | null;
  events: {
    kind: LibraryVersionStatus;
    entryKey: string | null;
    reason: string | null;
    actorName: string | null;
    occurredAt: string;
  }[];
  entryRows: LibraryEntryRowDto[];
};

const author = alias(user, "author");
const reviewer = alias(user, "reviewer");

/** The latest version-level event (no entry key) of each version: its status. */
function latestVersionEvents() {
  return currentDb()
    .selectDistinctOn([libraryVersionEvents.versionId], {
      versionId: libraryVersionEvents.versionId,
      kind: libraryVersionEvents.kind,
    })
    .from(libraryVersionEvents)
    .where(isNull(libraryVersionEvents.entryKey))
    .orderBy(libraryVersionEvents.versionId, desc(libraryVersionEvents.id))
    .as("latest_event");
}

function versionSummaryQuery() {
  const latest = latestVersionEvents();
  return currentDb()
    .select({
      id: libraryVersions.id,
      libraryId: libraryVersions.libraryId,
      slug: libraries.slug,
      kind: libraryVersions.kind,
      number: libraryVersions.number,
      title: libraryVersions.title,
      changelog: libraryVersions.changelog,
      contentHash: libraryVersions.contentHash,
      status: sql<LibraryVersionStatus>`coalesce(${latest.kind}, 'published')`,
      entries:
        sql<number>`(select count(*) from ${libraryVersionEntries} where ${libraryVersionEntries.versionId} = ${libraryVersions.id})`.mapWith(
          Number,
        ),
      authorName: author.name,
      reviewerName: reviewer.name,
      publishedAt: libraryVersions.publishedAt,
    })
    .from(libraryVersions)
    .innerJoin(libraries, eq(libraries.id, libraryVersions.libraryId))
    .innerJoin(author, eq(author.id, libraryVersions.authorId))
    .innerJoin(reviewer, eq(reviewer.id, libraryVersions.reviewerId))
    .leftJoin(latest, eq(latest.versionId, libraryVersions.id));
}

type SummaryRow = Awaited<ReturnType<ReturnType<typeof versionSummaryQuery>["execute"]>>[number];
const toSummary = (row: SummaryRow): LibraryVersionSummaryDto => ({ ...row, publishedAt: row.publishedAt.toISOString() });

export async function getLibraryBySlug(slug: string): Promise<LibraryRow | null> {
  const [row] = await currentDb()
    .select({ id: libraries.id, slug: libraries.slug, kind: libraries.kind })
    .from(libraries)
    .where(eq(libraries.slug, slug));
  return row ?? null;
}

export async function getLibraryOrThrow(id: string): Promise<LibraryRow> {
  const [row] = await currentDb()
    .select({ id: libraries.id, slug: libraries.slug, kind: libraries.kind })
    .from(libraries)
    .where(eq(libraries.id, id));
  if (!row) throw new AppError("not-found", "That library does not exist.");
  return row;
}

/** Every library, by slug; of one kind when given. */
export async function listLibraryRows(kind?: LibraryKindId): Promise<LibraryRow[]> {
  return currentDb()
    .select({ id: libraries.id, slug: libraries.slug, kind: libraries.kind })
    .from(libraries)
    .where(kind ? eq(libraries.kind, kind) : undefined)
    .orderBy(asc(libraries.slug));
}

/** The new library, or null when its slug was taken meanwhile (two people creating the same one at once). */
export async function insertLibrary(values: {
  slug: string;
  kind: LibraryKindId;
  createdById: string;
}): Promise<LibraryRow | null> {
  const [row] = await currentDb()
    .insert(libraries)
    .values(values)
    .onConflictDoNothing({ target: libraries.slug })
    .returning({ id: libraries.id, slug: libraries.slug, kind: libraries.kind });
  return row ?? null;
}

/** Locks the library's row: its publications and withdrawals happen one at a time. */
export async function lockLibrary(id: string): Promise<void> {
  await currentDb().select({ id: libraries.id }).from(libraries).where(eq(libraries.id, id)).for("update");
}

/** Every version of every library (of one kind when given), newest number first within each library. */
export async function listLibraryVersionSummaries(kind?: LibraryKindId): Promise<LibraryVersionSummaryDto[]> {
  const rows = await versionSummaryQuery()
    .where(kind ? eq(libraryVersions.kind, kind) : undefined)
    .orderBy(asc(libraries.slug), desc(libraryVersions.number));
  return rows.map(toSummary);
}

export async function listLibraryVersionsOf(libraryId: string): Promise<LibraryVersionSummaryDto[]> {
  const rows = await versionSummaryQuery().where(eq(libraryVersions.libraryId, libraryId)).orderBy(desc(libraryVersions.number));
  return rows.map(toSummary);
}

type EventDto = LibraryVersionDto["events"][number];

/** The entries of a version in document order, each with its own withdrawal (the first, if any) from `events`. */
async function listEntryRows(versionId: string, events: EventDto[]): Promise<LibraryEntryRowDto[]> {
  const entries = await currentDb()
    .select({
      id: libraryVersionEntries.id,
      position: libraryVersionEntries.position,
      key: libraryVersionEntries.key,
      normalisedKey: libraryVersionEntries.normalisedKey,
      entryHash: libraryVersionEntries.entryHash,
    })
    .from(libraryVersionEntries)
    .where(eq(libraryVersionEntries.versionId, versionId))
    .orderBy(asc(libraryVersionEntries.position));
  const byKey = new Map<string, WithdrawalDto>();
  for (const event of events)
    if (event.kind === "withdrawn" && event.entryKey !== null && !byKey.has(event.entryKey))
      byKey.set(event.entryKey, { reason: event.reason ?? "", actorName: event.actorName, occurredAt: event.occurredAt });
  return entries.map((entry) => ({ ...entry, withdrawn: byKey.get(entry.normalisedKey) ?? null }));
}

export async function getLibraryVersion(
  where: { id: string } | { libraryId: string; number: number },
): Promise<LibraryVersionDto | null> {
  const condition =
    "id" in where
      ? eq(libraryVersions.id, where.id)
      : and(eq(libraryVersions.libraryId, where.libraryId), eq(libraryVersions.number, where.number));
  const [summary] = await versionSummaryQuery().where(condition);
  if (!summary) return null;
  const [content] = await currentDb()
    .select({ document: libraryVersions.document, basedOnVersionId: libraryVersions.basedOnVersionId })
    .from(libraryVersions)
    .where(eq(libraryVersions.id, summary.id));
  const events = await currentDb()
    .select({
      kind: libraryVersionEvents.kind,
      entryKey: libraryVersionEvents.entryKey,
      reason: libraryVersionEvents.reason,
      actorName: user.name,
      occurredAt: libraryVersionEvents.occurredAt,
    })
    .from(libraryVersionEvents)
    .leftJoin(user, eq(user.id, libraryVersionEvents.actorId))
    .where(eq(libraryVersionEvents.versionId, summary.id))
    .orderBy(asc(libraryVersionEvents.id));
  const eventDtos = events.map((event) => ({ ...event, occurredAt: event.occurredAt.toISOString() }));
  return { ...toSummary(summary), ...content, events: eventDtos, entryRows: await listEntryRows(summary.id, eventDtos) };
}

export async function nextLibraryVersionNumber(libraryId: string): Promise<number> {
  const [row] = await currentDb()
    .select({ last: sql<number>`coalesce(max(${libraryVersions.number}), 0)`.mapWith(Number) })
    .from(libraryVersions)
    .where(eq(libraryVersions.libraryId, libraryId));
  return row.last + 1;
}

export async function insertLibraryVersion(values: typeof libraryVersions.$inferInsert): Promise<LibraryVersion> {
  const [row] = await currentDb().insert(libraryVersions).values(values).returning();
  return row;
}

/** One row per entry of a just-published version, in document order. */
export async function insertLibraryVersionEntries(
  versionId: string,
  entries: { key: string; normalisedKey: string; entryHash: string }[],
): Promise<void> {
  // In slices, so a catalogue of thousands of sections stays well under PostgreSQL's parameter limit.
  for (let start = 0; start < entries.length; start += 1000)
    await currentDb()
      .insert(libraryVersionEntries)
      .values(entries.slice(start, start + 1000).map((entry, i) => ({ ...entry, versionId, position: start + i })));
}

export async function insertLibraryVersionEvent(values: {
  versionId: string;
  kind: VersionEventKind;
  entryKey?: string | null;
  reason?: string | null;
  actorId: string | null;
}): Promise<void> {
  await currentDb().insert(libraryVersionEvents).values(values);
}

/**
 * Every entry that may no longer be used, with why: withdrawn alone, or with its whole version. What the
 * withdrawal's impact report joins runs on (a run records the entry's id and hash); of one version when given.
 */
export async function listWithdrawnLibraryEntries(
  versionId?: string,
): Promise<
  { entryId: string; versionId: string; key: string; entryHash: string; whole: boolean; reason: string; occurredAt: string }[]
> {
  const { rows } = await currentDb().execute<{
    entry_id: string;
    version_id: string;
    key: string;
    entry_hash: string;
    whole: boolean;
    reason: string;
    occurred_at: Date | string;
  }>(sql`
    select distinct on (e.id) e.id as entry_id, e.version_id, e.key, e.entry_hash,
           ev.entry_key is null as whole, ev.reason, ev.occurred_at
      from ${libraryVersionEntries} e
      join ${libraryVersionEvents} ev
        on ev.version_id = e.version_id and ev.kind = 'withdrawn'
       and (ev.entry_key = e.normalised_key or ev.entry_key is null)
     where ${versionId ? sql`e.version_id = ${versionId}` : sql`true`}
     order by e.id, ev.id`);
  return rows.map((row) => ({
    entryId: row.entry_id,
    versionId: row.version_id,
    key: row.key,
    entryHash: row.entry_hash,
    whole: row.whole,
    reason: row.reason,
    occurredAt: new Date(row.occurred_at).toISOString(),
  }));
}
