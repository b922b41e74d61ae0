// A stored run as its results page shows it, drawn from the run's record alone (never from today's version or
// engine), so a run opened next year shows what it showed the day it was made: the overall result, each check
// with its utilisation against its limit, the assumptions, the inputs as given and in SI, the derived values and
// extracts, the model with its loads, the diagrams of every member, and the reactions and displacements.
import type { ModelInput, AnalysisResult } from "@/lib/engine";
import { memberDiagram, memberEnvelope, restoreResult } from "@/lib/engine";
import { inOrder, type RunRecord } from "@/lib/standards/run-record";
import { formatSignificant, trimZeros } from "@/lib/standards/format";
import { resultUnit, showValue, type DisplayUnits } from "@/lib/standards/display-units";
import { deformedShape } from "@/lib/standards/deformed-shape";
import { ModelDrawing } from "@/components/standards/model-drawing";
import { CheckLine } from "@/components/standards/check-line";
import { MemberDiagram } from "@/components/standards/member-diagram";
import { Badge } from "@/components/ui/badge";
import { TableFrame } from "@/components/ui/table";
import { UtilisationBar } from "./utilisation-bar";
import { Section } from "@/components/ui/section";

type Succeeded = Extract<RunRecord, { outcome: "succeeded" }>;

const number = (value: number, digits = 4) => trimZeros(formatSignificant(value, digits));

/** The results a diagram or table is drawn for: an envelope when the model defines one, else each combination or case. */
export function resultIdsOf(model: ModelInput): { id: string; label: string; envelope: boolean }[] {
  const m = model as {
    loadCases?: { id: string; name?: string }[];
    combinations?: { id: string; name?: string }[];
    envelopes?: { id: string }[];
  };
  return [
    ...(m.envelopes ?? []).map((e) => ({ id: e.id, label: `envelope ${e.id}`, envelope: true })),
    ...(m.combinations ?? []).map((c) => ({ id: c.id, label: `combination ${c.name ?? c.id}`, envelope: false })),
    ...(m.loadCases ?? []).map((c) => ({ id: c.id, label: `load case ${c.name ?? c.id}`, envelope: false })),
  ];
}

/**
 * The model of a stored run with its deformed shape under one load case or combination (an envelope has none):
 * the loads drawn are that load case's, or for a combination the first load case's, as the caption says.
 */
export function RunModel({
  record,
  result,
  under,
  name,
  units = "si",
}: {
  record: Succeeded;
  result: AnalysisResult | undefined;
  under: string | undefined;
  name: string;
  units?: DisplayUnits;
}) {
  const model = record.evaluation.model;
  const deformed = result && under ? deformedShape(model, result, under, units) : undefined;
  const loadCase = model.loadCases?.some((c) => c.id === under) ? under : undefined;
  return <ModelDrawing model={model} name={name} loadCase={loadCase} deformed={deformed} />;
}

export function RunChecks({ record, units = "si" }: { record: Succeeded; units?: DisplayUnits }) {
  const checks = inOrder(record.evaluation.checks, record.order?.checks);
  return (
    <div className="space-y-3" data-testid="run-checks">
      {checks.map(([key, check]) => (
        <CheckLine key={key} name={key} check={check} units={units}>
          <div className="mt-2">
            <UtilisationBar utilisation={check.utilisation} shown={check.utilisationShown} pass={check.pass} />
          </div>
        </CheckLine>
      ))}
      {checks.length === 0 ? <p className="text-ink-700">This standard has no design checks.</p> : null}
    </div>
  );
}

export function RunInputs({ record, units = "si" }: { record: RunRecord; units?: DisplayUnits }) {
  if (record.outcome !== "succeeded")
    return (
      <TableFrame testId="run-inputs" label="Inputs as typed" headings={["Input", "As typed"]}>
        {inOrder(record.typed, record.order?.inputs).map(([key, value]) => (
          <tr key={key} data-testid="run-input" data-key={key}>
            <td className="px-4 py-2 font-mono text-xs">{key}</td>
            <td className="px-4 py-2 tabular">{String(value)}</td>
          </tr>
        ))}
      </TableFrame>
    );
  return (
    <TableFrame testId="run-inputs" label="Inputs" headings={["Input", "Value", "As typed", "In SI"]}>
      {inOrder(record.evaluation.inputs, record.order?.inputs).map(([key, input]) => (
        <tr key={key} data-testid="run-input" data-key={key}>
          <td className="px-4 py-2 font-mono text-xs">{key}</td>
          <td className="px-4 py-2 tabular">
            {typeof input.si === "number" ? showValue(input.si, input.display, units) : input.display}
          </td>
          <td className="px-4 py-2 text-ink-700 tabular">
            {Object.hasOwn(record.typed, key) ? String(input.typed) : <span className="text-ink-500">default</span>}
          </td>
          <td className="px-4 py-2 text-ink-500 tabular">{typeof input.si === "number" ? number(input.si, 6) : input.si}</td>
        </tr>
      ))}
    </TableFrame>
  );
}

