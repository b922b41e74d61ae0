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
    for (let r = 0; r < nr; r += 2) this.solvePair(xs.subarray(r * n, r * n + n), xs.subarray(r * n + n, r * n + 2 * n));
    const out: Float64Array[] = [];
    for (let r = 0; r < nr; r++) {
      const o = new Float64Array(n);
      for (let k = 0; k < n; k++) o[perm[k]] = xs[r * n + k];
      out.push(o);
    }
    return out;
  }

  /** L Lᵀ x = b for two permuted right-hand sides, in place. */
  private solvePair(x0: Float64Array, x1: Float64Array): void {
    const lx = this.values;
    const { count, superStart, rowPtr, rows, valuePtr, maxRows } = this.structure;
    // Rows below each supernode's diagonal block go through dense work vectors, so the inner loops run
    // over contiguous memory and each row of x is gathered or scattered once.
    const w0 = scratch.floats("solve-w0", maxRows);
    const w1 = scratch.floats("solve-w1", maxRows);
    // Forward: L y = P b.
    for (let s = 0; s < count; s++) {
      const first = superStart[s];
      const cols = superStart[s + 1] - first;
      const r0 = rowPtr[s];
      const m = rowPtr[s + 1] - r0;
      const below = m - cols;
      w0.fill(0, 0, below);
      w1.fill(0, 0, below);
      for (let k = 0; k < cols; k++) {
        const col = valuePtr[s] + k * m;
        const d = lx[col + k];
        const a = (x0[first + k] /= d);
        const b = (x1[first + k] /= d);
        for (let i = k + 1; i < cols; i++) {
          const l = lx[col + i];
          x0[first + i] -= l * a;
          x1[first + i] -= l * b;
        }
        const tail = col + cols;
        for (let i = 0; i < below; i++) {
          const l = lx[tail + i];
          w0[i] += l * a;
          w1[i] += l * b;
        }
      }
      for (let i = 0; i < below; i++) {
        const r = rows[r0 + cols + i];
        x0[r] -= w0[i];
        x1[r] -= w1[i];
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
        const r = rows[r0 + cols + i];
        w0[i] = x0[r];
        w1[i] = x1[r];
      }
      for (let k = cols - 1; k >= 0; k--) {
        const col = valuePtr[s] + k * m;
        let a = x0[first + k];
        let b = x1[first + k];
        for (let i = k + 1; i < cols; i++) {
          const l = lx[col + i];
          a -= l * x0[first + i];
          b -= l * x1[first + i];
        }
        const tail = col + cols;
        for (let i = 0; i < below; i++) {
          const l = lx[tail + i];
          a -= l * w0[i];
          b -= l * w1[i];
        }
        const d = lx[col + k];
        x0[first + k] = a / d;
        x1[first + k] = b / d;
      }
    }
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
