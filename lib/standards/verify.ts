/**
 * Verification cases: a version's proof that it computes what published sources say. Each case evaluates the
 * standard with its inputs and compares extracts, derived values and checks with expected values (expressions
 * with units, so the source's own numbers and units can be written as printed) within a relative tolerance.
 */
import type { CompiledStandard } from "./compile";
import { compileExpression, ExpressionError } from "./expressions";
import { formatSignificant, trimZeros } from "./format";
import { isUnit, type Value } from "./units";

export interface VerificationCheck {
  readonly target: string;
  readonly expected: number;
  readonly actual: number | null;
  readonly relativeError: number | null;
  readonly tolerance: number;
  readonly pass: boolean;
  readonly message?: string;
}

export interface VerificationResult {
  readonly name: string;
  readonly source: string;
  /** The hand calculation the expected values come from, when they were worked out by hand. */
  readonly handCalculation?: { readonly checker: string; readonly file: string; readonly sha256: string };
  readonly pass: boolean;
  readonly checks: ReadonlyArray<VerificationCheck>;
  /** Why the case could not be evaluated at all. */
  readonly failure?: string;
}

function si(value: Value): number {
  if (isUnit(value)) return value.toSI().toNumber() as number;
  if (typeof value === "number") return value;
  throw new Error("not a number");
}

export function runVerification(standard: CompiledStandard): VerificationResult[] {
  return standard.definition.verification.map((c) => {
    const cited = { name: c.name, source: c.source, ...(c.hand_calculation ? { handCalculation: c.hand_calculation } : {}) };
    const out = standard.evaluate(c.inputs);
    if (!out.ok) {
      const failure =
        out.stage === "inputs"
          ? out.problems.map((p) => p.message).join("; ")
          : out.stage === "engine"
            ? out.errors.map((e) => e.message).join("; ")
            : `${out.path}: ${out.message}`;
      return { ...cited, pass: false, checks: [], failure };
    }
    const e = out.evaluation;
    const checks = Object.entries(c.expect).map(([target, { value, tolerance }]): VerificationCheck => {
      let expected: number;
      try {
        expected = si(compileExpression(value, new Set()).evaluate(new Map()));
      } catch (error) {
        const why = error instanceof ExpressionError ? error.message : "the expected value is not a number";
        return { target, expected: NaN, actual: null, relativeError: null, tolerance, pass: false, message: why };
      }
      const [name, part] = target.split(".");
      const actual =
        part === undefined
          ? (e.extracts[name]?.si ?? e.derived[name]?.si)
          : part === "utilisation"
            ? e.checks[name]?.utilisation
            : part === "demand"
              ? e.checks[name]?.demandSI
              : e.checks[name]?.capacitySI;
      if (actual === undefined)
        return { target, expected, actual: null, relativeError: null, tolerance, pass: false, message: `no value \`${target}\`` };
      const scale = Math.abs(expected) > 0 ? Math.abs(expected) : 1;
      const relativeError = Math.abs(Math.abs(actual) - Math.abs(expected)) / scale;
      const pass = relativeError <= tolerance;
      return {
        target,
        expected,
        actual,
        relativeError,
        tolerance,
        pass,
        ...(pass
          ? {}
          : {
              message: `expected ${trimZeros(formatSignificant(expected, 6))}, got ${trimZeros(formatSignificant(actual, 6))} (SI units)`,
            }),
      };
    });
    return { ...cited, pass: checks.every((k) => k.pass), checks };
  });
}
