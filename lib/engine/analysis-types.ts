/** The shape of what `analyze` returns. */
import type { EngineError, EngineWarning } from "./diagnostics";
import type { CaseResult } from "./results";
import type { EnvelopeResult } from "./combinations";

/** Sizes of the analysis. They follow from the model and the engine's code alone, so they belong to the result. */
export interface AnalysisStats {
  readonly nodes: number;
  readonly members: number;
  /** Free equations solved for. */
  readonly equations: number;
  /** Entries of the factor L. */
  readonly nnzL: number;
}

/**
 * Wall-clock times of the stages, in ms. They differ from run to run, so `analyze` returns them beside the
 * result, never inside it: the same model always gives the same result, byte for byte.
 */
export interface AnalysisTimings {
  readonly validationMs: number;
  /** Member preparation, DOF numbering, load resolution and the assembly of K. */
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
  /** Identity of the engine that made the result (ENGINE_IDENTITY when fresh; the stored one when restored). */
  readonly engineVersion: string;
  /** sha256 of the engine's source (lib/engine/identity.generated.ts), hex. */
  readonly engineSourceHash: string;
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

export type AnalysisOutcome =
  | { readonly ok: true; readonly result: AnalysisResult; readonly timings: AnalysisTimings }
  | { readonly ok: false; readonly errors: ReadonlyArray<EngineError> };
