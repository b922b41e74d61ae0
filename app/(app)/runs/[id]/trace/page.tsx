import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { runUseCase } from "@/lib/use-cases/run";
import { readRunTrace } from "@/lib/use-cases/trace";
import { readProfile } from "@/lib/use-cases/profile";
import { readRunSeal } from "@/lib/use-cases/log";
import { SealPanel } from "@/components/integrity/seal-panel";
import { readRunRecord } from "@/lib/standards/run-record";
import { PageHeader } from "@/components/ui/page-header";
import { Section } from "@/components/ui/section";
import { buttonClasses } from "@/components/ui/button";
import { Caution } from "@/components/standards/caution";
import { RunInputs } from "@/components/runs/run-results";
import { SheetPdfs } from "@/components/runs/sheet-pdfs";
import { Attachments } from "@/components/jobs/attachments";
import { orNotFound } from "../../../_components/or-not-found";
import { RunOutcomeBadge } from "../../_components/run-outcome";
import { RevisionSteps } from "../../_components/sign-off";
import { ReproducePanel } from "./_components/reproduce-panel";
import { TraceEvents, TraceIdentity, TraceOutputs, TraceVersion } from "./_components/trace-parts";

export const metadata: Metadata = { title: "Trace" };

/**
 * A run traced back to its source: the version and who wrote and approved it, the engine and bundle, the inputs and
 * outputs as recorded, the sign-off, the files with their sha256 and every audit event about it; reproducing it; and
 * its place in the verifiable log. Everyone who may read the run may read its trace.
 */
export default async function TracePage({ params }: PageProps<"/runs/[id]/trace">) {
  const { id } = await params;
  const actor = await requirePageActor("runs.read", { next: `/runs/${encodeURIComponent(id)}/trace` });
  const trace = await orNotFound(() => runUseCase(readRunTrace, { actor, input: { id } }));
  const { run } = trace;
  const record = readRunRecord(run.record);
  const timeZone = (await runUseCase(readProfile, { actor, input: {} })).timeZone ?? undefined;
  const seal = await runUseCase(readRunSeal, { actor, input: { id: run.id } });

  return (
    <>
      <PageHeader
        title={`Trace of run ${run.id.slice(0, 8)}`}
        lead={`${run.title} v${run.number}, in job ${run.jobNumber} (${run.jobName}): where each of its numbers came from.`}
        actions={
          <Link href={`/runs/${run.id}`} className={buttonClasses("secondary")} data-testid="trace-back">
            Back to the run
          </Link>
        }
      />
      <Caution />
      <p className="mb-4 flex items-center gap-2 text-sm text-ink-700">
        Result: <RunOutcomeBadge outcome={run.outcome} pass={run.pass} />
      </p>
      <Section title="Version" id="trace-version-heading">
        <TraceVersion trace={trace} timeZone={timeZone} />
      </Section>
      <Section title="Engine and record" id="trace-identity-heading">
        <TraceIdentity trace={trace} record={record} timeZone={timeZone} />
      </Section>
      <Section title="Integrity" id="trace-integrity-heading">
        <p className="mb-3 max-w-2xl text-sm text-ink-700">
          The run&apos;s record is a leaf of the firm&apos;s verifiable log: its entry holds the record&apos;s sha256 above, and
          the inclusion proof leads from it to a tree head signed with the log&apos;s key.{" "}
          <Link href={`/api/log/inclusion?kind=run&ref=${run.id}`} className="text-plate-700 underline">
            The proof as JSON
          </Link>
          .
        </p>
        <div data-testid="trace-integrity">
          <SealPanel view={seal.view} publicKeyPem={seal.publicKeyPem} fingerprint={seal.fingerprint} />
        </div>
      </Section>
      <Section title="Reproduce" id="trace-reproduce-heading">
        {can(actor.role, "runs.reproduce") ? (
          <ReproducePanel runId={run.id} bundleSha256={record.identity.bundleSha256} />
        ) : (
          <p className="text-sm text-ink-700" data-testid="reproduce-not-yours">
            Auditors and standards leads reproduce runs; each reproduction they make is listed in the audit events below.
          </p>
        )}
      </Section>
      <Section title="Inputs" id="trace-inputs-heading">
        <RunInputs record={record} />
      </Section>
      <Section title="Outputs" id="trace-outputs-heading">
        {record.outcome === "succeeded" ? (
          <TraceOutputs record={record} />
        ) : (
          <p className="rounded-plate bg-warn-100 p-4 text-ink-900" data-testid="trace-failure">
            {record.failure.message} No outputs were produced; the attempt is kept on record.
          </p>
        )}
      </Section>
      <Section title="Sign-off" id="trace-sign-off-heading">
        <div className="space-y-3" data-testid="trace-sign-off">
          {trace.revisions.length === 0 ? (
            <p className="text-sm text-ink-700">Not issued as a calc revision.</p>
          ) : (
            trace.revisions.map((revision) => <RevisionSteps key={revision.id} revision={revision} />)
          )}
        </div>
      </Section>
      <Section title="Files" id="trace-files-heading">
        <div className="space-y-6" data-testid="trace-files">
          <Attachments jobNumber={run.jobNumber} runId={run.id} attachments={trace.attachments} canAttach={false} />
          <div>
            <h3 className="mb-2 font-medium text-ink-900">Calc sheet PDFs kept</h3>
            <SheetPdfs runId={run.id} pdfs={trace.sheetPdfs} />
          </div>
        </div>
      </Section>
      <Section title="Audit events" id="trace-events-heading">
        <TraceEvents trace={trace} timeZone={timeZone} />
      </Section>
      <Caution />
    </>
  );
}
