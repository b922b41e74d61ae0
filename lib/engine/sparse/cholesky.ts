import { extractDiagonal } from "./csc";
import { factorMultifrontal } from "./multifrontal";
import { computeOrdering } from "./ordering";
import { analyzeSymbolic } from "./symbolic";
import type { SupernodalStructure } from "./supernodes";
import { scratch } from "./workspace";
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
   * All right-hand sides in one pass over L: L is read from memory once for the lot instead of once per
   * case, and the inner loops update every case with each entry of L. Rows of x hold the cases side by side.
   */
  solveMany(bs: ReadonlyArray<Float64Array>): Float64Array[] {
    const { n, perm, values: lx } = this;
    const { count, superStart, rowPtr, rows, valuePtr, maxRows } = this.structure;
    const nr = bs.length;
    if (nr === 0) return [];
    const x = scratch.floats("solve-x", n * nr);
    for (let r = 0; r < nr; r++) {
      const b = bs[r];
      if (b.length !== n) throw new Error(`solve: right-hand side has length ${b.length}, expected ${n}`);
      for (let k = 0; k < n; k++) {
        const v = b[perm[k]];
        if (!Number.isFinite(v)) throw new Error(`solve: right-hand side entry ${perm[k]} is not finite (${v})`);
        x[k * nr + r] = v;
      }
    }
    // Rows below each supernode's diagonal block go through a dense work block, so the inner loops run
    // over contiguous memory and each row of x is gathered or scattered once.
    const work = scratch.floats("solve-work", maxRows * nr);
    const xk = scratch.floats("solve-xk", nr);
    // Forward: L y = P b.
    for (let s = 0; s < count; s++) {
      const first = superStart[s];
      const cols = superStart[s + 1] - first;
      const r0 = rowPtr[s];
      const m = rowPtr[s + 1] - r0;
      const below = m - cols;
      work.fill(0, 0, below * nr);
      for (let k = 0; k < cols; k++) {
        const col = valuePtr[s] + k * m;
        const dk = lx[col + k];
        const xb = (first + k) * nr;
        for (let r = 0; r < nr; r++) xk[r] = x[xb + r] /= dk;
        for (let i = k + 1; i < cols; i++) {
          const l = lx[col + i];
          const xi = (first + i) * nr;
          for (let r = 0; r < nr; r++) x[xi + r] -= l * xk[r];
        }
        const tail = col + cols;
        for (let i = 0; i < below; i++) {
          const l = lx[tail + i];
          for (let r = 0; r < nr; r++) work[i * nr + r] += l * xk[r];
        }
      }
      for (let i = 0; i < below; i++) {
        const xi = rows[r0 + cols + i] * nr;
        for (let r = 0; r < nr; r++) x[xi + r] -= work[i * nr + r];
      }
    }
    // Backward: Lᵀ z = y.
    for (let s = count - 1; s >= 0; s--) {
      const first = superStart[s];
      const cols = superStart[s + 1] - first;
      const r0 = rowPtr[s];
      const m = rowPtr[s + 1] - r0;
      const below = m - cols;
      for (let i = 0; i < below; i++) {
        const xi = rows[r0 + cols + i] * nr;
        for (let r = 0; r < nr; r++) work[i * nr + r] = x[xi + r];
      }
      for (let k = cols - 1; k >= 0; k--) {
        const col = valuePtr[s] + k * m;
        for (let r = 0; r < nr; r++) xk[r] = x[(first + k) * nr + r];
        for (let i = k + 1; i < cols; i++) {
          const l = lx[col + i];
          const xi = (first + i) * nr;
          for (let r = 0; r < nr; r++) xk[r] -= l * x[xi + r];
        }
        const tail = col + cols;
        for (let i = 0; i < below; i++) {
          const l = lx[tail + i];
          for (let r = 0; r < nr; r++) xk[r] -= l * work[i * nr + r];
        }
        const dk = lx[col + k];
        for (let r = 0; r < nr; r++) x[(first + k) * nr + r] = xk[r] / dk;
      }
    }
    const out: Float64Array[] = [];
    for (let r = 0; r < nr; r++) {
      const o = new Float64Array(n);
      for (let k = 0; k < n; k++) o[perm[k]] = x[k * nr + r];
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
