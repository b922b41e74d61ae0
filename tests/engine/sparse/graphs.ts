import type { AdjacencyGraph } from "@/lib/engine/sparse/types";

/** Undirected graph from an edge list, each vertex's neighbours ascending (as buildAdjacency gives them). */
export function graphOf(n: number, edges: ReadonlyArray<readonly [number, number]>): AdjacencyGraph {
  const lists = Array.from({ length: n }, () => new Set<number>());
  for (const [a, b] of edges) {
    if (a === b) continue;
    lists[a].add(b);
    lists[b].add(a);
  }
  const ptr = new Int32Array(n + 1);
  lists.forEach((l, v) => (ptr[v + 1] = ptr[v] + l.size));
  const adj = new Int32Array(ptr[n]);
  lists.forEach((l, v) =>
    adj.set(
      [...l].sort((x, y) => x - y),
      ptr[v],
    ),
  );
  return { n, ptr, adj };
}

export function neighbours(g: AdjacencyGraph, v: number): number[] {
  return Array.from(g.adj.subarray(g.ptr[v], g.ptr[v + 1]));
}

/** A random permutation of 0 … n − 1 (Fisher–Yates). */
export function shuffled(random: () => number, n: number): number[] {
  const a = Array.from({ length: n }, (_, k) => k);
  for (let k = n - 1; k > 0; k--) {
    const j = Math.floor(random() * (k + 1));
    [a[k], a[j]] = [a[j], a[k]];
  }
  return a;
}

/** A random tree on n vertices, each vertex after the first hung from an earlier one, then relabelled at random. */
export function randomTree(random: () => number, n: number): AdjacencyGraph {
  const label = shuffled(random, n);
  const edges: [number, number][] = [];
  for (let v = 1; v < n; v++) edges.push([label[v], label[Math.floor(random() * v)]]);
  return graphOf(n, edges);
}

/**
 * Off-diagonal entries of L when the graph's vertices are eliminated in the order perm, by brute force: each
 * vertex's later neighbours become a clique (common practice: the elimination graph).
 */
export function fillCount(g: AdjacencyGraph, perm: ArrayLike<number>): number {
  const pos = new Int32Array(g.n);
  for (let k = 0; k < g.n; k++) pos[perm[k]] = k;
  const adj = Array.from({ length: g.n }, (_, v) => new Set(neighbours(g, v)));
  let count = 0;
  for (let k = 0; k < g.n; k++) {
    const v = perm[k];
    const later = [...adj[v]].filter((u) => pos[u] > k);
    count += later.length;
    for (const a of later) for (const b of later) if (a !== b) adj[a].add(b);
  }
  return count;
}
