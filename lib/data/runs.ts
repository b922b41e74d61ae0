import "server-only";
// Runs: the append-only rows a run use case writes (lib/use-cases/runs.ts) and what lists and the run page read.
// A run's record is stored as the canonical text that was hashed; lists read only the columns copied from it.
import { and, eq, sql } from "drizzle-orm";
import type { AuditEventInput } from "@/lib/domain/audit-actions";
import {
  auditEvents,
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
  type JobStatus,
  type UnitSystem,
} from "@/db/schema";
import { preparedSql } from "./prepared";
import { versionStatusById, type VersionStatus } from "./standards";
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

/** A batch re-run's row, in the batch's transaction (a person's run is stored by storeRunUnderJobLock, below). */
export async function insertRun(values: NewRun): Promise<void> {
  await currentDb().insert(runs).values(values);
}

/** A library entry a run used, as its row in run_library_entries names it. */
export type RunEntryRow = { inputKey: string; entryId: string; entryHash: string };

const p = (name: string) => sql.placeholder(name);

// One statement stores a person's run: it locks the job's row, and only while the job is open, its number is still the
// one the record names and the version is not withdrawn, writes the run, the library entries it used and its audit
// event. PostgreSQL makes a statement atomic by itself, so no transaction is opened (two round trips fewer on every
// run). Rows inserted by the WITH queries are seen by their foreign keys at the statement's end.
const storeRunStatement = preparedSql<
  Record<string, unknown>,
  { status: JobStatus; job_number: string; version_status: VersionStatus | null; stored: boolean }
>(
  "gusset_store_run",
  sql`with job as (
  select ${jobs.id} as id, ${jobs.status} as status, ${jobs.jobNumber} as job_number,
         ${versionStatusById(p("versionId"))} as version_status
    from ${jobs} where ${jobs.id} = ${p("jobId")}::uuid
     for update
), run as (
  insert into ${runs} (id, job_id, version_id, outcome, pass, max_utilisation, purpose, parent_run_id, unit_system, record,
                       record_sha256, record_bytes, created_by_id, created_at)
  select ${p("id")}::uuid, job.id, ${p("versionId")}::uuid, ${p("outcome")}::text, ${p("pass")}::boolean,
         ${p("maxUtilisation")}::float8, ${p("purpose")}::text, ${p("parentRunId")}::uuid, ${p("unitSystem")}::text,
         ${p("record")}::text, ${p("recordSha256")}::text, ${p("recordBytes")}::integer, ${p("createdById")}::text,
         ${p("createdAt")}::timestamptz
    from job
   where job.status <> 'closed' and job.job_number = ${p("jobNumber")}::text
     and job.version_status is distinct from 'withdrawn'
  returning id
), entries as (
  insert into ${runLibraryEntries} (run_id, input_key, entry_id, entry_hash)
  select run.id, e.input_key, e.entry_id, e.entry_hash
    from run, unnest(${p("entryInputKeys")}::text[], ${p("entryIds")}::uuid[], ${p("entryHashes")}::text[])
           as e(input_key, entry_id, entry_hash)
), audit as (
  insert into ${auditEvents} (actor_id, actor_email, action, subject, details, ip_address)
  select ${p("actorId")}::text, ${p("actorEmail")}::text, ${p("action")}::text, ${p("subject")}::text,
         ${p("details")}::jsonb, ${p("ipAddress")}::text
    from run
)
select job.status, job.job_number, job.version_status, exists (select from run) as stored from job`,
);

/**
 * Stores a person's (design) run, the library entries it used and its audit event in one statement, under the job's lock (see
 * above). Null when there is no such job; `stored: false` with what the lock read when the job was closed, renumbered
 * or the version withdrawn since the caller read them: nothing was written.
 */
export async function storeRunUnderJobLock(
  row: NewRun,
  jobNumber: string,
  entries: readonly RunEntryRow[],
  event: AuditEventInput,
): Promise<{ stored: boolean; status: JobStatus; jobNumber: string; versionStatus: VersionStatus | null } | null> {
  const [result] = await storeRunStatement({
    ...row,
    jobNumber,
    entryInputKeys: entries.map((e) => e.inputKey),
    entryIds: entries.map((e) => e.entryId),
    entryHashes: entries.map((e) => e.entryHash),
    actorId: event.actorId ?? null,
    actorEmail: event.actorEmail ?? null,
    action: event.action,
    subject: event.subject ?? null,
    details: JSON.stringify(event.details ?? {}),
    ipAddress: event.ipAddress ?? null,
  });
  if (!result) return null;
  return { stored: result.stored, status: result.status, jobNumber: result.job_number, versionStatus: result.version_status };
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
