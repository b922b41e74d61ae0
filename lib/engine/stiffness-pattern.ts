/**
 * K's compressed-column pattern built straight from the member list: no triplets, no sort, no copies. Rows of
 * a column are the node's own equations from the diagonal down, then the equations of each connected node
 * with a higher index, in ascending order (equations are numbered node-major, so that is ascending rows).
 */
import type { DofMap } from "./dofs";
import { DOFS_PER_NODE } from "./dofs";

export interface StiffnessPattern {
  readonly n: number;
  readonly colPtr: Int32Array;
  readonly rowIdx: Int32Array;
  /** Per node: its first equation and how many free equations it has. */
  readonly firstEq: Int32Array;
  readonly freeCount: Int32Array;
  /** Per member: where the (higher node, lower node) block starts below the lower node's own block. */
  readonly memberOffset: Int32Array;
}

/** `ends[2m]`, `ends[2m + 1]`: the two node indices of member m (distinct). */
export function stiffnessPattern(ends: Int32Array, dofs: DofMap): StiffnessPattern {
  const nNodes = dofs.nNodes;
  const nMembers = ends.length / 2;
  const firstEq = new Int32Array(nNodes);
  const freeCount = new Int32Array(nNodes);
  for (let node = 0, next = 0; node < nNodes; node++) {
    firstEq[node] = next;
    for (let d = 0; d < DOFS_PER_NODE; d++) if (dofs.equation[DOFS_PER_NODE * node + d] >= 0) freeCount[node]++;
    next += freeCount[node];
  }
  // Higher neighbours of each node, with the member that links them: counting sort by the lower node.
  const ptr = new Int32Array(nNodes + 1);
  for (let m = 0; m < nMembers; m++) ptr[Math.min(ends[2 * m], ends[2 * m + 1]) + 1]++;
  for (let v = 0; v < nNodes; v++) ptr[v + 1] += ptr[v];
  const fill = ptr.slice(0, nNodes);
  const nbr = new Int32Array(nMembers);
  const via = new Int32Array(nMembers);
  for (let m = 0; m < nMembers; m++) {
    const a = ends[2 * m];
    const b = ends[2 * m + 1];
    const q = fill[Math.min(a, b)]++;
    nbr[q] = Math.max(a, b);
    via[q] = m;
  }
  // Per node: sort its few neighbours (insertion sort), merge parallel members, and give each distinct
  // neighbour its offset below the node's own block; a member's offset is its neighbour's.
  const memberOffset = new Int32Array(nMembers);
  const below = new Int32Array(nNodes); // rows below the own block, the same for each of the node's columns
  for (let v = 0; v < nNodes; v++) {
    const p0 = ptr[v];
    const p1 = ptr[v + 1];
    for (let p = p0 + 1; p < p1; p++) {
      const key = nbr[p];
      const m = via[p];
      let q = p - 1;
      for (; q >= p0 && nbr[q] > key; q--) {
        nbr[q + 1] = nbr[q];
        via[q + 1] = via[q];
      }
      nbr[q + 1] = key;
      via[q + 1] = m;
    }
    let offset = 0;
    for (let p = p0; p < p1; p++) {
      if (p > p0 && nbr[p] === nbr[p - 1]) {
        memberOffset[via[p]] = memberOffset[via[p - 1]];
        continue;
      }
      memberOffset[via[p]] = offset;
      offset += freeCount[nbr[p]];
    }
    below[v] = offset;
  }
  const n = dofs.nFree;
  const colPtr = new Int32Array(n + 1);
  for (let v = 0; v < nNodes; v++) {
    const f = freeCount[v];
    for (let r = 0; r < f; r++) colPtr[firstEq[v] + r + 1] = f - r + below[v];
  }
  for (let e = 0; e < n; e++) colPtr[e + 1] += colPtr[e];
  const rowIdx = new Int32Array(colPtr[n]);
  for (let v = 0; v < nNodes; v++) {
    const f = freeCount[v];
    for (let r = 0; r < f; r++) {
      const e = firstEq[v] + r;
      let q = colPtr[e];
      for (let i = e; i < firstEq[v] + f; i++) rowIdx[q++] = i;
      for (let p = ptr[v]; p < ptr[v + 1]; p++) {
        if (p > ptr[v] && nbr[p] === nbr[p - 1]) continue;
        const w = nbr[p];
        for (let t = 0; t < freeCount[w]; t++) rowIdx[q++] = firstEq[w] + t;
      }
    }
  }
  return { n, colPtr, rowIdx, firstEq, freeCount, memberOffset };
}

/**
 * Position in the pattern of K[row, col] (row ≥ col) where row is an equation of node `rowNode`, col of node
 * `colNode` (colNode ≤ rowNode), and `member` links them when the nodes differ.
 */
export function patternPosition(
  pat: StiffnessPattern,
  member: number,
  rowNode: number,
  row: number,
  colNode: number,
  col: number,
): number {
  if (rowNode === colNode) return pat.colPtr[col] + row - col;
  const ownBelow = pat.firstEq[colNode] + pat.freeCount[colNode] - col;
  return pat.colPtr[col] + ownBelow + pat.memberOffset[member] + row - pat.firstEq[rowNode];
}
