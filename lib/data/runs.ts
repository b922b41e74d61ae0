import "server-only";
// Runs: the append-only rows a run use case writes (lib/use-cases/runs.ts) and what lists and the run page read.
// A run's record is stored as the canonical text that was hashed; lists read only the columns copied from it.
import { and, eq, gte, lt, sql, type SQL } from "drizzle-orm";
import {
  jobs,
  libraries,
  libraryVersionEntries,
  libraryVersions,
  runLibraryEntries,
  runs,
  standards,
  standardVersions,
  user,
  type RunOutcome,
  type RunPurpose,
  type UnitSystem,
} from "@/db/schema";
import {
  SIGN_OFF_STATES,
  type RunCursor,
  type RunSort,
  type SignOffState,
  type SortDirection,
} from "@/lib/domain/schemas/run-log";
import { currentDb } from "./transaction";

export type RunSummaryDto = {
  id: string;
  jobId: string;
  jobNumber: string;
  jobName: string;
  versionId: string;
  slug: string;
  title: string;
  number: number;
  outcome: RunOutcome;
  pass: boolean | null;
  maxUtilisation: number | null;
  purpose: RunPurpose;
  parentRunId: string | null;
  unitSystem: UnitSystem;
  recordSha256: string;
  recordBytes: number;
  createdById: string;
  createdByName: string;
  createdAt: string;
};

export type RunDto = RunSummaryDto & {
  /** The canonical record as stored (the bytes that were hashed). */
  record: string;
};

const summaryColumns = {
  id: runs.id,
  jobId: runs.jobId,
  jobNumber: jobs.jobNumber,
  jobName: jobs.name,
  versionId: runs.versionId,
  slug: standards.slug,
  title: standardVersions.title,
  number: standardVersions.number,
  outcome: runs.outcome,
  pass: runs.pass,
  maxUtilisation: runs.maxUtilisation,
  purpose: runs.purpose,
  parentRunId: runs.parentRunId,
  unitSystem: runs.unitSystem,
  recordSha256: runs.recordSha256,
  recordBytes: runs.recordBytes,
  createdById: runs.createdById,
  createdByName: user.name,
  createdAt: runs.createdAt,
};

function selectRuns() {
  return currentDb()
    .select(summaryColumns)
    .from(runs)
    .innerJoin(jobs, eq(jobs.id, runs.jobId))
    .innerJoin(standardVersions, eq(standardVersions.id, runs.versionId))
    .innerJoin(standards, eq(standards.id, standardVersions.standardId))
    .innerJoin(user, eq(user.id, runs.createdById));
}

function toSummary(row: Awaited<ReturnType<ReturnType<typeof selectRuns>["execute"]>>[number]): RunSummaryDto {
  return { ...row, createdAt: row.createdAt.toISOString() };
}

export async function insertRun(values: typeof runs.$inferInsert): Promise<void> {
  await currentDb().insert(runs).values(values);
}

export async function insertRunLibraryEntries(rows: (typeof runLibraryEntries.$inferInsert)[]): Promise<void> {
  if (rows.length > 0) await currentDb().insert(runLibraryEntries).values(rows);
}

/** A run's summary, without its record (which may be hundreds of kB): for checks that it exists and where. */
export async function getRunSummary(id: string): Promise<RunSummaryDto | null> {
  const [row] = await selectRuns().where(eq(runs.id, id));
  return row ? toSummary(row) : null;
}

export async function getRun(id: string): Promise<RunDto | null> {
  const row = await getRunSummary(id);
  if (!row) return null;
  const [{ record }] = await currentDb().select({ record: runs.record }).from(runs).where(eq(runs.id, id));
  return { ...row, record };
}

export type RunFilter = {
  jobId?: string;
  jobNumber?: string;
  slug?: string;
  number?: number;
  versionId?: string;
  createdById?: string;
  outcome?: RunOutcome;
  pass?: boolean;
  signOff?: SignOffState;
  /** Made at or after this instant. */
  from?: Date;
  /** Made before this instant. */
  until?: Date;
  sort?: RunSort;
  dir?: SortDirection;
  /** Keyset: rows strictly after this one in the order asked for. */
  after?: RunCursor;
  limit: number;
};

/** A row of a run list: the summary, the version's content hash and how far its calc is signed off. */
export type RunListRowDto = RunSummaryDto & { contentHash: string; signOff: SignOffState };

// A run's sign-off is the furthest step of any calc revision that issued it: approved, else checked, else prepared
// (issued and waiting, or returned by the checker), else not issued. Read from the append-only events, as stateOf does.
const SIGN_OFF_RANK = sql<number>`coalesce((select max(case e.kind when 'approved' then 3 when 'checked' then 2 else 1 end)
  from calc_revisions r join calc_revision_events e on e.revision_id = r.id where r.run_id = ${runs.id}), 0)`.mapWith(Number);
const issued = sql`exists (select 1 from calc_revisions r where r.run_id = ${runs.id})`;
const reached = (kinds: string) =>
  sql`exists (select 1 from calc_revisions r join calc_revision_events e on e.revision_id = r.id
    where r.run_id = ${runs.id} and e.kind in (${sql.raw(kinds)}))`;
const SIGN_OFF_FILTERS: Record<SignOffState, SQL> = {
  "not-issued": sql`not ${issued}`,
  prepared: sql`${issued} and not ${reached("'checked', 'approved'")}`,
  checked: sql`${reached("'checked'")} and not ${reached("'approved'")}`,
  approved: reached("'approved'"),
};

/** The utilisation a list sorts by: a run without one (failed in the engine, or no checks) sorts below every number. */
const UTILISATION_KEY = sql`coalesce(${runs.maxUtilisation}, '-Infinity'::float8)`;

