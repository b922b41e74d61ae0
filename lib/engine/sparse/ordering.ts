import { buildAdjacency } from "./csc";
import { orderApproximateMinimumDegree } from "./ordering-amd";
import { orderReverseCuthillMcKee } from "./ordering-rcm";
import type { OrderingMethod, SymmetricCsc } from "./types";

/** perm[k] = original index eliminated k-th. With blockSize b, node k's equations k*b..k*b+b-1 stay together and in order. */
export function computeOrdering(a: SymmetricCsc, method: OrderingMethod, blockSize = 1): Int32Array {
  const n = a.n;
  if (method === "natural") {
    const perm = new Int32Array(n);
    for (let k = 0; k < n; k++) perm[k] = k;
    return perm;
  }
  const graph = buildAdjacency(a, blockSize);
  let nodePerm: Int32Array;
  if (method === "amd") nodePerm = orderApproximateMinimumDegree(graph);
  else if (method === "rcm") nodePerm = orderReverseCuthillMcKee(graph);
  else throw new Error(`computeOrdering: unknown method ${String(method)}`);
  return expandBlocks(nodePerm, blockSize);
}

function expandBlocks(nodePerm: Int32Array, b: number): Int32Array {
  if (b === 1) return nodePerm;
  const perm = new Int32Array(nodePerm.length * b);
  for (let k = 0; k < nodePerm.length; k++) {
    const base = nodePerm[k] * b;
    for (let t = 0; t < b; t++) perm[k * b + t] = base + t;
  }
  return perm;
}

/** pinv[perm[k]] = k; throws if perm is not a permutation of 0..n-1 (guards ordering bugs). */
export function invertPermutation(perm: Int32Array): Int32Array {
  const n = perm.length;
  const pinv = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const i = perm[k];
    if (i < 0 || i >= n || pinv[i] !== -1) throw new Error(`invalid permutation at position ${k}`);
    pinv[i] = k;
  }
  return pinv;
}
