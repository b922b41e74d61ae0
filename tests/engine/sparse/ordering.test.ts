import { describe, expect, it } from "vitest";
import {
  computeOrdering,
  factorizeSymmetric,
  multiplySymmetric,
  SymmetricTripletBuilder,
  type OrderingMethod,
} from "@/lib/engine/sparse";
import { invertPermutation } from "@/lib/engine/sparse/ordering";
import { createRandom, randomSpdMatrix, relativeError } from "./dense-reference";
import { buildFrameMatrix } from "./frame-matrix";

const methods: OrderingMethod[] = ["amd", "rcm", "natural"];

function expectPermutation(perm: Int32Array, n: number): void {
  expect(perm.length).toBe(n);
  const seen = new Uint8Array(n);
  for (const i of perm) {
    expect(i >= 0 && i < n).toBe(true);
    expect(seen[i]).toBe(0);
    seen[i] = 1;
  }
}

function nnzL(storeys: number, bays: number, ordering: OrderingMethod): number {
  const frame = buildFrameMatrix(storeys, bays);
  const result = factorizeSymmetric(frame.matrix, { ordering, blockSize: frame.blockSize });
  if (!result.ok) throw new Error("frame matrix should be SPD");
  return result.factor.stats.nnzL;
}

describe("computeOrdering", () => {
  it.each(methods)("%s returns a valid permutation (random matrices, blockSize 1 and 3)", (method) => {
    const random = createRandom(3);
    for (const blockSize of [1, 3]) {
      for (const density of [0, 0.05, 0.3, 1]) {
        const a = randomSpdMatrix(random, 30, blockSize, density);
        expectPermutation(computeOrdering(a, method, blockSize), a.n);
      }
    }
  });

  it.each(methods)("%s keeps each node's equations together and in order with blockSize 3", (method) => {
    const frame = buildFrameMatrix(6, 5);
    const perm = computeOrdering(frame.matrix, method, 3);
    expectPermutation(perm, frame.matrix.n);
    for (let k = 0; k < perm.length; k += 3) {
      expect(perm[k] % 3).toBe(0);
      expect(perm[k + 1]).toBe(perm[k] + 1);
      expect(perm[k + 2]).toBe(perm[k] + 2);
    }
  });

  it("handles dense rows (AMD defers them) and still solves correctly", () => {
    const random = createRandom(5);
    const n = 400;
    const builder = new SymmetricTripletBuilder(n);
    for (let i = 0; i < n; i++) {
      builder.add(i, i, 2 * n);
      if (i > 0) builder.add(i, 0, 1); // row 0 is dense
      if (i > 1) builder.add(i, 1, -1); // and row 1
      if (i > 2) builder.add(i, Math.floor(random() * (i - 2)) + 2, random());
    }
    const a = builder.toCsc();
    expectPermutation(computeOrdering(a, "amd"), n);
    const result = factorizeSymmetric(a, { ordering: "amd" });
    if (!result.ok) throw new Error("arrow matrix should be SPD");
    const b = Float64Array.from({ length: n }, () => random() - 0.5);
    expect(relativeError(multiplySymmetric(a, result.factor.solve(b)), b)).toBeLessThan(1e-12);
  });

  it("rejects a blockSize that does not divide n", () => {
    const frame = buildFrameMatrix(2, 2);
    expect(() => computeOrdering(frame.matrix, "amd", 4)).toThrow(/blockSize/);
  });

  it("AMD gives markedly less fill than natural and RCM on a 40×40 frame", () => {
    const amd = nnzL(40, 40, "amd");
    const rcm = nnzL(40, 40, "rcm");
    const natural = nnzL(40, 40, "natural");
    expect(amd / rcm).toBeLessThan(0.5);
    expect(amd / natural).toBeLessThan(0.5);
  });

  it("AMD on the node graph (blockSize 3) is about as good as on the scalar graph", () => {
    const frame = buildFrameMatrix(20, 20);
    const scalar = factorizeSymmetric(frame.matrix, { ordering: "amd", blockSize: 1 });
    const blocked = factorizeSymmetric(frame.matrix, { ordering: "amd", blockSize: 3 });
    if (!scalar.ok || !blocked.ok) throw new Error("frame matrix should be SPD");
    expect(blocked.factor.stats.nnzL / scalar.factor.stats.nnzL).toBeLessThan(1.3);
  });

  it("orders a path numbered out of order along the path (bandwidth 1), starting from an end found from the middle", () => {
    // Vertex at position p along a path of 10 carries number (3p + 5) mod 10, so vertex 0 sits in the middle.
    // Reverse Cuthill–McKee from a peripheral vertex of a path visits it end to end (George & Liu, Computer
    // Solution of Large Sparse Positive Definite Systems, 1981, chapter 4; from memory): neighbours along the
    // path end up next to each other in the order.
    const label = (p: number) => (3 * p + 5) % 10;
    const builder = new SymmetricTripletBuilder(10);
    for (let p = 0; p < 10; p++) builder.add(label(p), label(p), 4);
    for (let p = 0; p < 9; p++) builder.add(label(p), label(p + 1), -1);
    const perm = computeOrdering(builder.toCsc(), "rcm");
    const at = new Map(Array.from(perm, (v, k) => [v, k]));
    expect(at.size).toBe(10);
    for (let p = 0; p < 9; p++) expect(Math.abs(at.get(label(p))! - at.get(label(p + 1))!)).toBe(1);
  });

  it("refuses a method it does not know, naming it", () => {
    const a = randomSpdMatrix(createRandom(3), 4, 1, 0.5);
    expect(() => computeOrdering(a, "metis" as OrderingMethod)).toThrow("computeOrdering: unknown method metis");
  });

  it("refuses a block size that is not a whole number ≥ 1 dividing n", () => {
    const a = randomSpdMatrix(createRandom(4), 5, 1, 0.5);
    for (const b of [2, 2.5, -1])
      expect(() => computeOrdering(a, "amd", b)).toThrow(
        `buildAdjacency: blockSize ${b} must be a positive integer dividing n = 5`,
      );
  });
});

describe("invertPermutation", () => {
  it("gives pinv[perm[k]] = k, and refuses an index given twice, naming its position", () => {
    expect(Array.from(invertPermutation(Int32Array.of(2, 0, 3, 1)))).toEqual([1, 3, 0, 2]);
    expect(() => invertPermutation(Int32Array.of(0, 2, 1, 2))).toThrow("invalid permutation at position 3");
    // An index out of range is refused too.
    expect(() => invertPermutation(Int32Array.of(0, 4, 1, 2))).toThrow("invalid permutation at position 1");
    expect(() => invertPermutation(Int32Array.of(0, 1, -1, 2))).toThrow("invalid permutation at position 2");
  });
});
