import { describe, expect, it } from "vitest";
import {
  factorizeSymmetric,
  multiplySymmetric,
  SymmetricTripletBuilder,
  type FactorResult,
  type OrderingMethod,
} from "@/lib/engine/sparse";
import { createRandom, randomSpdMatrix, relativeError, solveDense, toDense } from "./dense-reference";
import { buildFrameMatrix } from "./frame-matrix";

const methods: OrderingMethod[] = ["amd", "rcm", "natural"];

function expectFactor(result: FactorResult) {
  if (!result.ok) throw new Error(`unexpected singular pivot at equation ${result.equation}`);
  return result.factor;
}

describe("factorizeSymmetric", () => {
  for (const method of methods) {
    for (const blockSize of [1, 3]) {
      it(`solve matches a dense reference on random SPD matrices (${method}, blockSize ${blockSize})`, () => {
        const random = createRandom(1000 + blockSize);
        for (let trial = 0; trial < 12; trial++) {
          const nodes = 1 + Math.floor(random() * 40);
          const a = randomSpdMatrix(random, nodes, blockSize, random() * 0.3);
          const b = Float64Array.from({ length: a.n }, () => random() * 2 - 1);
          const bCopy = b.slice();
          const factor = expectFactor(factorizeSymmetric(a, { ordering: method, blockSize }));
          const x = factor.solve(b);
          expect(b).toEqual(bCopy);
          expect(relativeError(x, solveDense(toDense(a), b))).toBeLessThan(1e-9);
        }
      });
    }
  }

  it.each(methods)("residual ‖Ax − b‖/‖b‖ < 1e-10 on a 30×30 frame (%s)", (method) => {
    const frame = buildFrameMatrix(30, 30);
    const a = frame.matrix;
    const random = createRandom(42);
    const factor = expectFactor(factorizeSymmetric(a, { ordering: method, blockSize: frame.blockSize }));
    expect(factor.n).toBe(a.n);
    expect(factor.stats.nnzL).toBeGreaterThanOrEqual(a.colPtr[a.n]);
    for (let rhs = 0; rhs < 2; rhs++) {
      const b = Float64Array.from({ length: a.n }, () => random() * 200 - 100);
      const x = factor.solve(b);
      expect(relativeError(multiplySymmetric(a, x), b)).toBeLessThan(1e-10);
    }
  });

  it("reports exactly the equation of a zero row/column (a free rotation)", () => {
    const frame = buildFrameMatrix(4, 3);
    const freeRotation = 3 * 7 + 2;
    const builder = new SymmetricTripletBuilder(frame.matrix.n);
    const a = frame.matrix;
    for (let j = 0; j < a.n; j++) {
      for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
        const i = a.rowIdx[p];
        if (i !== freeRotation && j !== freeRotation) builder.add(i, j, a.values[p]);
      }
    }
    for (const method of methods) {
      for (const blockSize of [1, 3]) {
        const result = factorizeSymmetric(builder.toCsc(), { ordering: method, blockSize });
        expect(result.ok).toBe(false);
        if (result.ok) continue;
        expect(result.kind).toBe("not-positive-definite");
        expect(result.equation).toBe(freeRotation);
        expect(result.stats.n).toBe(a.n);
      }
    }
  });

  it("reports an equation of the mechanism for a rank-deficient SPSD matrix (unsupported bar)", () => {
    // Equations 0..5: a supported, well-posed spring chain; equations 6 and 7: a floating bar [1 −1; −1 1],
    // interleaved by coupling nothing else so that any ordering must hit it.
    const builder = new SymmetricTripletBuilder(8);
    for (let i = 0; i < 6; i++) {
      builder.add(i, i, 2);
      if (i > 0) builder.add(i, i - 1, -1);
    }
    const k = 3.7e5;
    builder.add(6, 6, k);
    builder.add(7, 7, k);
    builder.add(7, 6, -k);
    const a = builder.toCsc();
    for (const method of methods) {
      const result = factorizeSymmetric(a, { ordering: method });
      expect(result.ok).toBe(false);
      if (!result.ok) expect([6, 7]).toContain(result.equation);
      // Found by the numeric factorisation (the diagonal is positive), which reports the same kind.
      if (!result.ok) expect(result.kind).toBe("not-positive-definite");
    }
  });

  it("reports the first diagonal entry that is not positive, with its value in A, whatever the ordering", () => {
    // A positive definite matrix has a positive diagonal (a_ii = e_iᵀ A e_i > 0; common practice), so an entry ≤ 0
    // is reported as it stands in A, before elimination changes it. Here a₁₁ = −2 comes first: it is coupled to
    // equation 0, so elimination would reach −2 − 1²/4 = −2.25 there; a₃₃ = 0 is coupled to equation 2, and
    // a₄₄ = 0 stands alone (a minimum-degree order eliminates it first).
    const builder = new SymmetricTripletBuilder(5);
    builder.add(0, 0, 4);
    builder.add(1, 0, 1);
    builder.add(1, 1, -2);
    builder.add(2, 2, 4);
    builder.add(3, 2, 1);
    const a = builder.toCsc();
    // A zero diagonal alone: a₁₁ = 0, coupled to equation 0, where elimination would reach 0 − 1²/4 = −0.25.
    const zero = new SymmetricTripletBuilder(2);
    zero.add(0, 0, 4);
    zero.add(1, 0, 1);
    for (const method of methods) {
      for (const blockSize of [1, 5]) {
        expect(factorizeSymmetric(a, { ordering: method, blockSize })).toMatchObject({
          ok: false,
          kind: "not-positive-definite",
          equation: 1,
          pivot: -2,
        });
      }
      expect(factorizeSymmetric(zero.toCsc(), { ordering: method })).toMatchObject({
        ok: false,
        kind: "not-positive-definite",
        equation: 1,
        pivot: 0,
      });
    }
  });

  it("reports an equation of a floating bar buried in the middle of a large frame", () => {
    // Two extra equations inserted at position p (renumbering the frame around them) form [k −k; −k k]:
    // the numeric factorisation, not the diagonal pre-check, must find them inside big supernodes.
    const frame = buildFrameMatrix(20, 20);
    const a = frame.matrix;
    const p = Math.floor(a.n / 2) + 1;
    const renumber = (i: number): number => (i < p ? i : i + 2);
    const builder = new SymmetricTripletBuilder(a.n + 2);
    for (let j = 0; j < a.n; j++) {
      for (let q = a.colPtr[j]; q < a.colPtr[j + 1]; q++) builder.add(renumber(a.rowIdx[q]), renumber(j), a.values[q]);
    }
    const k = 4.2e5;
    builder.add(p, p, k);
    builder.add(p + 1, p + 1, k);
    builder.add(p + 1, p, -k);
    const withBar = builder.toCsc();
    for (const method of methods) {
      const result = factorizeSymmetric(withBar, { ordering: method });
      expect(result.ok).toBe(false);
      if (!result.ok) expect([p, p + 1]).toContain(result.equation);
    }
    // Stiffening the bar to ground makes it solvable again.
    builder.add(p, p, k);
    expect(factorizeSymmetric(builder.toCsc()).ok).toBe(true);
  });

  it("detects the rigid-body modes of an unsupported frame", () => {
    const floating = buildFrameMatrix(3, 2, { supported: false });
    for (const method of methods) {
      for (const blockSize of [1, 3]) {
        const result = factorizeSymmetric(floating.matrix, { ordering: method, blockSize });
        expect(result.ok).toBe(false);
        if (!result.ok) expect(result.equation).toBeLessThan(floating.matrix.n);
      }
    }
    // The same frame with its base fixed is fine.
    expect(factorizeSymmetric(buildFrameMatrix(3, 2).matrix, { blockSize: 3 }).ok).toBe(true);
  });

  it("applies pivotTolerance relative to the original diagonal", () => {
    // d₂ = 1 − (1 − ε)² ≈ 2ε relative to A₂₂ = 1.
    const builder = new SymmetricTripletBuilder(2);
    const eps = 1e-12;
    builder.add(0, 0, 1);
    builder.add(1, 1, 1);
    builder.add(1, 0, 1 - eps);
    const a = builder.toCsc();
    const strict = factorizeSymmetric(a, { ordering: "natural" });
    expect(strict.ok).toBe(false);
    if (!strict.ok) {
      expect(strict.equation).toBe(1);
      expect(strict.pivot / (2 * eps)).toBeCloseTo(1, 2);
    }
    expect(factorizeSymmetric(a, { ordering: "natural", pivotTolerance: 1e-13 }).ok).toBe(true);
    // The same matrix times 10⁶: d₂ = 10⁶(2ε − ε²) against the tolerance times A₂₂ = 10⁶, so the same outcome.
    const scaled = new SymmetricTripletBuilder(2);
    scaled.add(0, 0, 1e6);
    scaled.add(1, 1, 1e6);
    scaled.add(1, 0, 1e6 * (1 - eps));
    const big = factorizeSymmetric(scaled.toCsc(), { ordering: "natural" });
    expect(big.ok).toBe(false);
    if (!big.ok) {
      expect(big.equation).toBe(1);
      expect(big.pivot / (2e6 * eps)).toBeCloseTo(1, 2);
    }
    expect(factorizeSymmetric(scaled.toCsc(), { ordering: "natural", pivotTolerance: 1e-13 }).ok).toBe(true);
  });

  it("solve rejects non-finite or wrongly sized right-hand sides", () => {
    const a = randomSpdMatrix(createRandom(9), 5, 1, 0.5);
    const factor = expectFactor(factorizeSymmetric(a));
    const b = new Float64Array(5).fill(1);
    b[3] = Number.NaN;
    expect(() => factor.solve(b)).toThrow(/not finite/);
    b[3] = Number.POSITIVE_INFINITY;
    expect(() => factor.solve(b)).toThrow(/not finite/);
    expect(() => factor.solve(new Float64Array(4))).toThrow(/length/);
  });

  it("reports timing stats and handles the empty matrix", () => {
    const empty = expectFactor(factorizeSymmetric(new SymmetricTripletBuilder(0).toCsc()));
    expect(empty.solve(new Float64Array(0)).length).toBe(0);
    const frame = buildFrameMatrix(5, 5);
    const before = performance.now();
    const stats = expectFactor(factorizeSymmetric(frame.matrix, { blockSize: 3 })).stats;
    const elapsed = performance.now() - before;
    expect(stats.n).toBe(frame.matrix.n);
    // Each stage runs inside the call, so it takes no longer than the call itself (common practice).
    for (const ms of [stats.orderingMs, stats.symbolicMs, stats.numericMs]) {
      expect(ms).toBeGreaterThanOrEqual(0);
      expect(ms).toBeLessThanOrEqual(elapsed);
    }
  });
});
