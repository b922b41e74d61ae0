import { describe, expect, it } from "vitest";
import { orderReverseCuthillMcKee } from "@/lib/engine/sparse/ordering-rcm";
import type { AdjacencyGraph } from "@/lib/engine/sparse/types";
import { createRandom } from "./dense-reference";
import { graphOf, neighbours, randomTree, shuffled } from "./graphs";

// Reverse Cuthill–McKee checked against what the method promises, not against a second copy of the code
// (A. George & J. W. H. Liu, Computer Solution of Large Sparse Positive Definite Systems, 1981, chapter 4;
// from memory): read backwards, the order is a breadth-first search of each connected component in turn,
// each vertex's not yet numbered neighbours taken in increasing degree; each component starts from a
// pseudo-peripheral vertex, found by searching again from a vertex of least degree in the deepest level
// while the eccentricity grows.

const degree = (g: AdjacencyGraph, v: number) => g.ptr[v + 1] - g.ptr[v];

/** Breadth-first distances from `root`, −1 where unreachable. */
function distancesFrom(g: AdjacencyGraph, root: number): Int32Array {
  const dist = new Int32Array(g.n).fill(-1);
  dist[root] = 0;
  const queue = [root];
  for (let h = 0; h < queue.length; h++)
    for (const u of neighbours(g, queue[h]))
      if (dist[u] === -1) {
        dist[u] = dist[queue[h]] + 1;
        queue.push(u);
      }
  return dist;
}

const eccentricity = (g: AdjacencyGraph, v: number) => Math.max(...distancesFrom(g, v));

/** Largest eccentricity over the component of v, by a search from every vertex of it. */
function componentDiameter(g: AdjacencyGraph, v: number): number {
  const dist = distancesFrom(g, v);
  let d = 0;
  for (let u = 0; u < g.n; u++) if (dist[u] >= 0) d = Math.max(d, eccentricity(g, u));
  return d;
}

/**
 * Checks that `perm` is a permutation and, read backwards, a Cuthill–McKee order: a breadth-first search of
 * one component after another, the new neighbours of each vertex next and in nondecreasing degree (in any
 * order among equal degrees). Returns the vertex each component starts from.
 */
function expectCuthillMcKee(g: AdjacencyGraph, perm: Int32Array): number[] {
  expect(perm.length).toBe(g.n);
  expect([...perm].sort((a, b) => a - b)).toEqual(Array.from({ length: g.n }, (_, k) => k));
  const cm = [...perm].reverse();
  const numbered = new Uint8Array(g.n);
  const starts: number[] = [];
  let tail = 0;
  for (let head = 0; head < g.n; head++) {
    if (head === tail) {
      // A new component: nothing numbered so far reaches it.
      starts.push(cm[tail]);
      numbered[cm[tail++]] = 1;
    }
    const fresh = neighbours(g, cm[head]).filter((u) => !numbered[u]);
    const next = cm.slice(tail, tail + fresh.length);
    expect([...next].sort((a, b) => a - b)).toEqual(fresh);
    for (let k = 1; k < next.length; k++) expect(degree(g, next[k])).toBeGreaterThanOrEqual(degree(g, next[k - 1]));
    for (const u of next) numbered[u] = 1;
    tail += fresh.length;
  }
  return starts;
}

/** A rows × cols grid, vertex (r, c) numbered label(r * cols + c). */
function grid(rows: number, cols: number, label: (k: number) => number): AdjacencyGraph {
  const edges: [number, number][] = [];
  for (let r = 0; r < rows; r++)
    for (let c = 0; c < cols; c++) {
      if (c + 1 < cols) edges.push([label(r * cols + c), label(r * cols + c + 1)]);
      if (r + 1 < rows) edges.push([label(r * cols + c), label((r + 1) * cols + c)]);
    }
  return graphOf(rows * cols, edges);
}

/**
 * A cycle of 80 with `count` hanging paths, numbered from `first`: path k (3 + k vertices) hangs from position 42k
 * mod 80 and the cycle's vertex at position 40 is numbered `first`. Returns the edges, the paths' far ends and the
 * next free number.
 */
function cycleWithPaths(count: number, first: number): { edges: [number, number][]; ends: number[]; next: number } {
  const edges: [number, number][] = [];
  const atPosition = (p: number) => first + ((p + 40) % 80);
  for (let p = 0; p < 80; p++) edges.push([atPosition(p), atPosition(p + 1)]);
  const ends: number[] = [];
  let next = first + 80;
  for (let k = 0; k < count; k++) {
    let previous = atPosition((42 * k) % 80);
    for (let step = 0; step < 3 + k; step++) {
      edges.push([previous, next]);
      previous = next++;
    }
    ends.push(previous);
  }
  return { edges, ends, next };
}

