import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { runUseCase } from "@/lib/use-cases/run";
import { readRun, readRuns } from "@/lib/use-cases/runs";
import { readJob, readJobPeople } from "@/lib/use-cases/jobs";
import { readCalcPackage, readRunSignOff } from "@/lib/use-cases/calcs";
import { Section } from "@/components/ui/section";
import { readRunRecord } from "@/lib/standards/run-record";
import { PageHeader } from "@/components/ui/page-header";
import { buttonClasses } from "@/components/ui/button";
import { Caution } from "@/components/standards/caution";
import { SealPanel } from "@/components/integrity/seal-panel";
import { readRunSeal } from "@/lib/use-cases/log";
import { WithdrawalBanner } from "@/components/runs/withdrawal-banner";
import { LocalTime } from "@/components/local-time";
import { RunResults } from "@/components/runs/run-results";
import { SheetPdfs } from "@/components/runs/sheet-pdfs";
import { LibraryEntriesUsed } from "@/components/runs/library-entries-used";
import { Attachments } from "@/components/jobs/attachments";
import { readAttachments, readSheetPdfs } from "@/lib/use-cases/files";
import { readProfile } from "@/lib/use-cases/profile";
import { DisplayUnitsForm } from "../../profile/_components/display-units-form";
import { orNotFound } from "../../_components/or-not-found";
import { RunOutcomeBadge } from "../_components/run-outcome";
import { ApproveForm, CheckForm, IssueForm, RevisionSteps } from "../_components/sign-off";

export const metadata: Metadata = { title: "Run" };

