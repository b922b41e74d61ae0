import "server-only";
// The run lists' one query: GET /api/runs, the runs list, a job's runs, the auditor's run log and its CSV export all
// read through listRuns — filters on the runs' own columns, an order (date, largest utilisation, job number) that an
// index serves, and a keyset cursor (a row comparison the same index reads as a range). Each row carries the version's
// content hash and how far its calc is signed off.
import { and, asc, desc, eq, gte, inArray, lt, lte, sql, type SQL } from "drizzle-orm";
import { jobs, runs, standards, standardVersions, user, type RunOutcome } from "@/db/schema";
import {
  SIGN_OFF_STATES,
  type RunCursor,
  type RunSort,
  type SignOffState,
  type SortDirection,
} from "@/lib/domain/schemas/run-log";
import { summaryColumns, type RunSummaryDto } from "./runs";
import { currentDb } from "./transaction";

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

/** How many matching runs make "by job" walk the jobs in order rather than sort every match (see listRuns). */
const JOB_WALK_FROM = 5000;

/** The conditions of a filter on the runs table alone, or null when a job or version it names does not exist. */
async function conditionsOf(filter: RunFilter): Promise<SQL[] | null> {
  const where: SQL[] = [];
  if (filter.jobId) where.push(eq(runs.jobId, filter.jobId));
  // A job number, a standard and a version number are looked up first and the runs filtered by their ids: the
  // planner then estimates from the runs' own statistics (a firm's few standard versions may never be analysed, and
  // a join estimated at a handful of rows that brings back a hundred thousand turns a 1 ms page into seconds).
  if (filter.jobNumber) {
    const [job] = await currentDb().select({ id: jobs.id }).from(jobs).where(eq(jobs.jobNumber, filter.jobNumber));
    if (!job) return null;
    where.push(eq(runs.jobId, job.id));
  }
  if (filter.slug || filter.number) {
    const versions = await currentDb()
      .select({ id: standardVersions.id })
      .from(standardVersions)
      .innerJoin(standards, eq(standards.id, standardVersions.standardId))
      .where(
        and(
          filter.slug ? eq(standards.slug, filter.slug) : undefined,
          filter.number ? eq(standardVersions.number, filter.number) : undefined,
        ),
      );
    if (versions.length === 0) return null;
    where.push(
      inArray(
        runs.versionId,
        versions.map((v) => v.id),
      ),
    );
  }
  if (filter.versionId) where.push(eq(runs.versionId, filter.versionId));
  if (filter.createdById) where.push(eq(runs.createdById, filter.createdById));
  if (filter.outcome) where.push(eq(runs.outcome, filter.outcome));
  if (filter.pass !== undefined) where.push(eq(runs.pass, filter.pass));
  if (filter.signOff) where.push(SIGN_OFF_FILTERS[filter.signOff]);
  if (filter.from) where.push(gte(runs.createdAt, filter.from));
  if (filter.until) where.push(lt(runs.createdAt, filter.until));
  return where;
}

/** The one select every run list reads: the summary, the content hash and the sign-off, in the order asked for. */
async function selectRows(where: SQL[], sort: RunSort, dir: SortDirection, limit: number): Promise<RunListRowDto[]> {
  if (limit <= 0) return [];
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
    .limit(limit);
  return rows.map((row) => ({ ...row, createdAt: row.createdAt.toISOString(), signOff: SIGN_OFF_STATES[row.signOff] }));
}

/**
 * By job number with many matches: no index of runs holds the job number, so rather than sort them all, the jobs are
 * walked in order (a few hundred) and each one's runs read by their (job, time) index until the page is full.
 */
async function walkJobs(where: SQL[], dir: SortDirection, after: RunCursor | undefined, limit: number) {
  const from =
    after?.sort === "job" ? (dir === "asc" ? gte(jobs.jobNumber, after.key) : lte(jobs.jobNumber, after.key)) : undefined;
  const ordered = await currentDb()
    .select({ id: jobs.id, jobNumber: jobs.jobNumber })
    .from(jobs)
    .where(from)
    .orderBy(dir === "asc" ? asc(jobs.jobNumber) : desc(jobs.jobNumber));
  const rows: RunListRowDto[] = [];
  for (const job of ordered) {
    const within = [...where, eq(runs.jobId, job.id)];
    if (after?.sort === "job" && job.jobNumber === after.key)
      within.push(...afterCursor({ sort: "date", createdAt: after.createdAt, id: after.id }, dir));
    rows.push(...(await selectRows(within, "date", dir, limit - rows.length)));
    if (rows.length >= limit) break;
  }
  return rows;
}

/** `limit` rows at most, in the order asked for (newest first unless told), after the cursor when one is given. */
export async function listRuns(filter: RunFilter): Promise<RunListRowDto[]> {
  const sort = filter.sort ?? "date";
  const dir = filter.dir ?? "desc";
  if (filter.after && filter.after.sort !== sort) throw new Error("listRuns: the cursor was written for another order");
  const where = await conditionsOf(filter);
  if (!where) return [];
  if (sort === "job" && !filter.jobId && !filter.jobNumber) {
    // Few matches are sorted in one query; many are read job by job (each way costs a few milliseconds).
    const [{ n }] = await currentDb()
      .select({ n: sql<number>`count(*)`.mapWith(Number) })
      .from(
        currentDb()
          .select({ one: sql`1` })
          .from(runs)
          .where(where.length > 0 ? and(...where) : undefined)
          .limit(JOB_WALK_FROM)
          .as("matching"),
      );
    if (n >= JOB_WALK_FROM) return walkJobs(where, dir, filter.after, filter.limit);
  }
  return selectRows([...where, ...(filter.after ? afterCursor(filter.after, dir) : [])], sort, dir, filter.limit);
}

/** The cursor that continues a list after `row`, in the order it was read in. */
export function cursorAfter(row: RunListRowDto, sort: RunSort): RunCursor {
  const tail = { createdAt: row.createdAt, id: row.id };
  if (sort === "utilisation") return { sort, key: row.maxUtilisation, ...tail };
  if (sort === "job") return { sort, key: row.jobNumber, ...tail };
  return { sort, ...tail };
}