describe("orderReverseCuthillMcKee", () => {
  it("reads backwards as a breadth-first search taking new neighbours in increasing degree (random graphs, some disconnected)", () => {
    const random = createRandom(31);
    for (let trial = 0; trial < 40; trial++) {
      const n = 1 + Math.floor(random() * 40);
      const density = random() * 0.25;
      const edges: [number, number][] = [];
      for (let a = 0; a < n; a++) for (let b = 0; b < a; b++) if (random() < density) edges.push([a, b]);
      expectCuthillMcKee(graphOf(n, edges), orderReverseCuthillMcKee(graphOf(n, edges)));
    }
  });

  it("starts each tree from an end of a longest path (eccentricity = diameter)", () => {
    // On a tree the vertex farthest from any vertex ends a longest path, so the search reaches one in at most two
    // steps (common practice: the double sweep for a tree's diameter).
    const random = createRandom(8);
    for (let trial = 0; trial < 30; trial++) {
      const g = randomTree(random, 2 + Math.floor(random() * 40));
      const [start] = expectCuthillMcKee(g, orderReverseCuthillMcKee(g));
      expect(eccentricity(g, start)).toBe(componentDiameter(g, start));
    }
  });

  it("starts a grid from a corner, whatever the numbering", () => {
    // The vertices farthest from any vertex of a rectangular grid are corners (|Δr| + |Δc| is largest at a corner),
    // and a corner's eccentricity is rows + cols − 2, the diameter (common practice).
    const random = createRandom(12);
    for (const [rows, cols] of [
      [5, 7],
      [6, 6],
      [3, 9],
    ]) {
      const label = shuffled(random, rows * cols);
      const g = grid(rows, cols, (k) => label[k]);
      const [start] = expectCuthillMcKee(g, orderReverseCuthillMcKee(g));
      const corners = [0, cols - 1, (rows - 1) * cols, rows * cols - 1].map((k) => label[k]);
      expect(corners).toContain(start);
      expect(eccentricity(g, start)).toBe(rows + cols - 2);
    }
  });

  it("orders a path, then a cycle, then a lone vertex each on its own, every component from a peripheral vertex", () => {
    // Path 0–1–…–5, cycle 6–7–8–9–10–6, vertex 11 alone. A path's ends and every vertex of a cycle are peripheral.
    const edges: [number, number][] = [];
    for (let v = 0; v < 5; v++) edges.push([v, v + 1]);
    for (let v = 6; v < 11; v++) edges.push([v, v === 10 ? 6 : v + 1]);
    const g = graphOf(12, edges);
    const starts = expectCuthillMcKee(g, orderReverseCuthillMcKee(g));
    expect(starts).toHaveLength(3);
    expect([0, 5]).toContain(starts[0]);
    expect(starts[1]).toBeGreaterThanOrEqual(6);
    expect(starts[1]).toBeLessThanOrEqual(10);
    expect(starts[2]).toBe(11);
  });

  it("starts a path from the end farther from vertex 0, and returns the search reversed", () => {
    // Path of 10 with vertex (3p + 5) mod 10 at position p: vertex 0 sits at p = 5, so the deepest level of the
    // search from it is the single end p = 0 (vertex 5, 5 steps away; the other end is 4 away). From there the
    // eccentricity grows from 5 to 9, and from the far end (vertex 2) it does not grow again, so the search
    // stops at vertex 5, which Cuthill–McKee numbers first and its reverse last.
    const label = (p: number) => (3 * p + 5) % 10;
    const g = graphOf(
      10,
      Array.from({ length: 9 }, (_, p) => [label(p), label(p + 1)] as const),
    );
    const perm = orderReverseCuthillMcKee(g);
    expect(Array.from(perm)).toEqual(Array.from({ length: 10 }, (_, p) => label(9 - p)));
  });

  it("gives the order worked by hand for a square with three pendants", () => {
    // Square 0–3–1–6–0, vertices 4 and 5 hung from 3, vertex 2 from 6 (degrees 0:2, 1:2, 2:1, 3:4, 4:1, 5:1, 6:3).
    // Neighbours are visited in ascending number; among equal degrees the first met is kept (by hand):
    // - from 0: levels {0}, {3, 6}, {1, 4, 5, 2}; least degree in the deepest level, first met: 4 (eccentricity 2);
    // - from 4: levels {4}, {3}, {0, 1, 5}, {6}, {2}; eccentricity 4 > 2, so 4 becomes the start; next try 2;
    // - from 2: levels {2}, {6}, {0, 1}, {3}, {4, 5}; eccentricity 4, not more: stop, start from 4;
    // - Cuthill–McKee from 4: 4, 3, then 3's new neighbours 0, 1, 5 by degree (5, then 0 and 1 as met), then 0's
    //   new neighbour 6, then 6's new neighbour 2: 4, 3, 5, 0, 1, 6, 2; reversed below.
    const g = graphOf(7, [
      [0, 3],
      [0, 6],
      [1, 3],
      [1, 6],
      [2, 6],
      [3, 4],
      [3, 5],
    ]);
    expect(Array.from(orderReverseCuthillMcKee(g))).toEqual([2, 6, 1, 0, 5, 3, 4]);
  });

  it("gives the order worked by hand for a graph where the choice in the deepest level decides the start", () => {
    // Degrees 0:3, 1:2, 2:4, 3:2, 4:3, 5:2, 6:2, 7:2; neighbours in ascending number, ties to the first met (by hand):
    // - from 0: levels {0}, {2, 4, 6}, {1, 3, 7, 5}; all of degree 2, so 1 (eccentricity 2);
    // - from 1: levels {1}, {2, 7}, {0, 3, 4}, {6, 5}; eccentricity 3 > 2, start 1, next try 6 (first of degree 2);
    // - from 6: levels {6}, {0, 5}, {2, 4, 3}, {1, 7}; eccentricity 3: stop, start from 1;
    // - Cuthill–McKee from 1: 1; its new neighbours 7, 2 by degree; 7's new 4; 2's new 3, 0 by degree; 3's new 5;
    //   0's new 6: 1, 7, 2, 4, 3, 0, 5, 6; reversed below. (Had the search from 1 met 5 before 6 in its deepest level,
    //   it would have gone on from 5, whose eccentricity is 4.)
    const g = graphOf(8, [
      [0, 2],
      [0, 4],
      [0, 6],
      [1, 2],
      [1, 7],
      [2, 3],
      [2, 4],
      [3, 5],
      [4, 7],
      [5, 6],
    ]);
    expect(Array.from(orderReverseCuthillMcKee(g))).toEqual([6, 5, 0, 3, 4, 2, 7, 1]);
  });

  it("stops the search for a peripheral vertex after eight restarts", () => {
    // A cycle of 80 with 12 hanging paths: path k (3 + k vertices) hangs from position 42k mod 80, and vertex 0 sits
    // at position 40. From the end of path k the farthest vertex is the end of path k + 1, at (3 + k) + 38 + (4 + k)
    // (the two positions are 38 apart round the cycle; every other end is nearer, by hand), so each restart adds 2
    // to the eccentricity and the search would walk on to path 10. From vertex 0 the farthest is the end of path 0
    // (40 + 3). The search restarts at most eight times (ordering-rcm.ts), from the ends of paths 0 to 7, so
    // Cuthill–McKee starts from the end of path 7, which the reverse numbers last.
    const { edges, ends, next } = cycleWithPaths(12, 0);
    const g = graphOf(next, edges);
    const perm = orderReverseCuthillMcKee(g);
    expectCuthillMcKee(g, perm);
    expect(perm[g.n - 1]).toBe(ends[7]);
    // The eccentricities along the way, by breadth-first search: 43 from vertex 0, then 45, 47, … from the ends.
    expect(eccentricity(g, 0)).toBe(43);
    for (let k = 0; k < 8; k++) expect(eccentricity(g, ends[k])).toBe(45 + 2 * k);
  });

  it("searches as far in a component that follows another whose search took four steps", () => {
    // The same cycle with four hanging paths comes first. Its search from 0 goes on from the ends of paths 0, 1, 2 and
    // 3 (four searches in the loop); from the end of path 3 the eccentricity is 6 + 38 + 5 = 49, as from path 2, so
    // the component starts from the end of path 2. The one with twelve paths follows, numbered after it; its search
    // is its own and still stops at the end of its path 7.
    const before = cycleWithPaths(4, 0);
    const after = cycleWithPaths(12, before.next);
    const g = graphOf(after.next, [...before.edges, ...after.edges]);
    const starts = expectCuthillMcKee(g, orderReverseCuthillMcKee(g));
    expect(starts).toEqual([before.ends[2], after.ends[7]]);
  });

  it("orders the empty graph and a graph with no edges", () => {
    expect(orderReverseCuthillMcKee(graphOf(0, []))).toHaveLength(0);
    const g = graphOf(4, []);
    expect(expectCuthillMcKee(g, orderReverseCuthillMcKee(g))).toEqual([0, 1, 2, 3]);
  });
});
