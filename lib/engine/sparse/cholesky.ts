import { extractDiagonal, permuteToUpper, type PermutedUpper } from "./csc";
import { computeOrdering, invertPermutation } from "./ordering";
import { analyzeSymbolic, type SymbolicFactor } from "./symbolic";
import type { CholeskyFactor, FactorOptions, FactorResult, FactorStats, SymmetricCsc } from "./types";

interface NumericLdl {
  rowIdx: Int32Array;
  values: Float64Array;
  diag: Float64Array;
}

type NumericOutcome = { ok: true; ldl: NumericLdl } | { ok: false; position: number; pivot: number };

/**
 * Up-looking LDLᵀ: row k of L comes from a sparse triangular solve whose pattern is the
 * union of elimination-tree paths (after ldl_numeric, Davis 2005, from memory).
 * originalDiag is in permuted order; a pivot failing the tolerance test stops the factorisation.
 */
function factorNumeric(
  c: PermutedUpper,
  sym: SymbolicFactor,
  originalDiag: Float64Array,
  tolerance: number,
): NumericOutcome {
  const { n, colPtr: ap, rowIdx: ai, values: ax } = c;
  const { parent, colPtr: lp } = sym;
  const li = new Int32Array(lp[n]);
  const lx = new Float64Array(lp[n]);
  const d = new Float64Array(n);
  const y = new Float64Array(n);
  const pattern = new Int32Array(n);
  const flag = new Int32Array(n);
  const lnz = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    let top = n;
    flag[k] = k;
    y[k] = 0;
    for (let p = ap[k]; p < ap[k + 1]; p++) {
      let i = ai[p];
      y[i] += ax[p];
      if (i === k) continue;
      let len = 0;
      while (flag[i] !== k) {
        pattern[len++] = i;
        flag[i] = k;
        i = parent[i];
      }
      while (len > 0) pattern[--top] = pattern[--len];
    }
    let dk = y[k];
    y[k] = 0;
    for (; top < n; top++) {
      const i = pattern[top];
      const yi = y[i];
      y[i] = 0;
      const p2 = lp[i] + lnz[i];
      let p = lp[i];
      for (; p < p2; p++) y[li[p]] -= lx[p] * yi;
      const lki = yi / d[i];
      dk -= lki * yi;
      li[p] = k;
      lx[p] = lki;
      lnz[i]++;
    }
    // Written as !(a > b) so that NaN pivots are rejected too.
    const akk = originalDiag[k];
    if (!(akk > 0) || !(dk > tolerance * akk)) return { ok: false, position: k, pivot: dk };
    d[k] = dk;
  }
  return { ok: true, ldl: { rowIdx: li, values: lx, diag: d } };
}

class LdlFactor implements CholeskyFactor {
  constructor(
    readonly n: number,
    readonly stats: FactorStats,
    private readonly perm: Int32Array,
    private readonly colPtr: Int32Array,
    private readonly ldl: NumericLdl,
  ) {}

  solve(b: Float64Array): Float64Array {
    const { n, perm, colPtr: lp } = this;
    const { rowIdx: li, values: lx, diag } = this.ldl;
    if (b.length !== n) throw new Error(`solve: right-hand side has length ${b.length}, expected ${n}`);
    const x = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      const v = b[perm[k]];
      if (!Number.isFinite(v)) throw new Error(`solve: right-hand side entry ${perm[k]} is not finite (${v})`);
      x[k] = v;
    }
    for (let j = 0; j < n; j++) {
      const xj = x[j];
      if (xj !== 0) for (let p = lp[j]; p < lp[j + 1]; p++) x[li[p]] -= lx[p] * xj;
    }
    for (let j = 0; j < n; j++) x[j] /= diag[j];
    for (let j = n - 1; j >= 0; j--) {
      let s = x[j];
      for (let p = lp[j]; p < lp[j + 1]; p++) s -= lx[p] * x[li[p]];
      x[j] = s;
    }
    const out = new Float64Array(n);
    for (let k = 0; k < n; k++) out[perm[k]] = x[k];
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
  const perm = computeOrdering(a, options.ordering ?? "amd", options.blockSize ?? 1);
  const pinv = invertPermutation(perm);
  let t1 = performance.now();
  stats.orderingMs = t1 - t0;

  t0 = t1;
  const c = permuteToUpper(a, pinv);
  const sym = analyzeSymbolic(c);
  t1 = performance.now();
  stats.symbolicMs = t1 - t0;
  stats.nnzL = sym.colPtr[n] + n;

  t0 = t1;
  const diagC = new Float64Array(n);
  for (let k = 0; k < n; k++) diagC[k] = diagA[perm[k]];
  const outcome = factorNumeric(c, sym, diagC, tolerance);
  stats.numericMs = performance.now() - t0;
  if (!outcome.ok) {
    return { ok: false, kind: "not-positive-definite", equation: perm[outcome.position], pivot: outcome.pivot, stats };
  }
  return { ok: true, factor: new LdlFactor(n, stats, perm, sym.colPtr, outcome.ldl) };
}
