/**
 * The work behind each message of the protocol, as plain functions: the bundle's entry runs them in a worker,
 * and tests and benchmarks run the very same functions in-process to compare.
 */
import { compileStandard, evaluationToCanonicalJson, type Definition } from "@/lib/standards";
import { runVerification } from "@/lib/standards/verify";
import type { LibraryEntries } from "@/lib/standards/library-inputs";
import { resultToCanonicalJson, type AnalysisResult } from "@/lib/engine";
import type {
  CompileResult,
  DefinitionSummary,
  EvaluateResult,
  EvaluationRequest,
  RunResult,
  TaskResults,
  VerifyResult,
} from "./protocol";

function summarise(d: Definition): DefinitionSummary {
  return {
    title: d.title,
    category: d.category,
    tags: d.tags,
    summary: d.summary,
    inputs: Object.entries(d.inputs).map(([key, input]) => ({
      key,
      label: input.label,
      quantity: input.quantity,
      ...(input.unit === undefined ? {} : { unit: input.unit }),
    })),
    derived: Object.keys(d.derived),
    extracts: Object.keys(d.extracts),
    checks: Object.keys(d.checks),
    verificationCases: d.verification.length,
  };
}

export function compileTask(source: string, libraries: LibraryEntries = {}): CompileResult {
  const compiled = compileStandard(source, libraries);
  return compiled.ok
    ? { ok: true, summary: summarise(compiled.standard.definition) }
    : { ok: false, problems: compiled.problems };
}

export function evaluateTask(
  source: string,
  inputs: Readonly<Record<string, string | number>> = {},
  libraries: LibraryEntries = {},
): EvaluateResult {
  const compiled = compileStandard(source, libraries);
  if (!compiled.ok) return { ok: false, problems: compiled.problems };
  const outcome = compiled.standard.evaluate(inputs);
  return { ok: true, outcome, canonicalJson: outcome.ok ? evaluationToCanonicalJson(outcome.evaluation) : null };
}

/** As evaluateTask, plus the engine's result as canonical JSON: what a stored run keeps. */
export function runStandardTask(
  source: string,
  inputs: Readonly<Record<string, string | number>> = {},
  libraries: LibraryEntries = {},
): RunResult {
  const compiled = compileStandard(source, libraries);
  if (!compiled.ok) return { ok: false, problems: compiled.problems };
  let analysis: AnalysisResult | null = null;
  const outcome = compiled.standard.evaluate(inputs, libraries, (result) => {
    analysis = result;
  });
  if (!outcome.ok) return { ok: true, outcome, evaluationJson: null, analysisJson: null };
  return {
    ok: true,
    outcome,
    evaluationJson: evaluationToCanonicalJson(outcome.evaluation),
    // Without diagram extremes: the record's format (run-record.ts) draws them again from the end forces.
    analysisJson: analysis ? resultToCanonicalJson(analysis, { extremes: false }) : null,
  };
}

export function verifyTask(source: string, libraries: LibraryEntries = {}): VerifyResult {
  const compiled = compileStandard(source, libraries);
  if (!compiled.ok) return { ok: false, problems: compiled.problems };
  return { ok: true, results: runVerification(compiled.standard) };
}

export function runTask(request: EvaluationRequest): TaskResults[EvaluationRequest["task"]] {
  switch (request.task) {
    case "compile":
      return compileTask(request.source, request.libraries);
    case "evaluate":
      return evaluateTask(request.source, request.inputs, request.libraries);
    case "verify":
      return verifyTask(request.source, request.libraries);
    case "run":
      return runStandardTask(request.source, request.inputs, request.libraries);
  }
}
