import { extractDiagonal } from "./csc";
import { factorMultifrontal } from "./multifrontal";
import { computeOrdering } from "./ordering";
import { analyzeSymbolic } from "./symbolic";
import type { SupernodalStructure } from "./supernodes";
import { scratch } from "./workspace";
import { solvePairInPlace } from "./solve-kernels";
import type { CholeskyFactor, FactorOptions, FactorResult, FactorStats, SymmetricCsc } from "./types";

/** L Lᵀ = P A Pᵀ with L held as dense supernodal blocks. */
class SupernodalFactor implements CholeskyFactor {
  constructor(
    readonly n: number,
    readonly stats: FactorStats,
    private readonly perm: Int32Array,
    private readonly structure: SupernodalStructure,
    private readonly values: Float64Array,
  ) {}

  solve(b: Float64Array): Float64Array {
    return this.solveMany([b])[0];
  }

  /**
   * Right-hand sides two at a time, so each pass over L (read from memory, tens of megabytes for a large
   * frame) serves two cases, with both updates in registers; an odd one out pairs with a zero vector.
   */
  solveMany(bs: ReadonlyArray<Float64Array>): Float64Array[] {
    const { n, perm } = this;
    const nr = bs.length;
    const xs = scratch.floats("solve-x", n * (nr + (nr % 2)));
    for (let r = 0; r < nr; r++) {
      const b = bs[r];
      if (b.length !== n) throw new Error(`solve: right-hand side has length ${b.length}, expected ${n}`);
      const x = xs.subarray(r * n, r * n + n);
      for (let k = 0; k < n; k++) {
        const v = b[perm[k]];
        if (!Number.isFinite(v)) throw new Error(`solve: right-hand side entry ${perm[k]} is not finite (${v})`);
        x[k] = v;
      }
    }
    if (nr % 2 === 1) xs.fill(0, nr * n, nr * n + n);
    for (let r = 0; r < nr; r += 2)
      solvePairInPlace(this.values, this.structure, xs.subarray(r * n, r * n + n), xs.subarray(r * n + n, r * n + 2 * n));
    const out: Float64Array[] = [];
    for (let r = 0; r < nr; r++) {
      const o = new Float64Array(n);
      for (let k = 0; k < n; k++) o[perm[k]] = xs[r * n + k];
      out.push(o);
    }
    return out;
  }
}

export function factorizeSymmetric(a: SymmetricCsc, options: FactorOptions = {}): FactorResult {
  const n = a.n;
  const tolerance = options.pivotTolerance ?? 1e-10;
  const stats: FactorStats = { orderingMs: 0, symbolicMs: 0, numericMs: 0, nnzL: 0, n };

  // A non-positive diagonal is singular at exactly that equation, whatever the ordering.
  const diagA = extractDiagonal(a);
  for (let i = 0; i < n; i++) {
    if (!(diagA[i] > 0)) return { ok: false, kind: "not-positive-definite", equation: i, pivot: diagA[i], stats };
  }

  let t0 = performance.now();
  const fillReducing = computeOrdering(a, options.ordering ?? "amd", options.blockSize ?? 1);
  let t1 = performance.now();
  stats.orderingMs = t1 - t0;

  t0 = t1;
  const { perm, permuted, structure, nnzL } = analyzeSymbolic(a, fillReducing);
  t1 = performance.now();
  stats.symbolicMs = t1 - t0;
  stats.nnzL = nnzL;

  t0 = t1;
  const diag = new Float64Array(n);
  for (let k = 0; k < n; k++) diag[k] = diagA[perm[k]];
  const outcome = factorMultifrontal(permuted, structure, diag, tolerance, options.workspace ?? null);
  stats.numericMs = performance.now() - t0;
  if (!outcome.ok) {
    return { ok: false, kind: "not-positive-definite", equation: perm[outcome.position], pivot: outcome.pivot, stats };
  }
  return { ok: true, factor: new SupernodalFactor(n, stats, perm, structure, outcome.values) };
}
