/**
 * Evaluation of a standard: (definition, input values) → inputs read and converted → bounds → derived
 * values → the model in SI → the engine → extracts → checks and assumptions, as one plain result.
 *
 * Pure and deterministic: no I/O, no clock, no randomness; the same definition and inputs give the same
 * canonical output byte for byte (evaluationToCanonicalJson). Failures come back as data with what and where.
 */
import canonicalize from "canonicalize";
import { analyze, ENGINE_IDENTITY, type AnalysisResult, type EngineError, type ModelInput } from "@/lib/engine";
import type { Definition } from "./definition";
import { compileExpression, ExpressionError } from "./expressions";
import { GenerateError, generateModel } from "./generate";
import { readExtract, resultsView, type Where } from "./extracts";
import { displayUtilisation, runCheck } from "./checks";
import { boundsProblem, readInput, type InputProblem } from "./inputs";
import { formatQuantity, formatValue } from "./format";
import { describeDimension, fromSI, hasDimensionOf, isUnit, toSI, type Quantity, type Value } from "./units";
import { formatPath } from "./source";
import { bindLibraryInput, isLibraryInput, type LibraryEntries, type UsedEntry } from "./library-inputs";

/** The evaluation module's own version: part of the identity recorded with every run, beside the engine's. */
// 0.2.0: a check for each member reads N, V and M without the displacements and does not count the sections
// at an extreme twice; results are unchanged, `sectionsChecked` is smaller.
export const EVALUATION_VERSION = "0.2.0";

export interface EvaluatedInput {
  readonly typed: string | number;
  /** SI number, or the choice's text, or a library entry's name. */
  readonly si: number | string;
  readonly display: string;
  /** For a section or material input: the library entry used, with its library's version and the hashes. */
  readonly entry?: UsedEntry;
}

export interface EvaluatedValue {
  readonly si: number;
  readonly display: string;
}

export interface EvaluatedExtract extends EvaluatedValue {
  readonly where: Where;
}

export interface EvaluatedCheck {
  readonly label: string;
  readonly clause: string;
  readonly relation: "<=" | ">=";
  readonly demand: string;
  readonly capacity: string;
  /** Demand and capacity in SI (N, m, Pa…), for verification and for the record. */
  readonly demandSI: number;
  readonly capacitySI: number;
  readonly utilisation: number;
  /** Rounded up to two decimals. */
  readonly utilisationShown: string;
  readonly pass: boolean;
  readonly message?: string;
  readonly where?: Where;
  readonly sectionsChecked?: number;
}

export interface EvaluatedAssumption {
  readonly text: string;
  /** "verified" or "not met" for guard checks; "to confirm" for the preparer's confirmation. */
  readonly status: "verified" | "not met" | "to confirm";
}

export interface Evaluation {
  readonly identity: { readonly engine: string; readonly engineSourceHash: string; readonly evaluation: string };
  readonly inputs: Readonly<Record<string, EvaluatedInput>>;
  readonly derived: Readonly<Record<string, EvaluatedValue>>;
  readonly model: ModelInput;
  readonly extracts: Readonly<Record<string, EvaluatedExtract>>;
  readonly checks: Readonly<Record<string, EvaluatedCheck>>;
  readonly assumptions: ReadonlyArray<EvaluatedAssumption>;
  /** Every check passes and every guard assumption holds. */
  readonly pass: boolean;
  /** Largest relative equilibrium residual of the analysed results. */
  readonly equilibriumResidual: number;
}

export type EvaluationFailure =
  | { readonly stage: "inputs"; readonly problems: ReadonlyArray<InputProblem> }
  | { readonly stage: "definition"; readonly path: string; readonly message: string }
  | { readonly stage: "engine"; readonly errors: ReadonlyArray<EngineError> };

export type EvaluationOutcome =
  { readonly ok: true; readonly evaluation: Evaluation } | ({ readonly ok: false } & EvaluationFailure);

type Scope = Map<string, Value>;

function fail(path: ReadonlyArray<PropertyKey>, message: string): EvaluationOutcome {
  return { ok: false, stage: "definition", path: formatPath(path), message };
}

/**
 * Read, convert and bound-check the inputs; unknown keys are refused. A section or material input's entry is
 * found among `libraries` and its values join the scope as `<input>_<value>`.
 */
export function readInputs(
  definition: Definition,
  given: Readonly<Record<string, string | number>>,
  libraries: LibraryEntries = {},
): { ok: true; scope: Scope; inputs: Record<string, EvaluatedInput> } | { ok: false; problems: InputProblem[] } {
  const problems: InputProblem[] = [];
  for (const key of Object.keys(given))
    if (!Object.hasOwn(definition.inputs, key))
      problems.push({ input: key, message: `There is no input \`${key}\` in this standard` });
  const scope: Scope = new Map();
  const typed: Record<string, string | number> = {};
  const used: Record<string, UsedEntry> = {};
  for (const [key, input] of Object.entries(definition.inputs)) {
    const raw = Object.hasOwn(given, key) ? given[key] : input.default;
    typed[key] = raw;
    if (isLibraryInput(input)) {
      const bound = bindLibraryInput(key, input, raw, libraries);
      if (!bound.ok) problems.push({ input: key, message: bound.message });
      else {
        scope.set(key, bound.entry.key);
        for (const [name, value] of bound.values) scope.set(name, value);
        used[key] = bound.used;
      }
      continue;
    }
    const value = readInput(key, input, raw);
    if (typeof value === "object" && "message" in value && !isUnit(value)) problems.push(value as InputProblem);
    else scope.set(key, value as Value);
  }
  if (problems.length > 0) return { ok: false, problems };
  for (const [key, input] of Object.entries(definition.inputs)) {
    if (isLibraryInput(input)) continue;
    const problem = boundsProblem(key, input, scope.get(key)!, scope);
    if (problem) problems.push(problem);
  }
  if (problems.length > 0) return { ok: false, problems };
  const inputs: Record<string, EvaluatedInput> = {};
  for (const [key, input] of Object.entries(definition.inputs)) {
    const value = scope.get(key)!;
    if (used[key]) {
      inputs[key] = { typed: typed[key], si: used[key].key, display: used[key].key, entry: used[key] };
      continue;
    }
    inputs[key] = {
      typed: typed[key],
      si: typeof value === "string" || input.quantity === "choice" ? String(value) : toSI(value, input.quantity as Quantity),
      display: formatValue(value, input.unit, 4, true),
    };
  }
  return { ok: true, scope, inputs };
}