function ValuesTable({
  testId,
  label,
  values,
  order,
  units,
}: {
  testId: string;
  label: string;
  values: Readonly<Record<string, { si: number; display: string }>>;
  order?: ReadonlyArray<string>;
  units: DisplayUnits;
}) {
  const entries = inOrder(values, order);
  if (entries.length === 0) return <p className="text-ink-700">None.</p>;
  return (
    <TableFrame testId={testId} label={label} headings={["Name", "Value"]}>
      {entries.map(([key, value]) => (
        <tr key={key} data-testid={`${testId}-row`} data-key={key}>
          <td className="px-4 py-2 font-mono text-xs">{key}</td>
          <td className="px-4 py-2 tabular">{showValue(value.si, value.display, units)}</td>
        </tr>
      ))}
    </TableFrame>
  );
}

export function RunDiagrams({
  record,
  result,
  under,
  units = "si",
}: {
  record: Succeeded;
  result: AnalysisResult;
  under: string;
  units?: DisplayUnits;
}) {
  const model = record.evaluation.model as { members: { id: string; start: string; end: string }[] };
  const envelope = Object.hasOwn(result.envelopes, under);
  return (
    <div className="space-y-6" data-testid="run-diagrams" data-under={under}>
      {model.members.map((member) => {
        const diagram = envelope ? memberEnvelope(result, member.id, under) : memberDiagram(result, member.id, under);
        return (
          <div key={member.id} data-testid="member-diagrams" data-member={member.id}>
            <h3 className="mb-2 font-medium text-ink-900">Member {member.id}</h3>
            <div className="grid gap-3 lg:grid-cols-2">
              {(["M", "V", "N", "deflection"] as const).map((of) => (
                <MemberDiagram key={of} diagram={diagram} of={of} startNode={member.start} endNode={member.end} units={units} />
              ))}
            </div>
          </div>
        );
      })}
    </div>
  );
}

type CaseJson = {
  reactions: Record<string, { fx: number; fy: number; mz: number }>;
  displacements: Record<string, { ux: number; uy: number; rz: number }>;
};

export function RunReactions({ record, under, units = "si" }: { record: Succeeded; under: string; units?: DisplayUnits }) {
  const [force, moment, displacement] = [
    resultUnit("force", units),
    resultUnit("moment", units),
    resultUnit("displacement", units),
  ];
  const analysis = record.analysis as { loadCases: Record<string, CaseJson>; combinations: Record<string, CaseJson> };
  const result = analysis.combinations[under] ?? analysis.loadCases[under];
  if (!result) return <p className="text-ink-700">Reactions are listed for each load case and combination; choose one above.</p>;
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      <TableFrame
        testId="reactions-table"
        label={`Reactions under ${under}`}
        headings={["Node", `Rx (${force.unit})`, `Ry (${force.unit})`, `Mz (${moment.unit})`]}
      >
        {Object.entries(result.reactions).map(([node, r]) => (
          <tr key={node} data-testid="reaction-row" data-node={node}>
            <td className="px-4 py-2 font-mono text-xs">{node}</td>
            <td className="px-4 py-2 tabular">{number(r.fx * force.factor)}</td>
            <td className="px-4 py-2 tabular">{number(r.fy * force.factor)}</td>
            <td className="px-4 py-2 tabular">{number(r.mz * moment.factor)}</td>
          </tr>
        ))}
      </TableFrame>
      <TableFrame
        testId="displacements-table"
        label={`Displacements under ${under}`}
        headings={["Node", `ux (${displacement.unit})`, `uy (${displacement.unit})`, "θz (mrad)"]}
      >
        {Object.entries(result.displacements).map(([node, d]) => (
          <tr key={node} data-testid="displacement-row" data-node={node}>
            <td className="px-4 py-2 font-mono text-xs">{node}</td>
            <td className="px-4 py-2 tabular">{number(d.ux * displacement.factor)}</td>
            <td className="px-4 py-2 tabular">{number(d.uy * displacement.factor)}</td>
            <td className="px-4 py-2 tabular">{number(d.rz * 1e3)}</td>
          </tr>
        ))}
      </TableFrame>
    </div>
  );
}

