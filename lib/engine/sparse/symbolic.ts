import { expandSymmetric, permuteToLower, type CscMatrix } from "./csc";
import { computeEliminationTree, countColumns } from "./etree";
import { invertPermutation } from "./ordering";
import { buildSupernodes, type SupernodalStructure } from "./supernodes";
import { postorderForest } from "./tree";
import type { SymmetricCsc } from "./types";

export interface SymbolicAnalysis {
  /** Final elimination order: the fill-reducing order, postordered by its elimination tree. */
  perm: Int32Array;
  /** Lower triangle of P A Pᵀ with the final order. */
  permuted: CscMatrix;
  structure: SupernodalStructure;
  /** Structural nonzeros of L, diagonal included (relaxed supernodes store some explicit zeros on top). */
  nnzL: number;
}

/** Elimination tree, postorder (so supernodes are contiguous), column counts and supernodes. */
export function analyzeSymbolic(a: SymmetricCsc, fillReducing: Int32Array): SymbolicAnalysis {
  const n = a.n;
  const full = expandSymmetric(a);
  let perm = fillReducing;
  let pinv = invertPermutation(perm);
  let parent = computeEliminationTree(full, perm, pinv);
  const post = postorderForest(parent);
  let isIdentity = true;
  for (let k = 0; k < n && isIdentity; k++) isIdentity = post[k] === k;
  if (!isIdentity) {
    // Relabel by the postorder; fill is unchanged, but descendants now precede ancestors contiguously.
    const composed = new Int32Array(n);
    for (let k = 0; k < n; k++) composed[k] = perm[post[k]];
    perm = composed;
    pinv = invertPermutation(perm);
    const postInv = invertPermutation(post);
    const relabeled = new Int32Array(n);
    for (let k = 0; k < n; k++) {
      const p = parent[post[k]];
      relabeled[k] = p === -1 ? -1 : postInv[p];
    }
    parent = relabeled;
  }
  const permuted = permuteToLower(full, perm, pinv);
  const colCount = countColumns(permuted, parent);
  let nnzL = 0;
  for (let j = 0; j < n; j++) nnzL += colCount[j];
  return { perm, permuted, structure: buildSupernodes(permuted, parent, colCount), nnzL };
}
