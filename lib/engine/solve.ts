/**
 * Factor K once (sparse Cholesky, LLᵀ, with a fill-reducing ordering) and solve every load case with that factor.
 * A pivot failure is mapped back to the node and direction that is free, as an `unstable` error.
 */
import type { Model } from "./model";
import { DOF_NAMES, dofLocation, type DofMap } from "./dofs";
import { unstableError, type EngineError } from "./diagnostics";
import {
  FactorWorkspace,
  factorizeSymmetric,
  multiplySymmetric,
  type CholeskyFactor,
  type FactorStats,
  type SymmetricCsc,
} from "./sparse";

export type FactorOutcome =
  { ok: true; factor: CholeskyFactor; stats: FactorStats } | { ok: false; error: EngineError; stats: FactorStats };

/**
 * Storage for L shared by every analysis: the factor never leaves `analyze`, which is synchronous, so the
 * next analysis may overwrite it; repeated analyses then skip faulting in tens of megabytes of fresh pages.
 */
const workspace = new FactorWorkspace();

/** The factor returned is valid until the next call (its storage is the shared workspace). */
export function factorStiffness(model: Model, K: SymmetricCsc, dofs: DofMap): FactorOutcome {
  const result = factorizeSymmetric(K, {
    ordering: "amd",
    blockSize: dofs.blockSize,
    workspace,
  });
  if (result.ok) return { ok: true, factor: result.factor, stats: result.factor.stats };
  // The factorisation reports the equation in original numbering; map it back to the node and direction.
  const { node, direction } = dofLocation(dofs.freeToGlobal[result.equation]);
  return { ok: false, error: unstableError(model.nodes[node].id, DOF_NAMES[direction]), stats: result.stats };
}

function norm2(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i];
  return Math.sqrt(s);
}

/** ‖K u − f‖ / ‖f‖; the absolute ‖K u − f‖ when f = 0, so the figure stays finite. */
export function relativeResidual(K: SymmetricCsc, u: Float64Array, f: Float64Array): number {
  const Ku = multiplySymmetric(K, u);
  let s = 0;
  for (let i = 0; i < f.length; i++) s += (Ku[i] - f[i]) ** 2;
  const fn = norm2(f);
  if (fn === 0) return Math.sqrt(s);
  return Math.sqrt(s) / fn;
}
