import type { CscMatrix } from "./csc";

// Elimination tree and column counts of the Cholesky factor, after cs_etree, cs_counts and cs_leaf
// in T. A. Davis, Direct Methods for Sparse Linear Systems (SIAM 2006), written from memory.
// Column counts use the row-subtree skeleton method of Gilbert, Ng & Peyton (1994): O(nnz(A) α).

/**
 * parent[k] of the elimination tree of P A Pᵀ (-1 for roots), read straight from the expanded A
 * (both triangles): row k of the permuted lower triangle is column perm[k] of A mapped through pinv.
 */
export function computeEliminationTree(full: CscMatrix, perm: Int32Array, pinv: Int32Array): Int32Array {
  const { n, colPtr, rowIdx } = full;
  const parent = new Int32Array(n);
  const ancestor = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    parent[k] = -1;
    ancestor[k] = -1;
    const j = perm[k];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      // Walk from i to the root of its current subtree, compressing the path to k.
      let i = pinv[rowIdx[p]];
      while (i !== -1 && i < k) {
        const next = ancestor[i];
        ancestor[i] = k;
        if (next === -1) parent[i] = k;
        i = next;
      }
    }
  }
  return parent;
}

/**
 * Entries in each column of L (diagonal included), for a lower-triangular C whose elimination
 * tree is `parent` and whose natural order is already a postorder of that tree.
 */
export function countColumns(c: CscMatrix, parent: Int32Array): Int32Array {
  const { n, colPtr, rowIdx } = c;
  const delta = new Int32Array(n);
  const first = new Int32Array(n).fill(-1);
  const maxFirst = new Int32Array(n).fill(-1);
  const prevLeaf = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n);
  for (let j = 0; j < n; j++) {
    // first[j]: smallest postorder index in j's subtree; j is a leaf iff first is set here.
    delta[j] = first[j] === -1 ? 1 : 0;
    for (let q = j; q !== -1 && first[q] === -1; q = parent[q]) first[q] = j;
    ancestor[j] = j;
  }
  for (let j = 0; j < n; j++) {
    if (parent[j] !== -1) delta[parent[j]]--;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      // Is j a leaf of row i's subtree? Only if its subtree starts after the last leaf seen for i.
      if (i <= j || first[j] <= maxFirst[i]) continue;
      maxFirst[i] = first[j];
      const jPrev = prevLeaf[i];
      prevLeaf[i] = j;
      delta[j]++;
      if (jPrev === -1) continue;
      // Subsequent leaf: subtract the overlap at the least common ancestor of jPrev and j.
      let q = jPrev;
      while (q !== ancestor[q]) q = ancestor[q];
      for (let s = jPrev; s !== q;) {
        const sParent = ancestor[s];
        ancestor[s] = q;
        s = sParent;
      }
      delta[q]--;
    }
    if (parent[j] !== -1) ancestor[j] = parent[j];
  }
  for (let j = 0; j < n; j++) if (parent[j] !== -1) delta[parent[j]] += delta[j];
  return delta;
}
