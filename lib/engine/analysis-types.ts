/** The shape of what `analyze` returns. */
import type { EngineError, EngineWarning } from "./diagnostics";
import type { CaseResult } from "./results";
import type { EnvelopeResult } from "./combinations";

export interface AnalysisStats {
  readonly nodes: number;
  readonly members: number;
  /** Free equations solved for. */
  readonly equations: number;
  /** Entries of the factor L. */
  readonly nnzL: number;
  readonly validationMs: number;
  readonly assemblyMs: number;
  readonly orderingMs: number;
  readonly symbolicMs: number;
  readonly factorMs: number;
  /** Right-hand sides, forward/back substitution and residuals, all load cases. */
  readonly solveMs: number;
  /** Member end forces, reactions, combinations and envelopes. */
  readonly recoveryMs: number;
  readonly totalMs: number;
}

export interface AnalysisResult {
  readonly engineVersion: string;
  readonly analysis: { readonly kind: "linear" };
  /** Node and member ids in model order: the index into every per-node / per-member vector. */
  readonly nodeIds: ReadonlyArray<string>;
  readonly memberIds: ReadonlyArray<string>;
  readonly loadCases: Readonly<Record<string, CaseResult>>;
  readonly combinations: Readonly<Record<string, CaseResult>>;
  readonly envelopes: Readonly<Record<string, EnvelopeResult>>;
  readonly warnings: ReadonlyArray<EngineWarning>;
  readonly stats: AnalysisStats;
}

export type AnalysisOutcome = { readonly ok: true; readonly result: AnalysisResult } | { readonly ok: false; readonly errors: ReadonlyArray<EngineError> };