/** The order's columns, most significant first; each has an index that serves it (db/schema/jobs.ts). */
function orderKeys(sort: RunSort): SQL[] {
  const tail = [sql`${runs.createdAt}`, sql`${runs.id}`];
  if (sort === "utilisation") return [UTILISATION_KEY, ...tail];
  if (sort === "job") return [sql`${jobs.jobNumber}`, ...tail];
  return tail;
}

/** Rows after the cursor: one row comparison, which an index on the same columns reads as a range. */
function afterCursor(cursor: RunCursor, dir: SortDirection): SQL[] {
  const op = sql.raw(dir === "desc" ? "<" : ">");
  const tail = sql`${new Date(cursor.createdAt)}::timestamptz, ${cursor.id}::uuid`;
  if (cursor.sort === "date") return [sql`(${runs.createdAt}, ${runs.id}) ${op} (${tail})`];
  if (cursor.sort === "utilisation") {
    const key = cursor.key === null ? sql`'-Infinity'::float8` : sql`${cursor.key}::float8`;
    return [sql`(${UTILISATION_KEY}, ${runs.createdAt}, ${runs.id}) ${op} (${key}, ${tail})`];
  }
  // The job number alone first, so that the jobs before the cursor's are skipped through the job number's index.
  return [
    sql`${jobs.jobNumber} ${sql.raw(dir === "desc" ? "<=" : ">=")} ${cursor.key}`,
    sql`(${jobs.jobNumber}, ${runs.createdAt}, ${runs.id}) ${op} (${cursor.key}, ${tail})`,
  ];
}

/** `limit` rows at most, in the order asked for (newest first unless told), after the cursor when one is given. */
export async function listRuns(filter: RunFilter): Promise<RunListRowDto[]> {
  const sort = filter.sort ?? "date";
  const dir = filter.dir ?? "desc";
  if (filter.after && filter.after.sort !== sort) throw new Error("listRuns: the cursor was written for another order");
  const where: SQL[] = [];
  if (filter.jobId) where.push(eq(runs.jobId, filter.jobId));
  if (filter.jobNumber) where.push(eq(jobs.jobNumber, filter.jobNumber));
  if (filter.slug) where.push(eq(standards.slug, filter.slug));
  if (filter.number) where.push(eq(standardVersions.number, filter.number));
  if (filter.versionId) where.push(eq(runs.versionId, filter.versionId));
  if (filter.createdById) where.push(eq(runs.createdById, filter.createdById));
  if (filter.outcome) where.push(eq(runs.outcome, filter.outcome));
  if (filter.pass !== undefined) where.push(eq(runs.pass, filter.pass));
  if (filter.signOff) where.push(SIGN_OFF_FILTERS[filter.signOff]);
  if (filter.from) where.push(gte(runs.createdAt, filter.from));
  if (filter.until) where.push(lt(runs.createdAt, filter.until));
  if (filter.after) where.push(...afterCursor(filter.after, dir));
  const rows = await currentDb()
    .select({ ...summaryColumns, contentHash: standardVersions.contentHash, signOff: SIGN_OFF_RANK })
    .from(runs)
    .innerJoin(jobs, eq(jobs.id, runs.jobId))
    .innerJoin(standardVersions, eq(standardVersions.id, runs.versionId))
    .innerJoin(standards, eq(standards.id, standardVersions.standardId))
    .innerJoin(user, eq(user.id, runs.createdById))
    .where(where.length > 0 ? and(...where) : undefined)
    // Nulls placed as the indexes place them (DESC NULLS LAST, read backwards for ascending), so that they serve the order.
    .orderBy(...orderKeys(sort).map((key) => (dir === "desc" ? sql`${key} desc nulls last` : sql`${key} asc nulls first`)))
    .limit(filter.limit);
  return rows.map((row) => ({ ...row, createdAt: row.createdAt.toISOString(), signOff: SIGN_OFF_STATES[row.signOff] }));
}

/** The cursor that continues a list after `row`, in the order it was read in. */
export function cursorAfter(row: RunListRowDto, sort: RunSort): RunCursor {
  const tail = { createdAt: row.createdAt, id: row.id };
  if (sort === "utilisation") return { sort, key: row.maxUtilisation, ...tail };
  if (sort === "job") return { sort, key: row.jobNumber, ...tail };
  return { sort, ...tail };
}

export async function countRunsOfJob(jobId: string): Promise<number> {
  const [row] = await currentDb()
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(runs)
    .where(eq(runs.jobId, jobId));
  return row.n;
}

/** The published entry row a run used: by library slug, version number and the entry's normalised key. */
export async function findLibraryEntryRow(
  slug: string,
  number: number,
  normalisedKey: string,
): Promise<{ id: string; entryHash: string } | null> {
  const [row] = await currentDb()
    .select({ id: libraryVersionEntries.id, entryHash: libraryVersionEntries.entryHash })
    .from(libraryVersionEntries)
    .innerJoin(libraryVersions, eq(libraryVersions.id, libraryVersionEntries.versionId))
    .innerJoin(libraries, eq(libraries.id, libraryVersions.libraryId))
    .where(
      and(eq(libraries.slug, slug), eq(libraryVersions.number, number), eq(libraryVersionEntries.normalisedKey, normalisedKey)),
    );
  return row ?? null;
}

/** The library entries a run used, as stored beside it. */
export async function listRunLibraryEntries(runId: string): Promise<{ inputKey: string; entryId: string; entryHash: string }[]> {
  return currentDb()
    .select({ inputKey: runLibraryEntries.inputKey, entryId: runLibraryEntries.entryId, entryHash: runLibraryEntries.entryHash })
    .from(runLibraryEntries)
    .where(eq(runLibraryEntries.runId, runId))
    .orderBy(runLibraryEntries.inputKey);
}
