import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { runUseCase } from "@/lib/use-cases/run";
import { readJob } from "@/lib/use-cases/jobs";
import { readRuns } from "@/lib/use-cases/runs";
import { listStandards } from "@/lib/use-cases/standards";
import { readCalcPackage } from "@/lib/use-cases/calcs";
import { ISSUE_STATUS_LABELS, type IssueStatusId } from "@/lib/domain/schemas/calcs";
import { TableFrame } from "@/components/ui/table";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { buttonClasses } from "@/components/ui/button";
import { orNotFound } from "../../_components/or-not-found";
import { JobStatusBadge } from "../_components/job-status";
import { RunList } from "../../runs/_components/run-list";
import { Section } from "@/components/ui/section";
import { Attachments } from "@/components/jobs/attachments";
import { readAttachments } from "@/lib/use-cases/files";

export const metadata: Metadata = { title: "Job" };

export default async function JobPage({ params }: PageProps<"/jobs/[jobNumber]">) {
  const { jobNumber } = await params;
  const number = decodeURIComponent(jobNumber);
  const actor = await requirePageActor("jobs.read", { next: `/jobs/${encodeURIComponent(number)}` });
  const job = await orNotFound(() => runUseCase(readJob, { actor, input: { jobNumber: number } }));
  const { runs, nextCursor } = await runUseCase(readRuns, { actor, input: { job: job.jobNumber, limit: 50 } });
  const runs_ = can(actor.role, "runs.create");
  const standards = runs_ ? (await runUseCase(listStandards, { actor, input: {} })).standards : [];
  const runnable = standards.filter((item) => item.current.status !== "withdrawn");
  const base = `/jobs/${encodeURIComponent(job.jobNumber)}`;
  const calcs = await runUseCase(readCalcPackage, { actor, input: { jobId: job.id } });
  const attachments = await runUseCase(readAttachments, { actor, input: { jobId: job.id, runId: null } });

  return (
    <>
      <PageHeader
        title={`${job.jobNumber} · ${job.name}`}
        lead={[job.client, job.site].filter(Boolean).join(" · ") || undefined}
        actions={
          can(actor.role, "jobs.edit") ? (
            <Link href={`${base}/edit`} className={buttonClasses("secondary")} data-testid="edit-job">
              Edit job
            </Link>
          ) : null
        }
      />
      <dl
        className="grid gap-x-8 gap-y-2 rounded-plate bg-paper-raised p-4 text-sm shadow-sheet ring-1 ring-ink-200 sm:grid-cols-[auto_minmax(0,1fr)]"
        data-testid="job-meta"
      >
        <dt className="text-ink-500">Status</dt>
        <dd>
          <JobStatusBadge status={job.status} />
        </dd>
        <dt className="text-ink-500">Responsible engineer</dt>
        <dd data-testid="job-responsible-name">{job.responsibleEngineerName ?? "Not named yet: edit the job to name one."}</dd>
        <dt className="text-ink-500">Created by</dt>
        <dd>{job.createdByName ?? "—"}</dd>
      </dl>

      {runs_ ? (
        <section aria-labelledby="run-heading" className="mt-10">
          <h2 id="run-heading" className="mb-3 text-lg font-semibold text-ink-900">
            Run a standard
          </h2>
          {job.status === "closed" ? (
            <p className="rounded-plate bg-ink-100 p-4 text-ink-700" data-testid="job-closed">
              This job is closed: it takes no new design runs. Reopen it (Edit job) to run in it.
            </p>
          ) : runnable.length === 0 ? (
            <p className="text-ink-700">No standard is published yet.</p>
          ) : (
            <ul className="grid gap-2 sm:grid-cols-2" data-testid="runnable-standards">
              {runnable.map(({ slug, current }) => (
                <li key={slug}>
                  <Link
                    href={`${base}/run/${slug}`}
                    className="block rounded-plate bg-paper-raised p-3 ring-1 ring-ink-200 hover:ring-plate-500"
                    data-testid="run-standard-link"
                    data-slug={slug}
                  >
                    <span className="font-medium text-plate-800">{current.title}</span>{" "}
                    <span className="font-mono text-xs text-ink-500">v{current.number}</span>
                    <span className="block text-xs text-ink-500">{current.summary}</span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </section>
      ) : null}

      <section aria-labelledby="calcs-heading" className="mt-10">
        <h2 id="calcs-heading" className="mb-3 text-lg font-semibold text-ink-900">
          Calc package
        </h2>
        {calcs.length === 0 ? (
          <p className="text-sm text-ink-700">
            No calcs yet. A calc is numbered and issued from the page of the run that is its design of record.
          </p>
        ) : (
          <TableFrame
            testId="calc-package"
            label="Calc package"
            headings={["Calc", "Current revision", "Issue status", "Prepared", "Checked", "Approved"]}
          >
            {calcs.map((calc) => {
              const current = calc.revisions.at(-1);
              const by = (kind: string) => current?.events.find((e) => e.kind === kind)?.actorName ?? "—";
              return (
                <tr key={calc.id} data-testid="calc-row" data-number={calc.number}>
                  <td className="px-4 py-3">
                    <span className="font-mono text-sm font-medium">{calc.number}</span>
                    <span className="block text-xs text-ink-500">{calc.title}</span>
                  </td>
                  <td className="px-4 py-3">
                    {current ? (
                      <Link href={`/runs/${current.runId}`} className="text-plate-700 hover:underline">
                        rev {current.letter}
                      </Link>
                    ) : (
                      "—"
                    )}
                  </td>
                  <td className="px-4 py-3 text-ink-700">
                    {current?.issueStatus ? ISSUE_STATUS_LABELS[current.issueStatus as IssueStatusId] : "—"}
                    {current && current.state !== "approved" ? (
                      <span className="block text-xs text-ink-500">
                        {current.state === "returned"
                          ? "returned"
                          : current.state === "awaiting-check"
                            ? "being checked"
                            : "awaiting approval"}
                      </span>
                    ) : null}
                  </td>
                  <td className="px-4 py-3 text-ink-700">{by("prepared")}</td>
                  <td className="px-4 py-3 text-ink-700">{by("checked")}</td>
                  <td className="px-4 py-3 text-ink-700">{by("approved")}</td>
                </tr>
              );
            })}
          </TableFrame>
        )}
      </section>

      <section aria-labelledby="runs-heading" className="mt-10">
        <h2 id="runs-heading" className="mb-3 text-lg font-semibold text-ink-900">
          Runs in this job
        </h2>
        {runs.length === 0 ? (
          <EmptyState title="No runs yet">
            Each run of a standard in this job is kept here for good, with its calc sheet.
          </EmptyState>
        ) : (
          <RunList first={{ runs, nextCursor }} filter={{ job: job.jobNumber }} showJob={false} />
        )}
      </section>
      <Section title="Attachments" id="attachments-heading">
        <Attachments
          jobNumber={job.jobNumber}
          runId={null}
          attachments={attachments}
          canAttach={can(actor.role, "files.attach")}
        />
      </Section>
    </>
  );
}
