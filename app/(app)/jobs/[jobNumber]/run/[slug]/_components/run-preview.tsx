"use client";
// What the live preview shows while typing: the overall result, each check's utilisation against its limit, and the
// values read off the analysis, or what stops the evaluation (an input out of bounds, an unstable model). Nothing
// here is stored; Run stores the run, evaluated again on the server.
import type { PreviewState } from "@/components/runs/use-preview";
import { UtilisationBar } from "@/components/runs/utilisation-bar";
import { Badge } from "@/components/ui/badge";

export function RunPreview({ state, bundleKb }: { state: PreviewState; bundleKb: number }) {
  return (
    <aside
      className="self-start rounded-plate bg-paper-raised p-4 shadow-sheet ring-1 ring-ink-200 lg:sticky lg:top-4"
      aria-live="polite"
      data-testid="run-preview"
      data-status={state.status}
    >
      <h2 className="mb-2 text-lg font-semibold text-ink-900">Preview</h2>
      <PreviewBody state={state} bundleKb={bundleKb} />
      <p className="mt-4 text-xs text-ink-500">
        Computed in this browser by the same evaluation and frame engine the server runs. Not stored until you run.
      </p>
    </aside>
  );
}

function PreviewBody({ state, bundleKb }: { state: PreviewState; bundleKb: number }) {
  if (state.status === "loading")
    return <p className="text-sm text-ink-700">Loading the evaluation ({bundleKb} kB) — you can fill in the form meanwhile.</p>;
  if (state.status === "unavailable") return <p className="text-sm text-warn-700">{state.message}</p>;
  if (state.status === "working") return <p className="text-sm text-ink-700">Evaluating…</p>;
  const result = state.result;
  if (!result.ok) return <p className="text-sm text-fault-700">This version no longer compiles: {result.problems[0]?.message}</p>;
  const outcome = result.outcome;
  if (!outcome.ok) {
    if (outcome.stage === "inputs")
      return (
        <ul className="list-disc space-y-1 pl-5 text-sm text-fault-700" data-testid="preview-problems">
          {outcome.problems.map((p) => (
            <li key={`${p.input}:${p.message}`}>{p.message}</li>
          ))}
        </ul>
      );
    const message = outcome.stage === "engine" ? outcome.errors[0]?.message : outcome.message;
    return (
      <p className="text-sm text-warn-700" data-testid="preview-failure">
        {outcome.stage === "engine" ? "The frame engine cannot analyse this model: " : "The standard cannot be evaluated: "}
        {message}
      </p>
    );
  }
  const evaluation = outcome.evaluation;
  return (
    <>
      <p className="mb-3">
        <Badge tone={evaluation.pass ? "pass" : "fault"} testId="preview-overall">
          {evaluation.pass ? "Every check passes" : "A check fails"}
        </Badge>
      </p>
      <ul className="space-y-3" data-testid="preview-checks">
        {Object.entries(evaluation.checks).map(([key, check]) => (
          <li key={key} data-testid="preview-check" data-name={key} data-utilisation={check.utilisationShown}>
            <p className="text-sm text-ink-900">
              {check.label} <span className="text-xs text-ink-500">{check.clause}</span>
            </p>
            <p className="text-xs text-ink-700 tabular">
              {check.demand} {check.relation === "<=" ? "≤" : "≥"} {check.capacity}
            </p>
            <UtilisationBar utilisation={check.utilisation} shown={check.utilisationShown} pass={check.pass} />
          </li>
        ))}
      </ul>
      {Object.keys(evaluation.extracts).length > 0 ? (
        <dl className="mt-4 grid grid-cols-[auto_minmax(0,1fr)] gap-x-4 gap-y-1 text-sm" data-testid="preview-extracts">
          {Object.entries(evaluation.extracts).map(([key, extract]) => (
            <div key={key} className="contents">
              <dt className="font-mono text-xs text-ink-500">{key}</dt>
              <dd className="text-ink-900 tabular" data-testid="preview-extract" data-key={key}>
                {extract.display}
              </dd>
            </div>
          ))}
        </dl>
      ) : null}
    </>
  );
}
