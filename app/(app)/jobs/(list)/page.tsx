import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { JOB_STATUS_IDS, JOB_STATUS_LABELS, type JobStatusId } from "@/lib/domain/schemas/jobs";
import { runUseCase } from "@/lib/use-cases/run";
import { readJobs } from "@/lib/use-cases/jobs";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { EmptyState } from "@/components/ui/empty-state";
import { Button, buttonClasses } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { formatDate } from "@/components/format-date";
import { JobStatusBadge } from "../_components/job-status";

export const metadata: Metadata = { title: "Jobs" };

export default async function JobsPage({ searchParams }: PageProps<"/jobs">) {
  const actor = await requirePageActor("jobs.read", { next: "/jobs" });
  const params = await searchParams;
  const one = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value)?.slice(0, 100) ?? "";
  const q = one(params.q).trim();
  const status = (JOB_STATUS_IDS as readonly string[]).includes(one(params.status))
    ? (one(params.status) as JobStatusId)
    : undefined;
  const jobs = await runUseCase(readJobs, { actor, input: { q: q || undefined, status } });
  const creates = can(actor.role, "jobs.create");

  return (
    <>
      <PageHeader
        title="Jobs"
        lead="The firm's jobs, by job number. Standards are run inside a job, so that every calc sheet belongs to one."
        actions={
          creates ? (
            <Link href="/jobs/new" className={buttonClasses("primary")} data-testid="new-job">
              New job
            </Link>
          ) : null
        }
      />
      <form method="get" className="mb-4 grid items-end gap-3 sm:grid-cols-[minmax(0,1fr)_12rem_auto]" data-testid="jobs-filter">
        <TextField label="Search job number, name, client or site" name="q" defaultValue={q} data-testid="jobs-search" />
        <SelectField label="Status" name="status" defaultValue={status ?? ""}>
          <option value="">Any status</option>
          {JOB_STATUS_IDS.map((value) => (
            <option key={value} value={value}>
              {JOB_STATUS_LABELS[value]}
            </option>
          ))}
        </SelectField>
        <Button type="submit" variant="secondary">
          Filter
        </Button>
      </form>
      {jobs.length === 0 ? (
        q || status ? (
          <p className="rounded-plate bg-paper-raised px-4 py-6 text-ink-700 ring-1 ring-ink-200" data-testid="jobs-none">
            No job matches these filters.
          </p>
        ) : (
          <EmptyState title="No jobs yet">
            {creates
              ? "Create one with New job: its number, name, client, site and the engineer who approves its calcs."
              : "Jobs appear here with their job numbers once engineers create them."}
          </EmptyState>
        )
      ) : (
        <TableFrame
          testId="jobs-table"
          label="Jobs"
          headings={["Job number", "Job", "Client", "Responsible engineer", "Status", "Runs", "Created"]}
        >
          {jobs.map((job) => (
            <tr key={job.id} data-testid="job-row" data-job-number={job.jobNumber}>
              <td className="px-4 py-3 font-mono text-sm font-medium whitespace-nowrap tabular">
                <Link
                  href={`/jobs/${encodeURIComponent(job.jobNumber)}`}
                  className="text-plate-800 hover:underline"
                  data-testid="job-link"
                >
                  {job.jobNumber}
                </Link>
              </td>
              <td className="px-4 py-3 text-ink-900">
                {job.name}
                {job.site ? <p className="text-xs text-ink-500">{job.site}</p> : null}
              </td>
              <td className="px-4 py-3 text-ink-700">{job.client ?? "—"}</td>
              <td className="px-4 py-3 text-ink-700">{job.responsibleEngineerName ?? "Not named"}</td>
              <td className="px-4 py-3">
                <JobStatusBadge status={job.status} />
              </td>
              <td className="px-4 py-3 text-ink-700 tabular">{job.runCount}</td>
              <td className="px-4 py-3 whitespace-nowrap text-ink-500 tabular">{formatDate(job.createdAt)}</td>
            </tr>
          ))}
        </TableFrame>
      )}
    </>
  );
}
