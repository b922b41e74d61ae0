import type { AdjacencyGraph } from "./types";

// Reverse Cuthill–McKee with a George–Liu pseudo-peripheral start node per connected component
// (A. George & J. W. H. Liu, Computer Solution of Large Sparse Positive Definite Systems, 1981; from memory).

/**
 * Breadth-first level structure from `root` over unvisited vertices; writes the visit order into
 * `queue` from `start` and returns [end, eccentricity, last vertex of the deepest level with
 * minimum degree]. Marks visited vertices with `stamp`.
 */
function traverseLevels(
  graph: AdjacencyGraph,
  root: number,
  stamp: number,
  seen: Int32Array,
  queue: Int32Array,
  start: number,
  sortByDegree: boolean,
): [number, number, number] {
  const { ptr, adj } = graph;
  let tail = start;
  queue[tail++] = root;
  seen[root] = stamp;
  let levelStart = start;
  let depth = 0;
  let minDegreeVertex = root;
  while (true) {
    const levelEnd = tail;
    for (let q = levelStart; q < levelEnd; q++) {
      const v = queue[q];
      const firstNew = tail;
      for (let p = ptr[v]; p < ptr[v + 1]; p++) {
        const u = adj[p];
        if (seen[u] !== stamp) {
          seen[u] = stamp;
          queue[tail++] = u;
        }
      }
      if (sortByDegree && tail - firstNew > 1) sortSliceByDegree(graph, queue, firstNew, tail);
    }
    if (tail === levelEnd) {
      // Deepest level is [levelStart, levelEnd): pick its minimum-degree vertex.
      let best = -1;
      for (let q = levelStart; q < levelEnd; q++) {
        const v = queue[q];
        const d = ptr[v + 1] - ptr[v];
        if (best === -1 || d < best) {
          best = d;
          minDegreeVertex = v;
        }
      }
      return [tail, depth, minDegreeVertex];
    }
    levelStart = levelEnd;
    depth++;
  }
}

/** Insertion sort: neighbour lists are short, so this beats a general sort. */
function sortSliceByDegree(graph: AdjacencyGraph, queue: Int32Array, from: number, to: number): void {
  const { ptr } = graph;
  for (let a = from + 1; a < to; a++) {
    const v = queue[a];
    const dv = ptr[v + 1] - ptr[v];
    let b = a - 1;
    while (b >= from && ptr[queue[b] + 1] - ptr[queue[b]] > dv) {
      queue[b + 1] = queue[b];
      b--;
    }
    queue[b + 1] = v;
  }
}

/** perm[k] = vertex eliminated k-th. */
export function orderReverseCuthillMcKee(graph: AdjacencyGraph): Int32Array {
  const n = graph.n;
  const order = new Int32Array(n);
  const seen = new Int32Array(n).fill(-1);
  const scratch = new Int32Array(n);
  const placed = new Uint8Array(n);
  let stamp = 0;
  let filled = 0;
  for (let s = 0; s < n; s++) {
    if (placed[s]) continue;
    // Pseudo-peripheral node: restart from the far end while eccentricity grows.
    let root = s;
    let [, ecc, far] = traverseLevels(graph, root, ++stamp, seen, scratch, 0, false);
    for (let iter = 0; iter < 8; iter++) {
      const [, ecc2, far2] = traverseLevels(graph, far, ++stamp, seen, scratch, 0, false);
      if (ecc2 <= ecc) break;
      root = far;
      ecc = ecc2;
      far = far2;
    }
    const [end] = traverseLevels(graph, root, ++stamp, seen, order, filled, true);
    for (let q = filled; q < end; q++) placed[order[q]] = 1;
    filled = end;
  }
  return order.reverse();
}
