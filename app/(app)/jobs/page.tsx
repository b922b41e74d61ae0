import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readProjects } from "@/lib/use-cases/reads";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDate } from "@/components/format-date";

export const metadata: Metadata = { title: "Jobs" };

// A job is the trade's word for a project; the tables and permissions still say "projects" until the
// jobs work reshapes them.
export default async function JobsPage() {
  const actor = await requirePageActor("projects.read", { next: "/jobs" });
  const jobs = await runUseCase(readProjects, { actor, input: {} });

  return (
    <>
      <PageHeader
        title="Jobs"
        lead="The firm's jobs, by job number. Standards are run inside a job, so that every calc sheet belongs to one."
      />
      {jobs.length === 0 ? (
        <EmptyState title="No jobs yet">Jobs appear here with their job numbers once they are created.</EmptyState>
      ) : (
        <TableFrame testId="jobs-table" label="Jobs" headings={["Job number", "Job", "Client", "Created"]}>
          {jobs.map((job) => (
            <tr key={job.id} data-testid="job-row" data-job-number={job.jobNumber}>
              <td className="px-4 py-3 font-mono text-sm font-medium whitespace-nowrap text-plate-800 tabular">
                {job.jobNumber}
              </td>
              <td className="px-4 py-3 text-ink-900">{job.name}</td>
              <td className="px-4 py-3 text-ink-700">{job.client ?? "—"}</td>
              <td className="px-4 py-3 whitespace-nowrap text-ink-500 tabular">{formatDate(job.createdAt)}</td>
            </tr>
          ))}
        </TableFrame>
      )}
      <section className="mt-10">
        <EmptyState
          title="Coming to jobs"
          testId="jobs-coming"
          items={[
            "Creating a job with its job number.",
            "The runs made in each job, with their calc sheets and sign-off.",
            "Files attached to a job's runs.",
          ]}
        />
      </section>
    </>
  );
}
