"use server";
// Jobs and runs as forms. Each action is a use case (lib/use-cases/jobs.ts, runs.ts); the person is taken to the
// job, or to the run's results, once the change has committed.
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { serverAction } from "@/lib/use-cases/next";
import { createJob, updateJob } from "@/lib/use-cases/jobs";
import { createRun } from "@/lib/use-cases/runs";

export const createJobAction = serverAction(createJob, {
  then: ({ jobNumber }) => redirect(`/jobs/${encodeURIComponent(jobNumber)}`),
});

export const updateJobAction = serverAction(updateJob, {
  then: ({ jobNumber }) => {
    revalidatePath("/jobs", "layout");
    redirect(`/jobs/${encodeURIComponent(jobNumber)}`);
  },
});

/** A run that failed in the engine is stored too: either way the person sees the run's page. */
export const createRunAction = serverAction(createRun, {
  then: ({ id }) => redirect(`/runs/${id}`),
});
