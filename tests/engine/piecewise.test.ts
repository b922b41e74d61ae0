/** Piecewise polynomials behind the member diagrams: integration with steps, evaluation, exact extremes. */
import { describe, it, expect } from "vitest";
import { evaluate, extrema, fromGlobalPolynomial, integrate, segmentOf, zeroPiecewise } from "@/lib/engine/piecewise";
import { expectClose } from "./helpers";

describe("piecewise polynomials", () => {
  it("integrates with steps at the breaks and evaluates either side of them", () => {
    const breaks = Float64Array.of(0, 1, 3);
    const q = zeroPiecewise(breaks);
    q.coeffs.forEach((c) => (c[0] = -2)); // uniform −2
    const V = integrate(q, 5, Float64Array.of(0, -1)); // V(0) = 5, step −1 at x = 1
    expectClose(evaluate(V, 1, "left"), 3);
    expectClose(evaluate(V, 1, "right"), 2);
    expectClose(evaluate(V, 3), -2);
    const M = integrate(V, 0);
    // ∫₀³ V = [5x − x²]₀³ − 1·(3 − 1) = 6 − 2 = 4
    expectClose(evaluate(M, 3), 4);
  });

  it("finds every stationary point of a quintic exactly, matching a brute-force search", () => {
    // P'(x) = (x − 0.1)(x − 0.4)(x − 0.7)(x − 0.9); P(x) = ∫₀ˣ P'.
    const roots = [0.1, 0.4, 0.7, 0.9];
    let dp = [1];
    for (const r of roots) dp = [...dp.map((v) => -r * v), 0].map((v, i) => v + (i > 0 ? dp[i - 1] : 0));
    const p = [0, ...dp.map((v, i) => v / (i + 1))];
    const pp = fromGlobalPolynomial(p, Float64Array.of(0, 0.55, 1));
    const { max, min } = extrema(pp);
    let bruteMax = -Infinity;
    let bruteMin = Infinity;
    for (let i = 0; i <= 200_000; i++) {
      const v = evaluate(pp, i / 200_000);
      bruteMax = Math.max(bruteMax, v);
      bruteMin = Math.min(bruteMin, v);
    }
    expect(max.value).toBeGreaterThanOrEqual(bruteMax - 1e-15);
    expect(min.value).toBeLessThanOrEqual(bruteMin + 1e-15);
    for (const e of [max, min]) {
      const nearest = [0, ...roots, 1].reduce((a, b) => (Math.abs(b - e.x) < Math.abs(a - e.x) ? b : a));
      expect(Math.abs(nearest - e.x)).toBeLessThan(1e-9);
    }
  });

  it("has one coefficient array per segment, and picks the segment to the right of a break unless told left", () => {
    const breaks = Float64Array.of(0, 1, 3, 4);
    expect(zeroPiecewise(breaks).coeffs.length).toBe(3);
    expect(integrate(zeroPiecewise(breaks), 0).coeffs.length).toBe(3);
    expect([0, 0.5, 1, 2, 3, 4, -1, 9].map((x) => segmentOf(breaks, x))).toEqual([0, 0, 1, 1, 2, 2, 0, 2]);
    expect([0, 0.5, 1, 2, 3, 4].map((x) => segmentOf(breaks, x, "left"))).toEqual([0, 0, 0, 1, 1, 2]);
    // A step of −1 at x = 1: evaluate takes the right-hand value by default.
    const V = integrate(zeroPiecewise(Float64Array.of(0, 1, 3)), 5, Float64Array.of(0, -1));
    expect([evaluate(V, 1), evaluate(V, 1, "right"), evaluate(V, 1, "left")]).toEqual([4, 4, 5]);
  });

  // Stationary points by calculus (common practice): the extremes of a polynomial on an interval lie at its ends or
  // where its derivative is zero. Each polynomial below is built from its derivative, whose roots are known.
  const poly = (derivative: number[]) => [0, ...derivative.map((v, i) => v / (i + 1))];
  const valueOf = (p: number[], x: number) => p.reduce((sum, c, i) => sum + c * x ** i, 0);

  it("finds a stationary point that bisection hits exactly, where the derivative has no other real root", () => {
    // P′ = (x − ½)((x − ½)² + 1) = x³ − 1.5x² + 1.75x − 0.625: one real root, at ½, the first midpoint tried;
    // P″ = 3x² − 3x + 1.75 has no real root. P(½) = −0.140625, P(0) = P(1) = 0.
    const p = poly([-0.625, 1.75, -1.5, 1]);
    const { max, min } = extrema(fromGlobalPolynomial(p, Float64Array.of(0, 1)));
    expect(min).toEqual({ value: -0.140625, x: 0.5 });
    // The largest value is reached at both ends; the first one along the member is reported.
    expect(max).toEqual({ value: 0, x: 0 });
  });

  it("finds the minimum of (x − ½)⁴, where the derivative has a triple root", () => {
    // P = (x − ½)⁴/4: P′ = (x − ½)³, P″ = 3(x − ½)² (a double root, discriminant exactly 0).
    const p = [0.015625, -0.125, 0.375, -0.5, 0.25];
    const { max, min } = extrema(fromGlobalPolynomial(p, Float64Array.of(0, 1)));
    expect(min).toEqual({ value: 0, x: 0.5 });
    expect(max).toEqual({ value: 0.015625, x: 0 });
  });

  it("finds every stationary point of a quartic whose derivative's turning points come out of the quadratic formula in descending order", () => {
    // P′ = (x − 0.1)(x − 0.5)(x − 0.8) = x³ − 1.4x² + 0.53x − 0.04; P″ = 3x² − 2.8x + 0.53 (its linear coefficient
    // is negative, so the stable quadratic formula gives the larger root first).
    const p = poly([-0.04, 0.53, -1.4, 1]);
    const whole = extrema(fromGlobalPolynomial(p, Float64Array.of(0, 1)));
    expectClose(whole.min.x, 0.1, 1e-12);
    expectClose(whole.min.value, valueOf(p, 0.1), 1e-12);
    expect(whole.max).toEqual({ value: evaluate(fromGlobalPolynomial(p, Float64Array.of(0, 1)), 1), x: 1 });
    // On [0.3, 0.9] (two segments) the local maximum at 0.5 and the local minimum at 0.8 are the extremes.
    const inner = extrema(fromGlobalPolynomial(p, Float64Array.of(0.3, 0.6, 0.9)));
    expectClose(inner.max.x, 0.5, 1e-12);
    expectClose(inner.max.value, valueOf(p, 0.5), 1e-12);
    expectClose(inner.min.x, 0.8, 1e-12);
    expectClose(inner.min.value, valueOf(p, 0.8), 1e-12);
  });

  it("reports the first position of a constant's value, on every segment", () => {
    const pp = fromGlobalPolynomial([-2.5], Float64Array.of(0, 1, 2.5));
    expect(extrema(pp)).toEqual({ max: { value: -2.5, x: 0 }, min: { value: -2.5, x: 0 } });
  });
});