/** The body of a run's page below its header; `under` picks the result the diagrams and tables show. */
export function RunResults({
  record,
  under,
  underHref,
  units = "si",
}: {
  record: RunRecord;
  under?: string;
  underHref: (id: string) => string;
  /** The reader's choice: SI, or US customary (converted from the record's SI values; the record is unchanged). */
  units?: DisplayUnits;
}) {
  if (record.outcome === "failed")
    return (
      <>
        <div className="mt-6 rounded-plate bg-warn-100 p-4 text-ink-900" role="alert" data-testid="run-failure">
          <p className="font-semibold">{record.failure.message}</p>
          {record.failure.details.length > 1 ? (
            <ul className="mt-2 list-disc pl-6 text-sm">
              {record.failure.details.map((detail, k) => (
                <li key={k}>{detail.message}</li>
              ))}
            </ul>
          ) : null}
          <p className="mt-2 text-sm text-ink-700">
            No results were produced. The attempt is kept on record; change the inputs and run again.
          </p>
        </div>
        <Section title="Inputs" id="inputs-heading">
          <RunInputs record={record} units={units} />
        </Section>
      </>
    );

  const restored = restoreResult(record.evaluation.model, record.analysis);
  const choices = resultIdsOf(record.evaluation.model);
  const diagramsUnder = choices.find((c) => c.id === under)?.id ?? choices[0]?.id;
  // Reactions and displacements belong to one result: the one chosen, or for an envelope the first case or combination.
  const tablesUnder = choices.find((c) => c.id === diagramsUnder && !c.envelope)?.id ?? choices.find((c) => !c.envelope)?.id;
  return (
    <>
      <Section title="Checks" id="checks-heading">
        <RunChecks record={record} units={units} />
        {record.evaluation.assumptions.length > 0 ? (
          <ul className="mt-4 space-y-1 text-sm" data-testid="run-assumptions">
            {record.evaluation.assumptions.map((a) => (
              <li key={a.text} className="flex gap-2">
                <Badge tone={a.status === "verified" ? "pass" : a.status === "not met" ? "fault" : "warn"}>
                  {a.status === "verified" ? "Verified" : a.status === "not met" ? "Not met" : "To confirm"}
                </Badge>
                <span className="text-ink-700">{a.text}</span>
              </li>
            ))}
          </ul>
        ) : null}
      </Section>
      <Section title="Inputs" id="inputs-heading">
        <RunInputs record={record} />
      </Section>
      <Section title="Derived values and extracts" id="values-heading">
        <div className="grid gap-6 lg:grid-cols-2">
          <ValuesTable
            testId="run-derived"
            label="Derived values"
            values={record.evaluation.derived}
            order={record.order?.derived}
            units={units}
          />
          <ValuesTable
            testId="run-extracts"
            label="Extracts"
            values={record.evaluation.extracts}
            order={record.order?.extracts}
            units={units}
          />
        </div>
      </Section>
      <Section title="Model" id="model-heading">
        <RunModel
          record={record}
          result={restored.ok ? restored.result : undefined}
          under={tablesUnder}
          name={record.standard.title}
          units={units}
        />
      </Section>
      <Section title="Diagrams" id="diagrams-heading">
        {choices.length > 1 ? (
          <nav aria-label="Result shown" className="mb-4 flex flex-wrap gap-2 text-sm" data-testid="result-choice">
            {choices.map((c) => (
              <a
                key={c.id}
                href={underHref(c.id)}
                aria-current={c.id === diagramsUnder ? "page" : undefined}
                className={`rounded-full px-3 py-1 ring-1 ${c.id === diagramsUnder ? "bg-plate-700 text-white ring-plate-700" : "text-plate-800 ring-ink-300 hover:ring-plate-500"}`}
              >
                {c.label}
              </a>
            ))}
          </nav>
        ) : null}
        {restored.ok && diagramsUnder ? (
          <RunDiagrams record={record} result={restored.result} under={diagramsUnder} units={units} />
        ) : (
          <p className="text-fault-700">
            The stored result could not be read back: {restored.ok ? "no result to show" : restored.errors[0]?.message}
          </p>
        )}
      </Section>
      <Section title="Reactions and displacements" id="reactions-heading">
        {tablesUnder ? (
          <>
            {tablesUnder !== diagramsUnder ? (
              <p className="mb-2 text-sm text-ink-500">
                An envelope has no single set of reactions; these are under {tablesUnder}.
              </p>
            ) : null}
            <RunReactions record={record} under={tablesUnder} units={units} />
          </>
        ) : null}
      </Section>
    </>
  );
}
