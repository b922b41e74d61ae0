import "server-only";
// Runs: the append-only rows a run use case writes (lib/use-cases/runs.ts) and what lists and the run page read.
// A run's record is stored as the canonical text that was hashed; lists read only the columns copied from it.
import { and, eq, sql } from "drizzle-orm";
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
import { prepared } from "./prepared";
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
  /** Its standard version, or a library version or entry it used, has been withdrawn (see its impact report). */
  withdrawn: boolean;
};

export type RunDto = RunSummaryDto & {
  /** The canonical record as stored (the bytes that were hashed). */
  record: string;
};

export const summaryColumns = {
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
  // Two probes on unique and primary-key indexes: a page of runs pays a few index lookups per row.
  withdrawn: sql<boolean>`(exists (select 1 from withdrawals w where w.standard_version_id = ${runs.versionId})
    or exists (select 1 from run_library_entries rle join library_version_entries e on e.id = rle.entry_id
                 join withdrawals w on w.library_entry_id = e.id or w.library_version_id = e.version_id
                where rle.run_id = ${runs.id}))`.mapWith(Boolean),
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

/** A run's row: every column a run is written with (the rest take their defaults). */
export type NewRun = Required<
  Pick<
    typeof runs.$inferInsert,
    | "id"
    | "jobId"
    | "versionId"
    | "outcome"
    | "pass"
    | "maxUtilisation"
    | "purpose"
    | "parentRunId"
    | "unitSystem"
    | "record"
    | "recordSha256"
    | "recordBytes"
    | "createdById"
    | "createdAt"
  >
>;

// Prepared: every run writes one (lib/data/prepared.ts).
const insertRunRow = prepared<NewRun, unknown>("gusset_insert_run", (executor) =>
  executor.insert(runs).values({
    id: sql.placeholder("id"),
    jobId: sql.placeholder("jobId"),
    versionId: sql.placeholder("versionId"),
    outcome: sql.placeholder("outcome"),
    pass: sql.placeholder("pass"),
    maxUtilisation: sql.placeholder("maxUtilisation"),
    purpose: sql.placeholder("purpose"),
    parentRunId: sql.placeholder("parentRunId"),
    unitSystem: sql.placeholder("unitSystem"),
    record: sql.placeholder("record"),
    recordSha256: sql.placeholder("recordSha256"),
    recordBytes: sql.placeholder("recordBytes"),
    createdById: sql.placeholder("createdById"),
    createdAt: sql.placeholder("createdAt"),
  }),
);

export async function insertRun(values: NewRun): Promise<void> {
  await insertRunRow(values);
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
  return { ...row, record: (await getRunRecord(id))! };
}

/** A run's canonical record as stored, alone. */
export async function getRunRecord(id: string): Promise<string | null> {
  const [row] = await currentDb().select({ record: runs.record }).from(runs).where(eq(runs.id, id));
  return row?.record ?? null;
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
