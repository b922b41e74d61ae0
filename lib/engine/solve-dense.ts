/**
 * Dense Cholesky on the same SymmetricCsc input as the sparse solver: a test reference only (O(n³), small n).
 * Kept independent of the sparse code so the two can check each other.
 */
import type { SymmetricCsc } from "./sparse";

export function denseFromCsc(a: SymmetricCsc): Float64Array[] {
  const rows = Array.from({ length: a.n }, () => new Float64Array(a.n));
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      rows[a.rowIdx[p]][j] = a.values[p];
      rows[j][a.rowIdx[p]] = a.values[p];
    }
  }
  return rows;
}

/** Solves A x = b by dense Cholesky; null when A is not positive definite. */
export function solveDense(a: SymmetricCsc, b: Float64Array): Float64Array | null {
  const n = a.n;
  const L = denseFromCsc(a);
  for (let j = 0; j < n; j++) {
    let d = L[j][j];
    for (let k = 0; k < j; k++) d -= L[j][k] * L[j][k];
    if (!(d > 0)) return null;
    const ljj = Math.sqrt(d);
    L[j][j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = L[i][j];
      for (let k = 0; k < j; k++) s -= L[i][k] * L[j][k];
      L[i][j] = s / ljj;
    }
  }
  const y = Float64Array.from(b);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < i; k++) y[i] -= L[i][k] * y[k];
    y[i] /= L[i][i];
  }
  for (let i = n - 1; i >= 0; i--) {
    for (let k = i + 1; k < n; k++) y[i] -= L[k][i] * y[k];
    y[i] /= L[i][i];
  }
  return y;
}
