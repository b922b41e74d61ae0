import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readJob, readJobPeople } from "@/lib/use-cases/jobs";
import { PageHeader } from "@/components/ui/page-header";
import { orNotFound } from "../../../_components/or-not-found";
import { JobForm } from "../../_components/job-form";

export const metadata: Metadata = { title: "Edit job" };

export default async function EditJobPage({ params }: PageProps<"/jobs/[jobNumber]/edit">) {
  const number = decodeURIComponent((await params).jobNumber);
  const actor = await requirePageActor("jobs.edit", { next: `/jobs/${encodeURIComponent(number)}/edit` });
  const job = await orNotFound(() => runUseCase(readJob, { actor, input: { jobNumber: number } }));
  const people = await runUseCase(readJobPeople, { actor, input: {} });
  return (
    <>
      <PageHeader title={`Edit ${job.jobNumber}`} lead="Every change is recorded in the audit trail with who made it." />
      <JobForm
        people={people}
        job={{
          jobId: job.id,
          jobNumber: job.jobNumber,
          name: job.name,
          client: job.client,
          site: job.site,
          responsibleEngineerId: job.responsibleEngineerId ?? "",
          status: job.status,
        }}
      />
    </>
  );
}
