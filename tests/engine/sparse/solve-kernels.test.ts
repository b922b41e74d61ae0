import { describe, expect, it } from "vitest";
import { computeOrdering, factorizeSymmetric, type SymmetricCsc } from "@/lib/engine/sparse";
import { analyzeSymbolic } from "@/lib/engine/sparse/symbolic";
import { createRandom, randomSpdMatrix, relativeError, solveDense, toDense } from "./dense-reference";

// The supernodal triangular solves (solve-kernels.ts) take two right-hand sides at once and the columns of a
// supernode four at a time, then one at a time. Each right-hand side is checked against a dense Cholesky solve of
// its own, on matrices whose supernodes have both paths and rows below their diagonal block.

/** Widths of the supernodes that have rows below their own columns. */
function widthsWithRowsBelow(a: SymmetricCsc): number[] {
  const { structure: sn } = analyzeSymbolic(a, computeOrdering(a, "amd", 3));
  const widths: number[] = [];
  for (let s = 0; s < sn.count; s++) {
    const cols = sn.superStart[s + 1] - sn.superStart[s];
    if (sn.rowPtr[s + 1] - sn.rowPtr[s] > cols) widths.push(cols);
  }
  return widths;
}

describe("solvePairInPlace, through solve and solveMany", () => {
  it("solves one, two and three right-hand sides, each to 1e-12 of a dense solve, with wide and narrow supernodes", () => {
    const random = createRandom(404);
    const kinds = new Set<string>();
    for (let trial = 0; trial < 12; trial++) {
      const a = randomSpdMatrix(random, 8 + Math.floor(random() * 20), 3, 0.05 + random() * 0.3);
      for (const w of widthsWithRowsBelow(a)) kinds.add(w < 4 ? "under four" : w % 4 === 0 ? "fours only" : "fours and the rest");
      const result = factorizeSymmetric(a, { ordering: "amd", blockSize: 3 });
      if (!result.ok) throw new Error("random diagonally dominant matrix should be SPD");
      const dense = toDense(a);
      const bs = [0, 1, 2].map(() => Float64Array.from({ length: a.n }, () => random() * 2 - 1));
      const references = bs.map((b) => solveDense(dense, b));
      expect(relativeError(result.factor.solve(bs[0]), references[0])).toBeLessThan(1e-12);
      for (const count of [2, 3]) {
        const xs = result.factor.solveMany(bs.slice(0, count));
        xs.forEach((x, r) => expect(relativeError(x, references[r])).toBeLessThan(1e-12));
      }
    }
    // Supernodes with rows below were of all three kinds: fewer than four columns, a multiple of four, and four or
    // more that leave some over.
    expect([...kinds].sort()).toEqual(["fours and the rest", "fours only", "under four"]);
  });
});
