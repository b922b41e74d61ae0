import { describe, expect, it } from "vitest";
import { orderApproximateMinimumDegree } from "@/lib/engine/sparse/ordering-amd";
import { createRandom } from "./dense-reference";
import { fillCount, graphOf, randomTree, shuffled } from "./graphs";

// Approximate minimum degree checked by what a minimum degree order must give, counted by brute-force
// elimination, not by a second copy of the code.

function expectPermutation(perm: Int32Array, n: number): void {
  expect([...perm].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, k) => k));
}

describe("orderApproximateMinimumDegree", () => {
  it("orders a tree (and a forest) with no fill", () => {
    // A vertex of least degree in a forest is a leaf or alone, and eliminating it adds no edge (common practice).
    // The approximate degree is exact here: each element a leaf leaves behind holds one variable, its neighbour,
    // so no two elements overlap (by hand). So L has exactly the tree's edges below its diagonal.
    const random = createRandom(41);
    for (let trial = 0; trial < 30; trial++) {
      const n = 1 + Math.floor(random() * 60);
      const g = randomTree(random, n);
      const perm = orderApproximateMinimumDegree(g);
      expectPermutation(perm, n);
      expect(fillCount(g, perm)).toBe(g.ptr[n] / 2);
    }
    // Two trees and a lone vertex, numbered apart.
    const forest = graphOf(9, [
      [0, 4],
      [4, 8],
      [8, 2],
      [1, 5],
      [5, 3],
      [5, 7],
    ]);
    const perm = orderApproximateMinimumDegree(forest);
    expectPermutation(perm, 9);
    expect(fillCount(forest, perm)).toBe(6);
  });

  it("eliminates the small side of a complete bipartite graph first: only the large side's three vertices fill in", () => {
    // K(3, 20): each of the 20 has degree 3, each of the 3 has degree 20. Minimum degree takes the 20 first; the
    // first one makes the 3 a clique (3 new entries) and the rest add nothing: 60 + 3 entries below the diagonal
    // (by hand). Taking one of the 3 first would join all 20 instead.
    const random = createRandom(5);
    const label = shuffled(random, 23);
    const edges: [number, number][] = [];
    for (let a = 0; a < 3; a++) for (let b = 3; b < 23; b++) edges.push([label[a], label[b]]);
    const g = graphOf(23, edges);
    const perm = orderApproximateMinimumDegree(g);
    expectPermutation(perm, 23);
    expect(fillCount(g, perm)).toBe(63);
  });

  it("orders last a vertex of more than max(16, 10√n) neighbours, and not one of exactly that many", () => {
    // n = 400: the threshold is 10·√400 = 200 (Davis, Direct Methods for Sparse Linear Systems, 2006, cs_amd's
    // default, from memory). Vertex 1 has 201 neighbours, vertex 0 has 200; the rest form a path 2–3–…–399.
    const edges: [number, number][] = [];
    for (let v = 2; v < 203; v++) edges.push([1, v]);
    for (let v = 200; v < 400; v++) edges.push([0, v]);
    for (let v = 3; v < 400; v++) edges.push([v, v - 1]);
    const g = graphOf(400, edges);
    expect(g.ptr[2] - g.ptr[1]).toBe(201);
    expect(g.ptr[1] - g.ptr[0]).toBe(200);
    const perm = orderApproximateMinimumDegree(g);
    expectPermutation(perm, 400);
    expect(perm[399]).toBe(1);
    // Vertex 0 is ordered with the others: its 200 neighbours on the path go before it, not all after.
    expect(Array.from(perm).indexOf(0)).toBeLessThan(398);
  });

  it("orders random graphs that outgrow the workspace's spare room into permutations with less fill than natural order", () => {
    // Sparse random graphs of 100 to 200 vertices make more new elements than the spare room (a fifth of the edges
    // plus 2n) holds, so the workspace is compacted part-way (checked by hand with a counter in the compaction).
    // Whatever the order, it must be a permutation; a minimum degree order fills in far less than the numbering.
    const random = createRandom(17);
    for (const [n, density] of [
      [100, 0.05],
      [100, 0.1],
      [150, 0.05],
      [200, 0.05],
      [200, 0.1],
    ]) {
      const edges: [number, number][] = [];
      for (let a = 0; a < n; a++) for (let b = 0; b < a; b++) if (random() < density) edges.push([a, b]);
      const g = graphOf(n, edges);
      const perm = orderApproximateMinimumDegree(g);
      expectPermutation(perm, n);
      const natural = Array.from({ length: n }, (_, k) => k);
      expect(fillCount(g, perm)).toBeLessThan(0.8 * fillCount(g, natural));
    }
  });

  it("returns nothing for the empty graph and every vertex for a graph with no edges", () => {
    expect(orderApproximateMinimumDegree(graphOf(0, []))).toHaveLength(0);
    expectPermutation(orderApproximateMinimumDegree(graphOf(5, [])), 5);
  });
});
