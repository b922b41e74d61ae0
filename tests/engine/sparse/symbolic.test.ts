import { describe, expect, it } from "vitest";
import { computeOrdering, factorizeSymmetric, type OrderingMethod } from "@/lib/engine/sparse";
import { createRandom, randomSpdMatrix, toDense } from "./dense-reference";

/** nnz(L) by brute-force boolean elimination of the permuted dense pattern. */
function countFillDense(pattern: boolean[][], perm: Int32Array): number {
  const n = perm.length;
  const p = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => pattern[perm[i]][perm[j]]));
  let count = 0;
  for (let k = 0; k < n; k++) {
    const below: number[] = [];
    for (let i = k + 1; i < n; i++) if (p[i][k]) below.push(i);
    count += 1 + below.length;
    for (const i of below) for (const j of below) p[i][j] = true;
  }
  return count;
}

describe("symbolic analysis", () => {
  it.each<OrderingMethod>(["amd", "rcm", "natural"])("nnz(L) matches brute-force elimination (%s)", (method) => {
    const random = createRandom(77);
    for (let trial = 0; trial < 15; trial++) {
      const blockSize = trial % 2 === 0 ? 1 : 3;
      const a = randomSpdMatrix(random, 5 + Math.floor(random() * 30), blockSize, random() * 0.2);
      const dense = toDense(a);
      const pattern = dense.map((row) => row.map((v) => v !== 0));
      const result = factorizeSymmetric(a, { ordering: method, blockSize });
      if (!result.ok) throw new Error("random matrix should be SPD");
      const perm = computeOrdering(a, method, blockSize);
      // The factorisation postorders the ordering's elimination tree, which leaves nnz(L) unchanged.
      expect(result.factor.stats.nnzL).toBe(countFillDense(pattern, perm));
    }
  });
});