export default async function RunPage({ params, searchParams }: PageProps<"/runs/[id]">) {
  const { id } = await params;
  const actor = await requirePageActor("runs.read", { next: `/runs/${encodeURIComponent(id)}` });
  const run = await orNotFound(() => runUseCase(readRun, { actor, input: { id } }));
  const record = readRunRecord(run.record);
  const under = (await searchParams).under;
  const jobHref = `/jobs/${encodeURIComponent(run.jobNumber)}`;
  const rerun = can(actor.role, "runs.create") ? `${jobHref}/run/${run.slug}?from=${run.id}` : null;
  const job = await runUseCase(readJob, { actor, input: { jobNumber: run.jobNumber } });
  const revisions = await runUseCase(readRunSignOff, { actor, input: { id: run.id } });
  const mayIssue = run.createdById === actor.id && run.outcome === "succeeded" && can(actor.role, "runs.sign-prepared");
  const calcs = mayIssue ? await runUseCase(readCalcPackage, { actor, input: { jobId: run.jobId } }) : [];
  const people = mayIssue ? (await runUseCase(readJobPeople, { actor, input: {} })).filter((p) => p.id !== actor.id) : [];
  const [pdfs, attachments, sameStandard, profile, seal] = await Promise.all([
    runUseCase(readSheetPdfs, { actor, input: { id: run.id } }),
    runUseCase(readAttachments, { actor, input: { jobId: run.jobId, runId: run.id } }),
    runUseCase(readRuns, { actor, input: { job: run.jobNumber, standard: run.slug, limit: 30 } }),
    runUseCase(readProfile, { actor, input: {} }),
    runUseCase(readRunSeal, { actor, input: { id: run.id } }),
  ]);
  const others = sameStandard.runs.filter((other) => other.id !== run.id);
  const open = revisions.some((r) => r.state === "awaiting-check" || r.state === "awaiting-approval");

  return (
    <>
      <PageHeader
        title={`${run.title} · ${run.jobNumber}`}
        lead={`Run ${run.id.slice(0, 8)} of version ${run.number}, in job ${run.jobNumber} (${run.jobName}).`}
        actions={
          <>
            <Link href={`/runs/${run.id}/sheet`} className={buttonClasses("secondary")} data-testid="open-sheet">
              Calc sheet
            </Link>
            <Link href={`/runs/${run.id}/trace`} className={buttonClasses("secondary")} data-testid="open-trace">
              Trace
            </Link>
            {rerun ? (
              <Link href={rerun} className={buttonClasses("secondary")} data-testid="rerun">
                Re-run with changes
              </Link>
            ) : null}
          </>
        }
      />
      <WithdrawalBanner withdrawals={run.withdrawals} />
      <Caution />
      <dl
        className="grid gap-x-8 gap-y-2 rounded-plate bg-paper-raised p-4 text-sm shadow-sheet ring-1 ring-ink-200 sm:grid-cols-[auto_minmax(0,1fr)]"
        data-testid="run-meta"
      >
        <dt className="text-ink-500">Result</dt>
        <dd data-testid="run-result">
          <RunOutcomeBadge outcome={run.outcome} pass={run.pass} />
        </dd>
        <dt className="text-ink-500">Job</dt>
        <dd>
          <Link href={jobHref} className="text-plate-700 hover:underline">
            {run.jobNumber} · {run.jobName}
          </Link>
        </dd>
        <dt className="text-ink-500">Standard</dt>
        <dd>
          <Link
            href={`/standards/${run.slug}/versions/${run.number}`}
            className="text-plate-700 hover:underline"
            data-testid="run-version"
          >
            {run.title} v{run.number}
          </Link>{" "}
          <span className="font-mono text-xs text-ink-500">sha256:{record.standard.contentHash.slice(0, 12)}</span>
        </dd>
        <dt className="text-ink-500">Run by</dt>
        <dd>
          {run.createdByName}, <LocalTime iso={run.createdAt} />
        </dd>
        {record.parentRunId ? (
          <>
            <dt className="text-ink-500">{run.purpose === "remediation" ? "Remediation re-run of" : "Re-run of"}</dt>
            <dd>
              <Link href={`/runs/${record.parentRunId}`} className="font-mono text-plate-700 hover:underline">
                {record.parentRunId.slice(0, 8)}
              </Link>{" "}
              ·{" "}
              <Link
                href={`/runs/compare?a=${record.parentRunId}&b=${run.id}`}
                className="text-plate-700 hover:underline"
                data-testid="compare-parent"
              >
                compare with it
              </Link>
            </dd>
          </>
        ) : null}
        <dt className="text-ink-500">Engine</dt>
        <dd className="font-mono text-xs text-ink-700" data-testid="run-identity">
          frame engine {record.identity.engine} ({record.identity.engineSourceHash.slice(0, 12)}), evaluation{" "}
          {record.identity.evaluation}, bundle {record.identity.bundleSha256.slice(0, 12)}
        </dd>
        {record.libraries.length > 0 ? (
          <>
            <dt className="text-ink-500">Library entries</dt>
            <dd>
              <LibraryEntriesUsed entries={record.libraries} testId="run-library-entries" />
            </dd>
          </>
        ) : null}
        <dt className="text-ink-500">Record</dt>
        <dd className="font-mono text-xs break-all text-ink-700" data-testid="run-sha256">
          sha256:{run.recordSha256} ({run.recordBytes.toLocaleString("en")} bytes)
        </dd>
      </dl>
      <Section title="Sign-off" id="sign-off-heading">
        <div className="space-y-4" data-testid="sign-off">
          {revisions.length === 0 ? (
            <p className="text-sm text-ink-700">
              Not issued as a calc revision yet. Re-running creates runs, not revisions, until one is issued.
            </p>
          ) : null}
          {revisions.map((revision) => (
            <div key={revision.id}>
              <RevisionSteps revision={revision} />
              {revision.state === "awaiting-check" && revision.checkerId === actor.id ? (
                <CheckForm revisionId={revision.id} />
              ) : null}
              {revision.state === "awaiting-approval" && job.responsibleEngineerId === actor.id ? (
                <ApproveForm revisionId={revision.id} needsReason={run.pass === false ? "its run fails a check" : null} />
              ) : null}
            </div>
          ))}
          {mayIssue && !open ? <IssueForm jobId={run.jobId} runId={run.id} calcs={calcs} people={people} /> : null}
        </div>
      </Section>
      {others.length > 0 ? (
        <Section title="Compare with another run" id="compare-heading">
          <form action="/runs/compare" method="get" className="flex flex-wrap items-end gap-3" data-testid="compare-form">
            <input type="hidden" name="a" value={run.id} />
            <div className="min-w-0">
              <label htmlFor="compare-b" className="mb-1 block text-sm font-medium text-ink-700">
                Another run of {run.title} in job {run.jobNumber}
              </label>
              <select
                id="compare-b"
                name="b"
                className="max-w-full rounded-plate border border-ink-300 bg-white px-3 py-1.5 text-sm"
                data-testid="compare-with"
              >
                {others.map((other) => (
                  <option key={other.id} value={other.id}>
                    {other.id.slice(0, 8)} · v{other.number} · {other.createdByName} ·{" "}
                    {other.createdAt.slice(0, 16).replace("T", " ")} UTC
                    {other.outcome === "failed" ? " · failed" : other.pass ? " · passes" : " · fails a check"}
                  </option>
                ))}
              </select>
            </div>
            <button type="submit" className={buttonClasses("secondary")} data-testid="compare-submit">
              Compare
            </button>
          </form>
        </Section>
      ) : null}
      <Section title="In the verifiable log" id="seal-heading">
        <SealPanel view={seal.view} publicKeyPem={seal.publicKeyPem} fingerprint={seal.fingerprint} />
      </Section>
      <Section title="Calc sheet PDFs" id="sheet-pdfs-heading">
        <SheetPdfs runId={run.id} pdfs={pdfs} />
      </Section>
      <Section title="Attachments" id="attachments-heading">
        <Attachments
          jobNumber={run.jobNumber}
          runId={run.id}
          attachments={attachments}
          canAttach={can(actor.role, "files.attach")}
        />
      </Section>
      <div className="mt-10 flex justify-end" data-testid="run-units">
        <DisplayUnitsForm current={profile.displayUnits} compact />
      </div>
      <RunResults
        units={profile.displayUnits}
        record={record}
        under={typeof under === "string" ? under : undefined}
        underHref={(resultId) => `/runs/${run.id}?under=${encodeURIComponent(resultId)}#diagrams-heading`}
      />
      <Caution />
    </>
  );
}
