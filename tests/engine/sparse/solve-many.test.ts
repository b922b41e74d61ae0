import { describe, expect, it } from "vitest";
import {
  factorizeSymmetric,
  FactorWorkspace,
  multiplySymmetric,
  type FactorResult,
  type OrderingMethod,
} from "@/lib/engine/sparse";
import { createRandom, randomSpdMatrix, relativeError } from "./dense-reference";
import { buildFrameMatrix } from "./frame-matrix";

function expectFactor(result: FactorResult) {
  if (!result.ok) throw new Error(`unexpected singular pivot at equation ${result.equation}`);
  return result.factor;
}

const methods: OrderingMethod[] = ["amd", "rcm", "natural"];

describe("solveMany (several right-hand sides in one pass)", () => {
  it.each(methods)("equals one solve per right-hand side on random SPD matrices (%s)", (method) => {
    const random = createRandom(77);
    for (let trial = 0; trial < 10; trial++) {
      const a = randomSpdMatrix(random, 1 + Math.floor(random() * 30), 3, random() * 0.3);
      const factor = expectFactor(factorizeSymmetric(a, { ordering: method, blockSize: 3 }));
      const count = 1 + (trial % 4);
      const bs = Array.from({ length: count }, () => Float64Array.from({ length: a.n }, () => random() * 2 - 1));
      const copies = bs.map((b) => b.slice());
      const many = factor.solveMany(bs);
      expect(bs).toEqual(copies);
      expect(many).toHaveLength(count);
      bs.forEach((b, r) => expect(relativeError(many[r], factor.solve(b))).toBeLessThan(1e-13));
    }
  });

  it("solves a 20×20 frame for three cases to a small residual, and no cases to none", () => {
    const frame = buildFrameMatrix(20, 20);
    const a = frame.matrix;
    const random = createRandom(5);
    const factor = expectFactor(factorizeSymmetric(a, { ordering: "amd", blockSize: 3 }));
    const bs = [0, 1, 2].map(() => Float64Array.from({ length: a.n }, () => random() * 200 - 100));
    factor.solveMany(bs).forEach((x, r) => expect(relativeError(multiplySymmetric(a, x), bs[r])).toBeLessThan(1e-10));
    expect(factor.solveMany([])).toEqual([]);
  });

  it("rejects a right-hand side of the wrong length or with a non-finite entry", () => {
    const a = randomSpdMatrix(createRandom(9), 4, 3, 0.3);
    const factor = expectFactor(factorizeSymmetric(a));
    const good = new Float64Array(a.n).fill(1);
    expect(() => factor.solveMany([good, new Float64Array(a.n + 1)])).toThrow(/length/);
    const bad = good.slice();
    bad[2] = NaN;
    expect(() => factor.solveMany([good, bad])).toThrow(/not finite/);
  });
});

describe("FactorWorkspace", () => {
  it("a factor in a workspace solves like one with storage of its own, for matrices of growing and shrinking size", () => {
    const workspace = new FactorWorkspace();
    const random = createRandom(11);
    for (const [storeys, bays] of [
      [4, 3],
      [12, 9],
      [3, 2],
    ]) {
      const a = buildFrameMatrix(storeys, bays).matrix;
      const b = Float64Array.from({ length: a.n }, () => random() * 2 - 1);
      const own = expectFactor(factorizeSymmetric(a, { blockSize: 3 })).solve(b);
      const shared = expectFactor(factorizeSymmetric(a, { blockSize: 3, workspace })).solve(b);
      expect(relativeError(shared, own)).toBeLessThan(1e-14);
    }
  });

  it("hands out exactly the length asked for, reuses its buffer for a request that fits, and a fresh one after clear()", () => {
    const workspace = new FactorWorkspace();
    const first = workspace.floats("k", 8);
    expect(first.length).toBe(8);
    const again = workspace.floats("k", 6);
    expect(again.length).toBe(6);
    expect(again.buffer).toBe(first.buffer);
    // A different key, another buffer.
    expect(workspace.floats("m", 8).buffer).not.toBe(first.buffer);
    workspace.clear();
    const fresh = workspace.floats("k", 8);
    expect(fresh.length).toBe(8);
    expect(fresh.buffer).not.toBe(first.buffer);
  });
});
