import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { AppError } from "@/lib/domain/errors";
import { runUseCase } from "@/lib/use-cases/run";
import { compareRuns, type RunsCompared } from "@/lib/use-cases/runs";
import { readProfile } from "@/lib/use-cases/profile";
import type { DisplayUnits } from "@/lib/standards/display-units";
import type { ComparedValue } from "@/lib/standards/compare-runs";
import { ComparedTable } from "@/components/runs/compared-table";
import { PageHeader } from "@/components/ui/page-header";
import { Section } from "@/components/ui/section";
import { Caution } from "@/components/standards/caution";
import { FormError } from "@/components/ui/notice";
import { RunOutcomeBadge } from "../_components/run-outcome";
import { DisplayUnitsForm } from "../../profile/_components/display-units-form";

export const metadata: Metadata = { title: "Compare runs" };

function Compared({ rows, testId, labels }: { rows: ComparedValue[]; testId: string; labels: Record<string, string> }) {
  if (rows.length === 0) return <p className="text-sm text-ink-500">Neither run has any.</p>;
  return (
    <ComparedTable
      rows={rows}
      testId={testId}
      headings={["Value", "First run", "Second run", "Difference"]}
      rowTestId="compared-row"
      differenceTestId="compared-difference"
      sameWord="same"
      nameOf={(row) => (
        <>
          {labels[row.key] ?? row.label} <span className="font-mono text-xs text-ink-500">{row.key}</span>
        </>
      )}
    />
  );
}

/**
 * Two runs of the same standard side by side: inputs, derived values, extracts and check utilisations, with the
 * relative difference of each, from the two stored records. /runs/compare?a=<run id>&b=<run id>.
 */
export default async function CompareRunsPage({ searchParams }: PageProps<"/runs/compare">) {
  const { a, b } = await searchParams;
  const query = new URLSearchParams({ a: String(a ?? ""), b: String(b ?? "") });
  const actor = await requirePageActor("runs.read", { next: `/runs/compare?${query}` });
  let compared: RunsCompared | null = null;
  let problem: string | null = null;
  // The values in the person's display units, as the run's page shows them; the differences are of the SI values.
  const { displayUnits }: { displayUnits: DisplayUnits } = await runUseCase(readProfile, { actor, input: {} });
  try {
    compared = await runUseCase(compareRuns, { actor, input: { a, b, units: displayUnits } });
  } catch (error) {
    if (!(error instanceof AppError) || !["invalid-input", "not-found"].includes(error.code)) throw error;
    problem = Object.values(error.fieldErrors ?? {})[0]?.[0] ?? error.message;
    if (error.code === "invalid-input" && error.message !== problem) problem = `${error.message} ${problem}`;
  }

  if (!compared)
    return (
      <>
        <PageHeader title="Compare runs" lead="Two runs of the same standard, side by side." />
        <FormError message={problem ?? "Choose two runs to compare."} />
        <p className="mt-4 text-sm text-ink-700">
          Open a run and choose another run of the same standard under “Compare with another run”.{" "}
          <Link href="/runs" className="text-plate-700 underline">
            All runs
          </Link>
        </p>
      </>
    );

  const { comparison, labels } = compared;
  const side = (run: RunsCompared["a"], which: string) => (
    <div className="rounded-plate bg-paper-raised p-4 text-sm shadow-sheet ring-1 ring-ink-200" data-testid={`compared-${which}`}>
      <p className="text-xs font-semibold tracking-wide text-ink-500 uppercase">{which === "a" ? "First run" : "Second run"}</p>
      <p className="mt-1">
        <Link href={`/runs/${run.id}`} className="font-mono text-plate-700 underline">
          {run.id.slice(0, 8)}
        </Link>{" "}
        · {run.title} v{run.number} · job {run.jobNumber}
      </p>
      <p className="mt-1 text-ink-700">
        {run.createdByName}, {run.createdAt.slice(0, 16).replace("T", " ")} UTC
      </p>
      <p className="mt-2">
        <RunOutcomeBadge outcome={run.outcome} pass={run.pass} />
      </p>
    </div>
  );
  return (
    <>
      <PageHeader
        title={`Compare runs · ${compared.a.title}`}
        lead="Each value of the two stored runs, with the relative difference of the second from the first (of the SI values, whatever units they are shown in). Rows that differ are shaded."
      />
      <Caution />
      <div className="grid gap-4 sm:grid-cols-2">
        {side(compared.a, "a")}
        {side(compared.b, "b")}
      </div>
      {compared.a.number !== compared.b.number ? (
        <p className="mt-4 text-sm text-warn-700" data-testid="compared-versions-differ">
          The runs used different versions of the standard (v{compared.a.number} and v{compared.b.number}): a value only one
          version has is shown beside an empty cell.
        </p>
      ) : null}
      <div className="mt-6 flex justify-end" data-testid="compare-units" data-units={displayUnits}>
        <DisplayUnitsForm current={displayUnits} compact />
      </div>
      <Section title="Check utilisations" id="compare-utilisations">
        <Compared rows={comparison.utilisations} testId="compared-utilisations" labels={labels} />
      </Section>
      <Section title="Inputs" id="compare-inputs">
        <Compared rows={comparison.inputs} testId="compared-inputs" labels={labels} />
      </Section>
      <Section title="Extracts" id="compare-extracts">
        <Compared rows={comparison.extracts} testId="compared-extracts" labels={labels} />
      </Section>
      <Section title="Derived values" id="compare-derived">
        <Compared rows={comparison.derived} testId="compared-derived" labels={labels} />
      </Section>
      <Caution />
    </>
  );
}
