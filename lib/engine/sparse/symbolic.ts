import type { PermutedUpper } from "./csc";

/** Elimination tree and column pointers of L for C = P A Pᵀ (upper storage). */
export interface SymbolicFactor {
  parent: Int32Array;
  /** L's strictly-lower column k occupies colPtr[k] .. colPtr[k+1]-1. */
  colPtr: Int32Array;
}

/**
 * Elimination tree and column counts in one pass: row k of L is the union of the tree paths
 * from each i (with c_ik ≠ 0, i < k) up towards k. O(nnz(L)); after ldl_symbolic
 * (T. A. Davis, "Algorithm 849: a concise sparse Cholesky factorization package", ACM TOMS 2005), from memory.
 */
export function analyzeSymbolic(c: PermutedUpper): SymbolicFactor {
  const { n, colPtr, rowIdx } = c;
  const parent = new Int32Array(n);
  const flag = new Int32Array(n);
  const counts = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    parent[k] = -1;
    flag[k] = k;
    for (let p = colPtr[k]; p < colPtr[k + 1]; p++) {
      let i = rowIdx[p];
      if (i >= k) continue;
      while (flag[i] !== k) {
        if (parent[i] === -1) parent[i] = k;
        counts[i]++;
        flag[i] = k;
        i = parent[i];
      }
    }
  }
  const lp = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) lp[k + 1] = lp[k] + counts[k];
  return { parent, colPtr: lp };
}
