import "server-only";
// Jobs: rows for the lists and the job page, and the row changes the job use cases make (lib/use-cases/jobs.ts
// checks permissions and writes the audit events). Everyone in the firm but admins reads jobs.
import { and, asc, desc, eq, ilike, or, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { jobs, runs, user, type JobStatus } from "@/db/schema";
import { versionStatusById, type VersionStatus } from "./standards";
import { prepared } from "./prepared";
import { currentDb } from "./transaction";

export type JobDto = {
  id: string;
  jobNumber: string;
  name: string;
  client: string | null;
  site: string | null;
  status: JobStatus;
  responsibleEngineerId: string | null;
  responsibleEngineerName: string | null;
  createdByName: string | null;
  createdAt: string;
  updatedAt: string;
  runCount: number;
};

/** What running a standard in a job needs of the job: its record names it, and a closed job takes no design runs. */
export type JobToRun = Pick<JobDto, "id" | "jobNumber" | "name" | "status">;

const responsible = alias(user, "responsible");
const creator = alias(user, "creator");

function selectJobs() {
  return currentDb()
    .select({
      id: jobs.id,
      jobNumber: jobs.jobNumber,
      name: jobs.name,
      client: jobs.client,
      site: jobs.site,
      status: jobs.status,
      responsibleEngineerId: jobs.responsibleEngineerId,
      responsibleEngineerName: responsible.name,
      createdByName: creator.name,
      createdAt: jobs.createdAt,
      updatedAt: jobs.updatedAt,
      runCount: sql<number>`(select count(*) from ${runs} where ${runs.jobId} = ${jobs.id})`.mapWith(Number),
    })
    .from(jobs)
    .leftJoin(responsible, eq(responsible.id, jobs.responsibleEngineerId))
    .leftJoin(creator, eq(creator.id, jobs.createdById));
}

type JobRow = Awaited<ReturnType<ReturnType<typeof selectJobs>["execute"]>>[number];

function toJobDto(row: JobRow): JobDto {
  return { ...row, createdAt: row.createdAt.toISOString(), updatedAt: row.updatedAt.toISOString() };
}

/** Newest first; `search` matches the job number, name, client or site (case aside); `status` filters. */
export async function listJobs({ limit, search, status }: { limit?: number; search?: string; status?: JobStatus } = {}): Promise<
  JobDto[]
> {
  const where: SQL[] = [];
  if (status) where.push(eq(jobs.status, status));
  if (search) {
    const pattern = `%${search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(
      or(ilike(jobs.jobNumber, pattern), ilike(jobs.name, pattern), ilike(jobs.client, pattern), ilike(jobs.site, pattern))!,
    );
  }
  const query = selectJobs()
    .where(where.length > 0 ? and(...where) : undefined)
    .orderBy(desc(jobs.createdAt), desc(jobs.jobNumber));
  const rows = limit ? await query.limit(limit) : await query;
  return rows.map(toJobDto);
}

export async function countJobs(): Promise<number> {
  const [row] = await currentDb()
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(jobs);
  return row.n;
}

export async function getJob(where: { id: string } | { jobNumber: string }): Promise<JobDto | null> {
  const [row] = await selectJobs().where("id" in where ? eq(jobs.id, where.id) : eq(jobs.jobNumber, where.jobNumber));
  return row ? toJobDto(row) : null;
}

// Without the job's run count, which a job of many runs makes costly to read. A run reads its job with its version
// (getVersionWithJob); this read names the missing one when there is no such version.
const jobToRunById = prepared("gusset_job_to_run", (executor) =>
  executor
    .select({ id: jobs.id, jobNumber: jobs.jobNumber, name: jobs.name, status: jobs.status })
    .from(jobs)
    .where(eq(jobs.id, sql.placeholder("id"))),
);

/** The job a run is asked for, as running needs it, or null. */
export async function getJobToRun(id: string): Promise<JobToRun | null> {
  const [row] = await jobToRunById({ id });
  return row ?? null;
}

/**
 * Locks the job's row for the rest of a batch re-run's transaction and reads, in the same round trip, the status of
 * the version to be run: a version withdrawn since the evaluation began refuses the re-run. `versionStatus` is null
 * when there is no such version. (A person's run takes the lock in the statement that stores it: storeRunUnderJobLock.)
 */
export async function lockJobForRun(
  id: string,
  versionId: string,
): Promise<{ id: string; status: JobStatus; jobNumber: string; versionStatus: VersionStatus | null } | null> {
  const [row] = await currentDb()
    .select({ id: jobs.id, status: jobs.status, jobNumber: jobs.jobNumber, versionStatus: versionStatusById(versionId) })
    .from(jobs)
    .where(eq(jobs.id, id))
    .for("update");
  return row ?? null;
}

export async function jobNumberTaken(jobNumber: string, exceptId?: string): Promise<boolean> {
  const [row] = await currentDb()
    .select({ id: jobs.id })
    .from(jobs)
    .where(sql`lower(${jobs.jobNumber}) = lower(${jobNumber})`);
  return row !== undefined && row.id !== exceptId;
}

export async function insertJob(values: typeof jobs.$inferInsert): Promise<{ id: string; jobNumber: string }> {
  const [row] = await currentDb().insert(jobs).values(values).returning({ id: jobs.id, jobNumber: jobs.jobNumber });
  return row;
}

export async function updateJob(
  id: string,
  set: Partial<Pick<typeof jobs.$inferInsert, "jobNumber" | "name" | "client" | "site" | "responsibleEngineerId" | "status">>,
): Promise<void> {
  await currentDb()
    .update(jobs)
    .set({ ...set, updatedAt: sql`now()` })
    .where(eq(jobs.id, id));
}

/** The people who may be a job's responsible engineer: active engineers and leads, by name. */
export async function listEngineers(): Promise<{ id: string; name: string; role: string }[]> {
  return currentDb()
    .select({ id: user.id, name: user.name, role: user.role })
    .from(user)
    .where(and(sql`${user.deactivatedAt} is null`, sql`${user.role} in ('engineer', 'lead')`))
    .orderBy(asc(user.name));
}
