import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readRunSheet } from "@/lib/use-cases/runs";
import { readRunRecord } from "@/lib/standards/run-record";
import { restoreResult } from "@/lib/engine";
import { ISSUE_STATUS_LABELS, type IssueStatusId } from "@/lib/domain/schemas/calcs";
import { Caution } from "@/components/standards/caution";
import { NarrativeView } from "@/components/standards/narrative-view";
import { RunChecks, RunDiagrams, RunInputs, RunModel, RunReactions, resultIdsOf } from "@/components/runs/run-results";
import { orNotFound } from "../../../../(app)/_components/or-not-found";
import { WithdrawalBanner } from "@/components/runs/withdrawal-banner";
import { SealPanel } from "@/components/integrity/seal-panel";
import { PrintButton } from "./print-button";

export const metadata: Metadata = { title: "Calc sheet" };

/** A part of the sheet; kept on one page unless it is long (the worked narrative runs on across pages). */
function SheetPart({ title, long = false, children }: { title: string; long?: boolean; children: React.ReactNode }) {
  return (
    <section className={long ? "mt-6" : "mt-6 break-inside-avoid-page"}>
      <h2 className="mb-2 border-b border-ink-300 pb-1 text-base font-semibold">{title}</h2>
      {children}
    </section>
  );
}

const utc = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;

/**
 * A run's calc sheet, print-ready: every printed page repeats the firm, job, calc and revision, standard and
 * version with its short hash, engine, run id and date (a table header, which Chromium repeats on each page), and
 * numbers its pages "Page x of y" (the @page rule in app/globals.css). Drawn from the run's record alone.
 *
 * Everything it shows comes from one read (readRunSheet): the record, the version, and the sheet's facts, whose key
 * it prints outside the sheet (data-sheet-key) for the server's PDF renderer, which keeps the PDF under it. Show
 * nothing here that is not in those, or a PDF kept for an older state would be served for a newer one.
 */