/**
 * `analysed`, when given, is handed the engine's result (what a run stores so that its diagrams can be drawn again
 * from the record alone); the outcome is the same with or without it.
 */
export function evaluateDefinition(
  definition: Definition,
  given: Readonly<Record<string, string | number>>,
  libraries: LibraryEntries = {},
  analysed?: (result: AnalysisResult) => void,
): EvaluationOutcome {
  const read = readInputs(definition, given, libraries);
  if (!read.ok) return { ok: false, stage: "inputs", problems: read.problems };
  const scope = read.scope;
  try {
    const derived: Record<string, EvaluatedValue> = {};
    for (const [key, d] of Object.entries(definition.derived)) {
      const path = ["derived", key, "expr"];
      let value: Value;
      try {
        value = compileExpression(d.expr, scope).evaluate(scope);
      } catch (error) {
        if (error instanceof ExpressionError) return fail(path, error.message);
        throw error;
      }
      if (!hasDimensionOf(value, d.quantity))
        return fail(
          path,
          `\`${d.expr}\` gives ${describeDimension(value)}, but \`${key}\` is declared a ${d.quantity.replaceAll("-", " ")}`,
        );
      scope.set(key, value);
      derived[key] = { si: toSI(value, d.quantity), display: formatValue(value, d.unit, d.digits) };
    }

    const { model, groups } = generateModel(definition.model, scope);
    const outcome = analyze(model);
    if (!outcome.ok) return { ok: false, stage: "engine", errors: outcome.errors };
    analysed?.(outcome.result);
    const view = resultsView(model, outcome.result, groups);

    const extracts: Record<string, EvaluatedExtract> = {};
    for (const [key, e] of Object.entries(definition.extracts)) {
      const read = readExtract(view, e, scope, ["extracts", key]);
      extracts[key] = { si: read.value, display: formatQuantity(read.value, read.quantity, e.unit, e.digits), where: read.where };
      scope.set(key, fromSI(read.value, read.quantity));
    }

    const checks: Record<string, EvaluatedCheck> = {};
    for (const [key, c] of Object.entries(definition.checks)) {
      const r = runCheck(view, c, scope, ["checks", key]);
      checks[key] = {
        label: c.label,
        clause: c.clause,
        relation: c.relation,
        demand: formatValue(r.demand, c.unit, c.digits),
        capacity: formatValue(r.capacity, c.unit, c.digits),
        demandSI: siNumber(r.demand),
        capacitySI: siNumber(r.capacity),
        utilisation: r.utilisation,
        utilisationShown: displayUtilisation(r.utilisation),
        pass: r.pass,
        ...(r.pass ? {} : { message: c.fails }),
        ...(r.where ? { where: r.where } : {}),
        ...(r.sectionsChecked !== undefined ? { sectionsChecked: r.sectionsChecked } : {}),
      };
    }

    const assumptions: EvaluatedAssumption[] = definition.assumptions.map((a, k) => {
      if (!("check" in a)) return { text: a.text, status: "to confirm" };
      const holds = compileExpression(a.check, scope).evaluate(scope);
      if (typeof holds !== "boolean")
        throw new GenerateError(["assumptions", k, "check"], `\`${a.check}\` must be a condition (true or false)`);
      return { text: a.text, status: holds ? "verified" : "not met" };
    });

    const results = [...Object.values(outcome.result.loadCases), ...Object.values(outcome.result.combinations)];
    const residual = Math.max(0, ...results.map((r) => r.equilibrium.relative));
    return {
      ok: true,
      evaluation: {
        identity: {
          engine: ENGINE_IDENTITY.version,
          engineSourceHash: ENGINE_IDENTITY.sourceHash,
          evaluation: EVALUATION_VERSION,
        },
        inputs: read.inputs,
        derived,
        model,
        extracts,
        checks,
        assumptions,
        pass: Object.values(checks).every((c) => c.pass) && assumptions.every((a) => a.status !== "not met"),
        equilibriumResidual: residual,
      },
    };
  } catch (error) {
    if (error instanceof GenerateError) return fail(error.path, error.message);
    if (error instanceof ExpressionError) return fail([], error.message);
    throw error;
  }
}

function siNumber(value: Value): number {
  return isUnit(value) ? (value.toSI().toNumber() as number) : (value as number);
}

/** The canonical text of an evaluation (RFC 8785): the same inputs give the same bytes. */
export function evaluationToCanonicalJson(evaluation: Evaluation): string {
  const text = canonicalize(evaluation);
  if (text === undefined) throw new Error("evaluationToCanonicalJson: the evaluation has no JSON form");
  return text;
}
