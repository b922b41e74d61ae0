import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readJobPeople } from "@/lib/use-cases/jobs";
import { PageHeader } from "@/components/ui/page-header";
import { JobForm } from "../_components/job-form";

export const metadata: Metadata = { title: "New job" };

export default async function NewJobPage() {
  const actor = await requirePageActor("jobs.create", { next: "/jobs/new" });
  const people = await runUseCase(readJobPeople, { actor, input: {} });
  return (
    <>
      <PageHeader
        title="New job"
        lead="A job holds the runs, calcs and files of one commission, under the number the drawings carry."
      />
      <JobForm people={people} />
    </>
  );
}