export default async function CalcSheetPage({ params }: PageProps<"/runs/[id]/sheet">) {
  const { id } = await params;
  const actor = await requirePageActor("runs.read", { next: `/runs/${encodeURIComponent(id)}/sheet` });
  const sheet = await orNotFound(() => runUseCase(readRunSheet, { actor, input: { id } }));
  const { definition, narrative, sheetKey } = sheet;
  const { run, firmName, revisions, seal } = sheet.facts;
  const withdrawals = run.withdrawals;
  const record = readRunRecord(sheet.record);
  const issued = revisions.at(-1);
  const under = record.outcome === "succeeded" ? resultIdsOf(record.evaluation.model)[0]?.id : undefined;
  const restored = record.outcome === "succeeded" ? restoreResult(record.evaluation.model, record.analysis) : null;

  return (
    <>
      <p className="mb-4 flex flex-wrap items-center gap-3 print:hidden" data-sheet-key={sheetKey ?? undefined}>
        <Link href={`/runs/${run.id}`} className="text-sm text-plate-700 hover:underline">
          Back to the run
        </Link>
        <PrintButton />
        <a href={`/api/runs/${run.id}/sheet-pdf`} className="text-sm text-plate-700 hover:underline" data-testid="download-pdf">
          Download PDF
        </a>
      </p>
      <table className="w-full border-collapse" data-testid="calc-sheet">
        <thead>
          <tr>
            <td className="pb-3">
              <div
                className="grid grid-cols-2 gap-x-4 border-b-2 border-ink-900 pb-2 text-[8.5pt] leading-snug"
                data-testid="sheet-header"
              >
                <div>
                  <p className="font-semibold">{firmName}</p>
                  <p>
                    Job {run.jobNumber} · {run.jobName}
                  </p>
                  <p data-testid="sheet-calc">
                    {issued
                      ? `Calc ${issued.calcNumber} rev ${issued.letter} · ${issued.calcTitle}`
                      : "Not issued as a calc revision"}
                  </p>
                </div>
                <div className="text-right">
                  <p>
                    {run.title} v{run.number} · sha256:{record.standard.contentHash.slice(0, 12)}
                  </p>
                  <p>
                    Engine {record.identity.engine} ({record.identity.engineSourceHash.slice(0, 12)}) · evaluation{" "}
                    {record.identity.evaluation}
                  </p>
                  <p data-testid="sheet-run">
                    Run {run.id} · {utc(run.createdAt)}
                  </p>
                </div>
              </div>
            </td>
          </tr>
        </thead>
        <tbody>
          <tr>
            <td>
              <h1 className="text-xl font-semibold">{run.title}</h1>
              <p className="text-sm text-ink-700">
                Prepared by {run.createdByName}. Record sha256:{run.recordSha256}.
              </p>
              <WithdrawalBanner withdrawals={withdrawals} />
              <Caution />
              {definition ? (
                <SheetPart title="Scope and limitations">
                  <p className="text-sm">{definition.scope}</p>
                  {definition.limitations.length > 0 ? (
                    <ul className="mt-1 list-disc pl-5 text-sm">
                      {definition.limitations.map((l) => (
                        <li key={l}>{l}</li>
                      ))}
                    </ul>
                  ) : null}
                </SheetPart>
              ) : null}
              {record.outcome === "failed" ? (
                <SheetPart title="Result">
                  <p className="font-semibold">{record.failure.message}</p>
                </SheetPart>
              ) : (
                <>
                  {definition ? (
                    <SheetPart title="Calculation" long>
                      <NarrativeView
                        definition={definition}
                        narrative={narrative}
                        evaluation={record.evaluation}
                        title={run.title}
                      />
                    </SheetPart>
                  ) : null}
                  <SheetPart title="Inputs" long>
                    <RunInputs record={record} />
                  </SheetPart>
                  <SheetPart title="Model">
                    <RunModel
                      record={record}
                      result={restored?.ok ? restored.result : undefined}
                      under={resultIdsOf(record.evaluation.model).find((r) => !r.envelope)?.id}
                      name={run.title}
                    />
                  </SheetPart>
                  <SheetPart title={`Checks: ${record.evaluation.pass ? "every check passes" : "a check fails"}`}>
                    <RunChecks record={record} />
                  </SheetPart>
                  {restored?.ok && under ? (
                    <SheetPart title={`Diagrams under ${under}`}>
                      <RunDiagrams record={record} result={restored.result} under={under} />
                    </SheetPart>
                  ) : null}
                  <SheetPart title="Reactions and displacements">
                    <RunReactions
                      record={record}
                      under={resultIdsOf(record.evaluation.model).find((r) => !r.envelope)?.id ?? ""}
                    />
                  </SheetPart>
                </>
              )}
              <SheetPart title="Sign-off">
                {issued ? (
                  <table className="w-full text-sm" data-testid="sheet-sign-off">
                    <tbody>
                      {(["prepared", "checked", "approved"] as const).map((kind) => {
                        const event = issued.events.find((e) => e.kind === kind);
                        return (
                          <tr key={kind} className="border-b border-ink-200">
                            <th className="w-32 py-2 text-left font-medium capitalize">{kind}</th>
                            <td className="py-2">{event ? `${event.actorName ?? "—"}, ${utc(event.occurredAt)}` : "—"}</td>
                          </tr>
                        );
                      })}
                      <tr>
                        <th className="py-2 text-left font-medium">Issue status</th>
                        <td className="py-2">
                          {issued.issueStatus ? ISSUE_STATUS_LABELS[issued.issueStatus as IssueStatusId] : "—"}
                        </td>
                      </tr>
                    </tbody>
                  </table>
                ) : (
                  <p className="text-sm">Not issued: no sign-off is recorded against this run.</p>
                )}
              </SheetPart>
              <SheetPart title="Record seal">
                <p className="mb-1 text-sm">
                  This run&apos;s record is sealed in the firm&apos;s verifiable log: it can be checked years from now without
                  trusting the server, from this page alone.
                </p>
                <SealPanel view={seal.view} publicKeyPem={seal.publicKeyPem} fingerprint={seal.fingerprint} printable />
              </SheetPart>
              <Caution />
            </td>
          </tr>
        </tbody>
      </table>
    </>
  );
}
