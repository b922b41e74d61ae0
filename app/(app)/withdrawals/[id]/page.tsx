import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { OUTCOME_LABELS } from "@/lib/domain/schemas/withdrawals";
import { ISSUE_STATUS_LABELS, type IssueStatusId } from "@/lib/domain/schemas/calcs";
import { runUseCase } from "@/lib/use-cases/run";
import { maySignOutcome, readImpactReport, readVersionWithdrawal } from "@/lib/use-cases/withdrawals";
import { readBatchProgress } from "@/lib/use-cases/batch-reruns";
import { displayUtilisation } from "@/lib/standards/utilisation";
import { PageHeader } from "@/components/ui/page-header";
import { Section } from "@/components/ui/section";
import { TableFrame } from "@/components/ui/table";
import { Badge } from "@/components/ui/badge";
import { LocalTime } from "@/components/local-time";
import { orNotFound } from "../../_components/or-not-found";
import { RunOutcomeBadge } from "../../runs/_components/run-outcome";
import { BatchPanel } from "./_components/batch-panel";
import { OutcomeForm } from "./_components/outcome-form";
import { SuccessorForm } from "./_components/successor-form";

export const metadata: Metadata = { title: "Impact report" };

const STATE_WORDS = {
  "awaiting-check": "waiting for its check",
  returned: "returned, never issued",
  "awaiting-approval": "checked",
  approved: "approved",
} as const;

/** Runs listed on the page; the rest are counted (the batch re-runs them all). */
const RUNS_SHOWN = 200;

/**
 * A withdrawal's impact report: every calc revision, job, run and person that used what was withdrawn, issued calcs
 * first with the outcome signed for each (and which are still open), then the batch re-run on the successor.
 */
