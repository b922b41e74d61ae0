import "server-only";
// Jobs: everyone in the firm but admins reads them; engineers and leads create them and change their details and
// status. The job number is unique in the firm (case aside). The responsible engineer, who approves the job's
// calcs, is an active engineer or lead. A closed job takes no new design runs (lib/use-cases/runs.ts).
import { AppError } from "@/lib/domain/errors";
import { createJobSchema, jobRefSchema, listJobsSchema, updateJobSchema } from "@/lib/domain/schemas/jobs";
import { z } from "@/lib/domain/zod";
import {
  getJob,
  insertJob,
  jobNumberTaken,
  listEngineers,
  listJobs,
  updateJob as updateJobRow,
  type JobDto,
} from "@/lib/data/jobs";
import { defineUseCase } from "./use-case";

const numberTaken = (jobNumber: string) =>
  new AppError("conflict", `Job ${jobNumber} exists already.`, {
    fieldErrors: { jobNumber: ["Another job has this number; job numbers are unique in the firm."] },
  });

async function responsibleEngineerOrThrow(id: string): Promise<{ id: string; name: string }> {
  const person = (await listEngineers()).find((p) => p.id === id);
  if (!person)
    throw new AppError("invalid-input", "Choose an active engineer or lead as the responsible engineer.", {
      fieldErrors: { responsibleEngineerId: ["Choose an active engineer or lead: they approve the job's calcs."] },
    });
  return person;
}

export const readJobs = defineUseCase({
  name: "jobs.list",
  permission: "jobs.read",
  input: listJobsSchema,
  run: async ({ q, status, limit }) => listJobs({ search: q, status, limit }),
  audit: null,
});

export const readJob = defineUseCase({
  name: "jobs.read",
  permission: "jobs.read",
  input: jobRefSchema,
  run: async ({ jobNumber }): Promise<JobDto> => {
    const job = await getJob({ jobNumber });
    if (!job) throw new AppError("not-found", `There is no job ${jobNumber}.`);
    return job;
  },
  audit: null,
});

/** The people a job's form offers as its responsible engineer. */
export const readJobPeople = defineUseCase({
  name: "jobs.people",
  permission: "jobs.create",
  input: z.object({}).default({}),
  run: async () => listEngineers(),
  audit: null,
});

export const createJob = defineUseCase({
  name: "jobs.create",
  permission: "jobs.create",
  input: createJobSchema,
  run: async (input, { actor }) => {
    if (await jobNumberTaken(input.jobNumber)) throw numberTaken(input.jobNumber);
    await responsibleEngineerOrThrow(input.responsibleEngineerId);
    const job = await insertJob({ ...input, createdById: actor.id });
    return { jobId: job.id, jobNumber: job.jobNumber, name: input.name };
  },
  audit: ({ result }) => ({
    action: "jobs.create",
    subject: `job:${result.jobId}`,
    details: { jobNumber: result.jobNumber, name: result.name },
  }),
});

const EDITABLE = ["jobNumber", "name", "client", "site", "responsibleEngineerId", "status"] as const;

export const updateJob = defineUseCase({
  name: "jobs.update",
  permission: "jobs.edit",
  input: updateJobSchema,
  run: async ({ jobId, ...fields }) => {
    const before = await getJob({ id: jobId });
    if (!before) throw new AppError("not-found", "That job does not exist.");
    if (fields.jobNumber !== before.jobNumber && (await jobNumberTaken(fields.jobNumber, jobId)))
      throw numberTaken(fields.jobNumber);
    if (fields.responsibleEngineerId !== before.responsibleEngineerId)
      await responsibleEngineerOrThrow(fields.responsibleEngineerId);
    const changes: Record<string, [string | null, string | null]> = {};
    for (const key of EDITABLE) if (before[key] !== fields[key]) changes[key] = [before[key], fields[key]];
    if (Object.keys(changes).length > 0) await updateJobRow(jobId, fields);
    return { jobId, jobNumber: fields.jobNumber, changes };
  },
  audit: ({ result }) =>
    Object.keys(result.changes).length === 0
      ? null
      : {
          action: "jobs.update",
          subject: `job:${result.jobId}`,
          details: { jobNumber: result.jobNumber, changes: result.changes },
        },
});