export default async function ImpactReportPage({ params }: PageProps<"/withdrawals/[id]">) {
  const { id } = await params;
  const actor = await requirePageActor("runs.read", { next: `/withdrawals/${encodeURIComponent(id)}` });
  const report = await orNotFound(() => runUseCase(readImpactReport, { actor, input: { id } }));
  const progress = await runUseCase(readBatchProgress, { actor, input: { id } });
  const { withdrawal, mapping, runs, revisions, jobs, people } = report;
  // A lead may name the successor of a withdrawn standard version later (again, if a better one comes out).
  const naming =
    withdrawal.subject === "standard-version" && can(actor.role, "templates.withdraw")
      ? await runUseCase(readVersionWithdrawal, { actor, input: { versionId: withdrawal.standardVersionId! } })
      : null;
  const open = revisions.filter((r) => r.open).length;
  const tracked = revisions.filter((r) => r.tracked).length;
  const successor = mapping?.successorVersionId
    ? `${mapping.successorTitle} v${mapping.successorNumber}`
    : mapping?.replacementEntryKey
      ? `the entry ${mapping.replacementEntryKey}`
      : null;
  const blocked =
    withdrawal.subject === "standard-version" && !mapping
      ? "No successor is named yet, so there is nothing to re-run on."
      : runs.length === 0
        ? "No run used it: there is nothing to re-run."
        : null;
  const subjectHref =
    withdrawal.subject === "standard-version"
      ? `/standards/${withdrawal.slug}/versions/${withdrawal.number}`
      : `/libraries/${withdrawal.slug}/versions/${withdrawal.number}`;

  return (
    <>
      <PageHeader
        title={`Impact report: ${withdrawal.label}`}
        lead={
          <>
            Withdrawn by {withdrawal.actorName ?? "—"}, <LocalTime iso={withdrawal.occurredAt} />. Reason: {withdrawal.reason}
          </>
        }
        actions={
          <Link href={subjectHref} className="text-sm text-plate-700 hover:underline">
            The withdrawn {withdrawal.subject === "standard-version" ? "version" : "library version"}
          </Link>
        }
      />
      <dl
        className="grid gap-x-8 gap-y-2 rounded-plate bg-paper-raised p-4 text-sm shadow-sheet ring-1 ring-ink-200 sm:grid-cols-[auto_minmax(0,1fr)]"
        data-testid="impact-summary"
      >
        <dt className="text-ink-500">Issued calc revisions</dt>
        <dd data-testid="impact-open">
          {tracked} ({open} still open)
        </dd>
        <dt className="text-ink-500">Jobs</dt>
        <dd data-testid="impact-jobs-count">{jobs.length}</dd>
        <dt className="text-ink-500">Runs</dt>
        <dd data-testid="impact-runs-count">{runs.length}</dd>
        <dt className="text-ink-500">People told</dt>
        <dd>{people.length}</dd>
        <dt className="text-ink-500">Replaced by</dt>
        <dd data-testid="impact-successor">{successor ?? "no successor named"}</dd>
        {mapping && mapping.successorVersionId ? (
          <>
            <dt className="text-ink-500">Inputs mapped</dt>
            <dd data-testid="impact-mapping">
              {Object.keys(mapping.mapping.rename).length +
                Object.keys(mapping.mapping.values).length +
                mapping.mapping.drop.length ===
              0
                ? "unchanged: every input carries over as it is"
                : null}
              <ul className="space-y-0.5">
                {Object.entries(mapping.mapping.rename).map(([from, to]) => (
                  <li key={from}>
                    <span className="font-mono">{from}</span> becomes <span className="font-mono">{to}</span>
                  </li>
                ))}
                {Object.entries(mapping.mapping.values).map(([key, value]) => (
                  <li key={key}>
                    new <span className="font-mono">{key}</span> = {String(value)}
                  </li>
                ))}
                {mapping.mapping.drop.map((key) => (
                  <li key={key}>
                    <span className="font-mono">{key}</span> dropped
                  </li>
                ))}
              </ul>
              <span className="text-xs text-ink-500">
                Declared by {mapping.declaredByName}, <LocalTime iso={mapping.declaredAt} />
              </span>
            </dd>
          </>
        ) : null}
      </dl>

      <Section title="Issued calc revisions" id="impact-revisions-heading">
        {revisions.length === 0 ? (
          <p className="text-sm text-ink-700">No calc revision used it.</p>
        ) : (
          <ul className="space-y-3" data-testid="impact-revisions">
            {revisions.map((revision) => {
              const last = revision.outcomes.at(-1);
              const label = `${revision.calcNumber} rev ${revision.letter}`;
              return (
                <li
                  key={revision.id}
                  className="rounded-plate bg-paper-raised p-3 ring-1 ring-ink-200"
                  data-testid="impact-revision"
                  data-revision-id={revision.id}
                  data-open={revision.open}
                >
                  <p className="flex flex-wrap items-center gap-2">
                    <span className="font-medium text-ink-900">
                      {revision.jobNumber} · {label}
                    </span>
                    <span className="text-sm text-ink-700">{revision.calcTitle}</span>
                    {revision.open ? (
                      <Badge tone="fault">Open</Badge>
                    ) : last ? (
                      <Badge tone="pass">{OUTCOME_LABELS[last.kind]}</Badge>
                    ) : (
                      <Badge>Not issued</Badge>
                    )}
                  </p>
                  <p className="text-sm text-ink-700">
                    {revision.issueStatus ? ISSUE_STATUS_LABELS[revision.issueStatus as IssueStatusId] : "—"},{" "}
                    {STATE_WORDS[revision.state]}. Prepared by {revision.preparerName}, checked by {revision.checkerName}.{" "}
                    <Link href={`/runs/${revision.runId}`} className="text-plate-700 hover:underline">
                      Its run
                    </Link>
                  </p>
                  {revision.outcomes.length > 0 ? (
                    <ol className="mt-1 text-sm text-ink-700" data-testid="impact-outcomes">
                      {revision.outcomes.map((o) => (
                        <li key={o.id}>
                          <span className="font-medium">{OUTCOME_LABELS[o.kind]}</span>
                          {o.reason ? `: ${o.reason}` : ""}
                          {o.newRevisionLabel ? ` (${o.newRevisionLabel})` : ""}
                          {o.reference ? ` (${o.reference})` : ""} — signed by {o.actorName}, <LocalTime iso={o.occurredAt} />
                        </li>
                      ))}
                    </ol>
                  ) : null}
                  {revision.tracked && maySignOutcome(actor, revision) ? (
                    <OutcomeForm
                      withdrawalId={withdrawal.id}
                      revisionId={revision.id}
                      label={label}
                      candidates={revision.candidates}
                    />
                  ) : null}
                </li>
              );
            })}
          </ul>
        )}
      </Section>

      <Section title="Jobs" id="impact-jobs-heading">
        <TableFrame
          testId="impact-jobs"
          label="Affected jobs"
          headings={["Job", "Status", "Responsible engineer", "Issued calcs", "Open", "Runs"]}
        >
          {jobs.map((job) => (
            <tr key={job.jobId} data-testid="impact-job" data-job-number={job.jobNumber}>
              <td className="px-4 py-3 font-mono text-sm whitespace-nowrap">
                <Link href={`/jobs/${encodeURIComponent(job.jobNumber)}`} className="text-plate-800 hover:underline">
                  {job.jobNumber}
                </Link>
                <span className="block font-sans text-xs text-ink-500">{job.jobName}</span>
              </td>
              <td className="px-4 py-3 text-sm">{job.jobStatus}</td>
              <td className="px-4 py-3 text-sm">{job.responsibleEngineerName ?? "—"}</td>
              <td className="px-4 py-3 text-sm tabular">{job.revisions}</td>
              <td className="px-4 py-3 text-sm tabular">{job.open}</td>
              <td className="px-4 py-3 text-sm tabular">{job.runs}</td>
            </tr>
          ))}
        </TableFrame>
      </Section>

      {naming && (!mapping || naming.successors.some((s) => s.id !== mapping.successorVersionId)) ? (
        <Section title={mapping ? "Name another successor" : "Name the successor"} id="impact-successor-heading">
          <SuccessorForm
            withdrawalId={withdrawal.id}
            number={withdrawal.number}
            inputs={naming.inputs}
            successors={naming.successors.filter((s) => s.id !== mapping?.successorVersionId)}
          />
        </Section>
      ) : null}

      <Section title="Batch re-run" id="impact-batch-heading">
        <BatchPanel
          withdrawalId={withdrawal.id}
          mappingId={mapping?.id ?? null}
          first={progress}
          canStart={can(actor.role, "withdrawals.rerun")}
          blocked={blocked}
        />
      </Section>

      <Section title="Runs" id="impact-runs-heading">
        <TableFrame
          testId="impact-runs"
          label="Affected runs"
          headings={["Job", "Run", "Standard", "By", "Result", "Largest utilisation"]}
        >
          {runs.slice(0, RUNS_SHOWN).map((run) => (
            <tr key={run.id} data-testid="impact-run" data-run-id={run.id}>
              <td className="px-4 py-3 font-mono text-sm whitespace-nowrap">{run.jobNumber}</td>
              <td className="px-4 py-3 whitespace-nowrap">
                <Link href={`/runs/${run.id}`} className="font-mono text-sm text-plate-800 hover:underline">
                  {run.id.slice(0, 8)}
                </Link>
                <span className="block text-xs text-ink-500">
                  <LocalTime iso={run.createdAt} />
                </span>
              </td>
              <td className="min-w-48 px-4 py-3 text-sm">
                {run.title} <span className="font-mono text-xs whitespace-nowrap text-ink-500">v{run.number}</span>
              </td>
              <td className="px-4 py-3 text-sm">{run.createdByName}</td>
              <td className="px-4 py-3">
                <RunOutcomeBadge outcome={run.outcome} pass={run.pass} />
              </td>
              <td className="px-4 py-3 text-sm tabular">
                {run.maxUtilisation === null ? "—" : displayUtilisation(run.maxUtilisation)}
              </td>
            </tr>
          ))}
        </TableFrame>
        {runs.length > RUNS_SHOWN ? (
          <p className="mt-2 text-sm text-ink-700">
            And {runs.length - RUNS_SHOWN} more runs (the batch re-runs every one of them).
          </p>
        ) : null}
      </Section>

      <Section title="People told" id="impact-people-heading">
        <p className="mb-2 text-sm text-ink-700">
          Each affected run&apos;s preparer and each affected job&apos;s responsible engineer was sent one e-mail listing their
          runs and jobs.
        </p>
        <TableFrame testId="impact-people" label="People told" headings={["Person", "Their runs", "Responsible for"]}>
          {people.map((person) => (
            <tr key={person.id} data-testid="impact-person" data-email={person.email}>
              <td className="px-4 py-3 text-sm">
                {person.name}
                <span className="block text-xs text-ink-500">{person.email}</span>
              </td>
              <td className="px-4 py-3 text-sm tabular">{person.runs}</td>
              <td className="px-4 py-3 font-mono text-sm">{person.jobs.join(", ") || "—"}</td>
            </tr>
          ))}
        </TableFrame>
      </Section>
    </>
  );
}
